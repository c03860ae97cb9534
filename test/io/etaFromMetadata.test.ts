// etaFromMetadata: by construction of the inputs (η = C2/(C1 + C2) of a capacitive divider lies in (0, 1]: closed form).
// Expected values are derived from the inputs by construction: this is the project's own interface, with no outside reference value to name.
import { describe, it, expect } from "vitest";
import { etaFromMetadata } from "../../lib/io/etaFromMetadata.ts";

describe("etaFromMetadata(metadata)", () => {
  it("reads eta, η or voltage division, with a decimal comma too", () => {
    expect(etaFromMetadata({ eta: "0.88" })).toEqual({ eta: 0.88, key: "eta" });
    expect(etaFromMetadata({ "Voltage division": "0,9" })).toEqual({ eta: 0.9, key: "Voltage division" });
    expect(etaFromMetadata({ "η": "1" })).toEqual({ eta: 1, key: "η" });
  });

  it("ignores values outside (0, 1] and other keys", () => {
    expect(etaFromMetadata({ eta: "1.2" })).toBeNull();
    expect(etaFromMetadata({ eta: "n/a" })).toBeNull();
    expect(etaFromMetadata({ beta: "0.5" })).toBeNull();
  });
});
