// setAsidePeakReasons (notes 18–20 of rulesDecisive) on peak lists built from the closed-form
// positions of orthodox theory: one level's charging peaks at (ε + Ec·(n + ½))/η, one Ec/η apart
// in bias whatever the rates. The assignments are written out by hand (the reading the rules would
// give: which peaks form which multiplet, which are set aside) so that each case isolates one
// note; the thresholds are SET_ASIDE_PEAK_DEFAULTS (chosen on the accuracy benchmark).
import { describe, expect, it } from "vitest";
import { rulesDecisive } from "../../../lib/assign/rulesDecisive.ts";
import { setAsidePeakReasons, SET_ASIDE_PEAK_DEFAULTS, type SetAsidePeakAssignment } from "../../../lib/assign/decisive/setAsidePeaks.ts";
import type { Peak } from "../../../lib/peaks/findPeaks.ts";
import { assignPeak } from "../../helpers/assignPeak.ts";
import { expectDocumentedDefaults } from "../../helpers/documentedDefaults.ts";
import { expectError } from "../../helpers/errors.ts";

// ε_s = 0.5, ε_p = 0.8 eV (CB); Ec = 0.1 eV; η = 0.8: s at n = 0, 1, p at n = 2 … 7.
const eta = 0.8, ec = 0.1;
const ecV = ec / eta;
const sV = [0, 1].map((n) => (0.5 + ec * (n + 0.5)) / eta);
const pV = [2, 3, 4, 5, 6, 7].map((n) => (0.8 + ec * (n + 0.5)) / eta);

/** A CB multiplet of the given peaks (indices into `peaks`), in one sub-group unless told. */
const shell = (peaks: readonly Peak[], label: string, degeneracy: number, indices: number[], subgroups = [indices.length]) => ({
  band: "CB" as const,
  label,
  degeneracy,
  found: indices.length,
  peakIndices: indices,
  peaksV: indices.map((i) => peaks[i].biasV),
  subgroups,
});

/** A reading of `peaks` (sorted) with the given multiplets and set-aside peaks. */
function reading(
  peaks: readonly Peak[],
  regime: SetAsidePeakAssignment["regime"],
  multiplets: SetAsidePeakAssignment["multiplets"],
  set: { satellites?: number[]; resonances?: number[] } = {},
  chargingEnergyV: number | null = ecV,
): SetAsidePeakAssignment {
  return {
    regime,
    multiplets,
    quantities: { chargingEnergyV },
    evidence: { satellitePeakIndices: set.satellites ?? [], secondJunction: (set.resonances ?? []).map((index) => ({ index })) },
  };
}

describe("setAsidePeakReasons(peaks, assignment, options)", () => {
  it("SET_ASIDE_PEAK_DEFAULTS are locked, frozen and match the documented defaults", () => {
    expect(SET_ASIDE_PEAK_DEFAULTS).toEqual({ missingPeakTolerance: 0.175, missingPeakStepMin: 1, unreadPeaksMin: 1, overlapFwhms: 1 });
    expectDocumentedDefaults(new URL("../../../lib/assign/decisive/setAsidePeaks.ts", import.meta.url), "SetAsidePeakOptions", SET_ASIDE_PEAK_DEFAULTS);
  });

  it("note 18: flags a p read from its second charging peak while its first, one Ec before, was set aside; not when p is whole, the peak lies 0.7 Ec before, or it steps like a charging satellite", () => {
    // p's six charging peaks (closed form); the first taken for a resonance it overlaps, so p reads 5.
    const peaks = [...sV, ...pV].map((v) => assignPeak(v));
    const short = reading(peaks, "shell-filling", [shell(peaks, "s", 2, [0, 1]), shell(peaks, "p", 6, [3, 4, 5, 6, 7])], { resonances: [2] });
    expect(setAsidePeakReasons(peaks, short)).toEqual([
      {
        code: "first-peak-set-aside",
        text: `shell filling with 5 of the p multiplet's 6 charging peaks, while the peak at ${pV[0].toFixed(3)} V, 1.00 × Ec (125 mV) before its first and stepping 1.00 × it (≥ 1), was set aside: p's first charging peak may be that one (overlapping a resonance or a satellite), and the shell read from its second`,
      },
    ]);
    // The same reason through rulesDecisive, the window ending before p's next charging peak (note 3 silent).
    // η given (0.8): the peak set aside as a resonance also sends the shell-filling reading to the fit (note 27).
    const verdict = rulesDecisive({ peaks, assignment: { ...short, noLevels: null, evidence: { ...short.evidence, secondToFirstStepRatio: null, reasons: [] }, uncertainties: {}, energies: { eta, etaGiven: true } } as never, biasRangeV: [-2, pV[5] + 0.5 * ecV] });
    expect(verdict.codes).toEqual(["first-peak-set-aside", "resonant-window"]);
    // p whole: nothing is missing.
    expect(setAsidePeakReasons(peaks, reading(peaks, "shell-filling", [shell(peaks, "s", 2, [0, 1]), shell(peaks, "p", 6, [2, 3, 4, 5, 6, 7])]))).toEqual([]);
    // The set-aside peak 0.7 Ec before p's first (outside 1 ± 0.175): not where the ladder puts a charging peak.
    const off = [...sV, pV[1] - 0.7 * ecV, ...pV.slice(1)].map((v) => assignPeak(v));
    expect(setAsidePeakReasons(off, reading(off, "shell-filling", [shell(off, "s", 2, [0, 1]), shell(off, "p", 6, [3, 4, 5, 6, 7])], { resonances: [2] }))).toEqual([]);
    // p whole, read from its first charging peak, with the p level's charging satellite one Ec before
    // it (p entered while s holds one electron: (ε_p + Ec·(1 + ½))/η, closed form) stepping a
    // fraction (0.15) of p's peaks, set aside as a satellite: the shell's own satellite, not a
    // missing charging peak (the window cuts p, so p is short). Common practice (no source) for
    // the satellite's weak step; its place is the closed form's.
    const satV = pV[0] - ecV;
    const withSatellite = [...sV, satV, ...pV.slice(0, 3)].map((v) => assignPeak(v, v === satV ? 1.5e-12 : 1e-11));
    expect(setAsidePeakReasons(withSatellite, reading(withSatellite, "shell-filling", [shell(withSatellite, "s", 2, [0, 1]), shell(withSatellite, "p", 6, [3, 4, 5])], { satellites: [2] }))).toEqual([]);
  });

  it("note 18: waives the step test for a set-aside peak that overlaps a peak labelled a resonance; not for a weak peak with the resonance two FWHM away", () => {
    // p's first charging peak (closed form) overlapped by a second-junction resonance 15 mV after it
    // (FWHM 40 mV): the peak list splits one step between the two (0.45 × and 0.55 × a charging
    // step), both are set aside (the first as a satellite) and p is read from its second. Common
    // practice (no source): two peaks closer than their FWHM share the step under them.
    const build = (resonanceOffsetV: number) => {
      const peaks = [...sV, pV[0], pV[0] + resonanceOffsetV, ...pV.slice(1)].map((v, i) => assignPeak(v, i === 2 ? 0.45e-11 : i === 3 ? 0.55e-11 : 1e-11));
      return { peaks, assignment: reading(peaks, "shell-filling", [shell(peaks, "s", 2, [0, 1]), shell(peaks, "p", 6, [4, 5, 6, 7, 8])], { satellites: [2], resonances: [3] }) };
    };
    const overlapped = build(0.015);
    expect(setAsidePeakReasons(overlapped.peaks, overlapped.assignment)).toEqual([
      {
        code: "first-peak-set-aside",
        text: `shell filling with 5 of the p multiplet's 6 charging peaks, while the peak at ${pV[0].toFixed(3)} V, 1.00 × Ec (125 mV) before its first and stepping 0.45 × it but overlapping a peak labelled a second-junction resonance (within 1 FWHM), which shares its step, was set aside: p's first charging peak may be that one (overlapping a resonance or a satellite), and the shell read from its second`,
      },
    ]);
    // The resonance 80 mV away (two FWHM): the peaks are apart, the weak step stands (p's own charging satellite's).
    const apart = build(0.08);
    expect(setAsidePeakReasons(apart.peaks, apart.assignment)).toEqual([]);
    // The waiver off (overlapFwhms 0): the step test applies again.
    expect(setAsidePeakReasons(overlapped.peaks, overlapped.assignment, { overlapFwhms: 0 })).toEqual([]);
  });

  it("note 19: flags p's charging peaks two Ec apart with a peak as strong as theirs set aside at the middle; not a weaker one, nor one off the middle", () => {
    // p's third charging peak merged with a resonance (step 2 × the level's) and set aside; the rules
    // take the peak one Ec after p's last in its place and read p as 2 + 4 around the gap.
    const build = (thirdV: number, thirdStepA: number) => {
      const peaks = [...sV, pV[0], pV[1], thirdV, pV[3], pV[4], pV[5], pV[5] + ecV].map((v) => assignPeak(v, v === thirdV ? thirdStepA : 1e-11));
      return { peaks, assignment: reading(peaks, "shell-filling", [shell(peaks, "s", 2, [0, 1]), shell(peaks, "p", 6, [2, 3, 5, 6, 7, 8], [2, 4])], { resonances: [4] }) };
    };
    const merged = build(pV[2], 2e-11);
    expect(setAsidePeakReasons(merged.peaks, merged.assignment)).toEqual([
      {
        code: "gap-peak-set-aside",
        text: `shell filling with p's charging peaks at ${pV[1].toFixed(3)} and ${pV[3].toFixed(3)} V 2.00 × Ec apart (room for one more), while the peak at ${pV[2].toFixed(3)} V between them, stepping 2.00 × the lower of the two (≥ 1), was set aside: it may be p's charging peak merged with a resonance, and p's peaks grouped one off around the gap`,
      },
    ]);
    // A set-aside peak weaker than the charging peaks around it (0.5 ×): no sign of a charging peak.
    const weak = build(pV[2], 0.5e-11);
    expect(setAsidePeakReasons(weak.peaks, weak.assignment)).toEqual([]);
    // One 0.3 Ec off the middle (outside ± 0.175 Ec): not where the missing charging peak would lie.
    const aside = build(pV[2] + 0.3 * ecV, 2e-11);
    expect(setAsidePeakReasons(aside.peaks, aside.assignment)).toEqual([]);
  });

  it("note 20: flags shell tunnelling with CB peaks beyond the last level read as nothing; not when they are set aside as satellites", () => {
    // Seven peaks one Ec/η apart (a charging ladder, closed form), read level by level as s, p, d, f:
    // the rules stop at f and leave three.
    const peaks = [0, 1, 2, 3, 4, 5, 6].map((n) => assignPeak((0.5 + ec * (n + 0.5)) / eta));
    const levels = ["s", "p", "d", "f"].map((label, k) => shell(peaks, label, [2, 6, 10, 14][k], [k]));
    expect(setAsidePeakReasons(peaks, reading(peaks, "shell-tunneling", levels, {}, null))).toEqual([
      {
        code: "unread-cb-peaks",
        text: `shell tunnelling with 3 CB peak(s) beyond the last level read (f, ${peaks[3].biasV.toFixed(3)} V) read as nothing (neither level, satellite nor resonance; from ${peaks[4].biasV.toFixed(3)} V): the rules ran out of shells, as they do along a charging ladder read level by level`,
      },
    ]);
    expect(setAsidePeakReasons(peaks, reading(peaks, "shell-tunneling", levels, { satellites: [4, 5, 6] }, null))).toEqual([]);
    // Shell filling reads them as charging peaks: this note is about tunnelling only.
    expect(setAsidePeakReasons(peaks, reading(peaks, "shell-filling", levels, {}, null))).toEqual([]);
  });

  it("rejects options out of range", () => {
    const empty = reading([], "shell-filling", []);
    expectError(() => setAsidePeakReasons([], empty, { missingPeakTolerance: -0.1 }), "options/out-of-range");
    expectError(() => setAsidePeakReasons([], empty, { unreadPeaksMin: 0 }), "options/out-of-range");
    expectError(() => setAsidePeakReasons([], empty, { overlapFwhms: -1 }), "options/out-of-range");
  });
});
