// laterEntryReadings: a level entered with N carriers before it steps first at (ε + Ec·(N + ½))/η
// (closed form of the orthodox charging ladder), so the readings it adds differ from the given
// ones only in `before` (1 for every level after the first) or in a run of six split 2 + 4 at its
// third peak; the check values follow from these rules by hand.
import { describe, it, expect } from "vitest";
import { laterEntryReadings } from "../../../lib/model/fit/laterEntryReadings.ts";
import { COMPARE_GROUPINGS_DEFAULTS } from "../../../lib/model/fit/compareGroupings.ts";
import type { LevelSeed } from "../../../lib/model/fit/levelsToFit.ts";

const v = (label: string, degeneracy: number, firstPeakV: number, before: number): LevelSeed => ({ band: "VB", label, degeneracy, firstPeakV, before });

describe("laterEntryReadings(readings, vbPeaksV)", () => {
  it("enters every level after the first with one carrier before it", () => {
    const filling = [v("v1", 2, -1.613, 0), v("v2", 4, -1.958, 2)];
    const empty = [v("v1", 2, -1.613, 0), v("v2", 2, -1.958, 0)];
    const out = laterEntryReadings([filling, empty], []);
    expect(out).toEqual([[v("v1", 2, -1.613, 0), v("v2", 4, -1.958, 1)], [v("v1", 2, -1.613, 0), v("v2", 2, -1.958, 1)]]);
  });

  it("splits one level of six into a doublet and four entered at its third peak", () => {
    const peaks = [-2.139, -1.934, -1.734, -1.534, -1.361, -1.173];
    expect(laterEntryReadings([[v("v1", 6, -1.173, 0)]], peaks)).toEqual([[v("v1", 2, -1.173, 0), v("v2", 4, -1.534, 1)]]);
  });

  it("merges a level's charging satellites, first peaks one Ec/η after it, into it", () => {
    // Ec/η = 0.0988 V: −1.278 and −1.378 V follow −1.182 V by 0.096 and 0.100 V (within 15 %).
    const tunnelling = [v("v1", 2, -0.899, 0), v("v2", 2, -1.182, 0), v("v3", 1, -1.278, 0), v("v4", 1, -1.378, 0)];
    const out = laterEntryReadings([tunnelling], [], 0.0988);
    expect(out[0]).toEqual([v("v1", 2, -0.899, 0), v("v2", 4, -1.182, 0)]);
    // Without Ec/η, no merged reading.
    expect(laterEntryReadings([tunnelling], []).some((r) => r.length === 2)).toBe(false);
  });

  it("adds nothing already given, and nothing for one doublet", () => {
    const given = [v("v1", 2, -1.6, 0), v("v2", 4, -1.9, 1)];
    expect(laterEntryReadings([given], [])).toEqual([]);
    expect(laterEntryReadings([[v("v1", 2, -1.6, 0)]], [-1.6, -1.7, -1.8])).toEqual([]);
  });

  it("COMPARE_GROUPINGS_DEFAULTS are locked", () => {
    expect(COMPARE_GROUPINGS_DEFAULTS).toEqual({ vbRetryRatio: 1.2 });
    expect(Object.isFrozen(COMPARE_GROUPINGS_DEFAULTS)).toBe(true);
  });
});
