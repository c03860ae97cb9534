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
