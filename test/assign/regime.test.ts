// classifyRegime / regimeRatios on the first CB peaks of closed-form spectra.
// Closed forms (orthodox theory, the charging ladder of an s level with g = 2): the second s
// charging step over the first is r/(1 + r) for r = Γtip/Γsub; in shell tunnelling the p step over
// the s step is the degeneracy ratio 6/2 = 3. Peaks at (ε + Ec(n + ½))/η with ε_s = 0.5 eV,
// ε_p = 0.8 eV, Ec = 0.1 eV, η = 0.8. The early-entry block takes its step heights from the
// project's master equation (currentSteps, the simulated truth) at closed-form positions.
import { describe, it, expect } from "vitest";
import { classifyRegime, extraCbPeak, regimeRatios, valenceFillingDoublet, type RegimeEvidence } from "../../lib/assign/regime.ts";
import { splitSatellites } from "../../lib/assign/satellites.ts";
import type { BandPeak } from "../../lib/assign/bandPeaks.ts";
import type { Peak } from "../../lib/peaks/findPeaks.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { levelStepRatio } from "../../lib/model/regimeLimits.ts";
import { ASSIGN_DEFAULTS } from "../../lib/assign/assignDefaults.ts";
import { currentSteps } from "../../lib/model/bandCurrent.ts";

const at = (x: number, stepA: number, index: number): BandPeak => ({ x, index, peak: { biasV: x, stepA } as Peak });
const V = (e: number) => e / 0.8;

function classify(cb: BandPeak[], main = cb): { regime: string; evidence: RegimeEvidence } {
  const evidence: RegimeEvidence = { ...regimeRatios(cb), satellitePeaksV: [], satellitePeakIndices: [], secondJunction: [], reasons: [] };
  return { regime: classifyRegime(cb, main, evidence), evidence };
}

describe("regimeRatios(cb) and classifyRegime(cb, main, evidence)", () => {
  it("shell filling at r = 10: s doublet with step ratio 10/11, then the jump to p", () => {
    const r = 10;
    const cb = [at(V(0.55), 1e-11, 0), at(V(0.65), (r / (1 + r)) * 1e-11, 1), at(V(0.8 + 0.25), 1e-11, 2)];
    const { regime, evidence } = classify(cb);
    expectClose(evidence.secondToFirstStepRatio!, r / (1 + r), { rtol: 1e-12, what: "r/(1 + r)" });
    expectClose(evidence.thirdToSecondSpacingRatio!, (0.8 + 0.25 - 0.65) / 0.1, { rtol: 1e-12, what: "(V3 − V2)/(V2 − V1)" });
    expect(regime).toBe("shell-filling");
  });

  it("intermediate at r = 1: step ratio 1/2 is neither a satellite nor a doublet", () => {
    const cb = [at(V(0.55), 1e-11, 0), at(V(0.65), 0.5e-11, 1), at(V(0.85), 1.5e-11, 2)];
    expect(classify(cb).regime).toBe("undetermined");
  });

  it("shell tunnelling: one s peak, then p carrying 3 × its step (6 vs 2 carriers)", () => {
    const cb = [at(V(0.55), 2e-11, 0), at(V(0.85), 6e-11, 1)];
    const { regime, evidence } = classify(cb);
    expectClose(evidence.secondToFirstStepRatio!, 3, { rtol: 1e-12 });
    expect(regime).toBe("shell-tunneling");
  });

  it("cannot tell from fewer than two CB peaks", () => {
    expect(classify([]).regime).toBe("undetermined");
    expect(classify([at(0.7, 1e-11, 0)]).regime).toBe("undetermined");
    expect(regimeRatios([at(0.7, 1e-11, 0)])).toEqual({ secondToFirstStepRatio: null, thirdToSecondSpacingRatio: null, valenceStepRatio: null, valenceSpacingRatio: null, valenceTwinStepRatio: null });
  });
});

describe("classifyRegime near the tunnelling limit (closed forms of lib/model/regimeLimits.ts)", () => {
  it("s then a whole p at r = 0.3: steps alike, levelStepRatio(2, 6, r) = 3/(1 + 8r), then p's charging peak one Ec on: two levels, not a doublet", () => {
    const r = 0.3;
    // s at 0.5 eV, p at 0.8 eV, p's second carrier at 0.8 + Ec (Ec = 0.1 eV < Δsp): the next spacing is 1/3 of the first.
    const cb = [at(V(0.55), 2e-11, 0), at(V(0.85), levelStepRatio(2, 6, r) * 2e-11, 1), at(V(0.95), 1.5e-11, 2)];
    const { regime, evidence } = classify(cb);
    expectClose(evidence.secondToFirstStepRatio!, 3 / 3.4, { rtol: 1e-12, what: "3/(1 + 8r)" });
    expectClose(evidence.thirdToSecondSpacingRatio!, 1 / 3, { rtol: 1e-9 });
    expect(regime).toBe("shell-tunneling");
  });

  it("s, its charging satellite at r/(1 + r) for r = 0.15, then p at 3/(1 + 8r) × s: the satellite measures r, so p need not carry 1.4 × s", () => {
    const r = 0.15;
    const cb = [at(V(0.55), 2e-11, 0), at(V(0.65), (r / (1 + r)) * 2e-11, 1), at(V(0.85), levelStepRatio(2, 6, r) * 2e-11, 2)];
    const main = [cb[0], cb[2]];
    const { regime, evidence } = classify(cb, main);
    expect(levelStepRatio(2, 6, r)).toBeLessThan(ASSIGN_DEFAULTS.tunnelingStepRatioMin);
    expect(regime).toBe("shell-tunneling");
    expect(evidence.reasons.join(" ")).toMatch(/charging satellite of s, so Γtip\/Γsub ≈ 0.15/);
  });

  it("an s doublet at r = 2 (r/(1 + r) = 2/3) followed by p one Ec + Δsp on stays shell filling", () => {
    const cb = [at(V(0.55), 1e-11, 0), at(V(0.65), (2 / 3) * 1e-11, 1), at(V(0.8 + 0.25), 1e-11, 2)];
    expect(classify(cb).regime).toBe("shell-filling");
  });
});

// Low η: a band-edge level's second resonance, Ec/(1 − η) beyond the predicted one, lies between s
// and p. Steps from the closed forms of lib/model/regimeLimits.ts (levelStepRatio) at r = 0.01.
describe("classifyRegime: an extra peak between s and p (intermediate CB step ratio)", () => {
  const r = 0.01;
  const sStepA = 2e-11;
  const pStepA = levelStepRatio(2, 6, r) * sStepA;
  // s, an extra peak at half its step (inside the intermediate band), then p, a whole level of 6
  // states, nearer the extra peak than half the distance from s (one shell by its sub-level reach).
  const cb = [at(V(0.55), sStepA, 0), at(V(0.78), 0.5 * sStepA, 1), at(V(0.85), pStepA, 2)];
  const withVb = (vb: BandPeak[]) => {
    const evidence: RegimeEvidence = { ...regimeRatios(cb, vb), satellitePeaksV: [], satellitePeakIndices: [], secondJunction: [], reasons: [] };
    return { regime: classifyRegime(cb, cb, evidence), evidence };
  };

  it("reads shell tunnelling where the VB's second level also steps levelStepRatio(2, 6, r) × its first", () => {
    const { regime, evidence } = withVb([at(-V(0.6), sStepA, 3), at(-V(0.9), pStepA, 4)]);
    expect(evidence.secondToFirstStepRatio!).toBeGreaterThan(ASSIGN_DEFAULTS.tunnelingSatelliteRatioMax);
    expect(evidence.secondToFirstStepRatio!).toBeLessThan(ASSIGN_DEFAULTS.fillingStepRatio[0]);
    expect(regime).toBe("shell-tunneling");
    expect(evidence.reasons.join(" ")).toMatch(/no charging peak of s/);
  });

  it("stays undetermined where the VB starts with alike steps (a charging doublet), or has one peak", () => {
    expect(withVb([at(-V(0.6), sStepA, 3), at(-V(0.7), 0.9 * sStepA, 4)]).regime).toBe("undetermined");
    expect(withVb([at(-V(0.6), sStepA, 3)]).regime).toBe("undetermined");
  });

  it("stays undetermined where the third CB peak steps less than tunnelingStepRatioMin × the first", () => {
    const weak = [cb[0], cb[1], at(V(0.85), 0.9 * ASSIGN_DEFAULTS.tunnelingStepRatioMin * sStepA, 2)];
    const evidence: RegimeEvidence = { ...regimeRatios(weak, [at(-V(0.6), sStepA, 3), at(-V(0.9), pStepA, 4)]), satellitePeaksV: [], satellitePeakIndices: [], secondJunction: [], reasons: [] };
    expect(classifyRegime(weak, weak, evidence)).toBe("undetermined");
  });
});

describe("extraCbPeak: the extra second CB peak of note 3, and p read after it", () => {
  // Deep in shell tunnelling (r = 0.01): s (2 states), p a whole level of 6 states stepping
  // levelStepRatio(2, 6, r) × s, the VB's second level (4 states) levelStepRatio(2, 4, r) × its
  // first (closed forms); an extra peak stepping 0.55 × s (the intermediate band) close after s.
  const r = 0.01;
  const sStepA = 2e-11;
  const cb = [at(V(0.55), sStepA, 0), at(V(0.6), 0.55 * sStepA, 1), at(V(0.85), levelStepRatio(2, 6, r) * sStepA, 2)];
  const vb = [at(-V(0.6), sStepA, 3), at(-V(0.8), levelStepRatio(2, 4, r) * sStepA, 4)];
  const ratiosOf = (c: BandPeak[], v: BandPeak[]) => regimeRatios(c, v);

  it("names the second CB peak where the third and the second VB step are levels of more states", () => {
    expect(extraCbPeak(cb, ratiosOf(cb, vb))).toBe(cb[1]);
  });

  it("names none with a VB doublet, a weak third CB peak, or a second step outside the intermediate band", () => {
    expect(extraCbPeak(cb, ratiosOf(cb, [vb[0], at(-V(0.7), 0.9 * sStepA, 4)]))).toBeNull();
    const weak = [cb[0], cb[1], at(V(0.85), sStepA, 2)];
    expect(extraCbPeak(weak, ratiosOf(weak, vb))).toBeNull();
    const satellite = [cb[0], at(V(0.6), 0.25 * sStepA, 1), cb[2]];
    expect(extraCbPeak(satellite, ratiosOf(satellite, vb))).toBeNull();
  });

  it("reads shell tunnelling from p after the extra peak, though the extra peak alone would be the next shell", () => {
    // The extra peak lies 0.05/0.8 V after s and p 0.25/0.8 V after it: more than half the s→extra
    // distance, so without the rule the extra peak would be p, carrying 0.55 × the s step.
    const evidence: RegimeEvidence = { ...regimeRatios(cb, vb), satellitePeaksV: [], satellitePeakIndices: [], secondJunction: [], reasons: [] };
    expect(classifyRegime(cb, cb, evidence)).toBe("shell-tunneling");
    expect(evidence.reasons.join(" ")).toMatch(new RegExp(`p shell carries ${levelStepRatio(2, 6, r).toFixed(2)}`));
  });
});

describe("extraCbPeak with a split p (note 2): the shell the third CB peak opens", () => {
  // Step heights from the project's master equation (currentSteps, simulated truth) at the
  // closed-form positions (ε + Ec(n + ½))/η, Ec = 0.1 eV, η = 0.8, every step above a fifth of the
  // largest. Deep in shell tunnelling (r = 0.01): s (0.5 eV) and p split into three doubly
  // degenerate sub-levels (0.8, 0.83, 0.86 eV), each stepping about as s does; an extra peak (an
  // unpredicted resonance, no level of the model) at 0.55 × the s step half way to p. The VB
  // levels v1 (2 states) and v2 (4 states) step levelStepRatio(2, 4, r) (closed form); VB x = |bias|.
  const stepsAt = (r: number, cb: [number, number][]) => {
    const model = {
      cb: cb.map(([energyEV, degeneracy]) => ({ energyEV, degeneracy })),
      vb: [], chargingEnergyEV: 0.1, eta: 0.8, tipRatePerS: r * 1e8, substrateRatePerS: 1e8, relaxationRatePerS: 1e12, temperatureK: 4.5,
    };
    const steps = currentSteps(model).steps.filter((s) => s.biasV > 0);
    const big = Math.max(...steps.map((s) => s.heightA));
    return steps.filter((s) => s.heightA > 0.2 * big);
  };
  const r = 0.01;
  const levels = stepsAt(r, [[0.5, 2], [0.8, 2], [0.83, 2], [0.86, 2]]);
  const sStepA = levels[0].heightA;
  const cb = [at(levels[0].biasV, sStepA, 0), at(V(0.65), 0.55 * sStepA, 1), ...levels.slice(1).map((s, i) => at(s.biasV, s.heightA, i + 2))];
  const vb = [at(V(0.65), sStepA, 10), at(V(0.85), levelStepRatio(2, 4, r) * sStepA, 11)];

  it("reads the split p's first sub-level as short of p alone, the shell it opens as p: the extra peak is set aside and shell tunnelling named", () => {
    expect(levels.map((s) => s.biasV)).toEqual([0.5, 0.8, 0.83, 0.86].map((e) => V(e + 0.05)));
    // Each sub-level about one s step (1/(1 + 4r) for the first, closed form), the three together
    // below 3 × s (a level of g states after s steps at most g/2 × s).
    expectClose(levels[1].heightA / sStepA, levelStepRatio(2, 2, r), { rtol: 0.05, what: "1/(1 + 4r), closed form" });
    expect(levels[1].heightA / sStepA).toBeLessThan(ASSIGN_DEFAULTS.tunnelingStepRatioMin);
    const evidence: RegimeEvidence = { ...regimeRatios(cb, vb), satellitePeaksV: [], satellitePeakIndices: [], secondJunction: [], reasons: [] };
    expect(extraCbPeak(cb, evidence)).toBe(cb[1]);
    expect(classifyRegime(cb, cb, evidence)).toBe("shell-tunneling");
    const shellRatio = levels.slice(1).reduce((a, s) => a + s.heightA, 0) / sStepA;
    expect(shellRatio).toBeLessThanOrEqual(ASSIGN_DEFAULTS.splitShellStepRatioMax);
    expect(evidence.reasons.join(" ")).toMatch(new RegExp(`third CB peak with the 2 sub-level\\(s\\) close after it steps ${shellRatio.toFixed(2)}`));
  });

  it("names no extra peak where the VB edge level shows its charging doublet at the CB pair's spacing", () => {
    // A VB peak one CB pair's spacing beyond the edge peak at r/(1 + r) = 1/2 of it (r = 1, the
    // s doublet's closed form): s's doublet and the edge level's, Ec/η apart on both sides.
    const twin = at(vb[0].x + (cb[1].x - cb[0].x), 0.5 * sStepA, 12);
    const ratios = regimeRatios(cb, vb, [vb[0], twin, vb[1]]);
    expectClose(ratios.valenceTwinStepRatio!, 0.5, { rtol: 1e-12, what: "r/(1 + r) at r = 1, closed form" });
    expect(extraCbPeak(cb, ratios)).toBeNull();
    // Without that peak the ratio is null and the rule stands.
    expect(regimeRatios(cb, vb).valenceTwinStepRatio).toBeNull();
  });

  it("names no extra peak in the crossover (r = 1), where the shell after s's doublet gathers p's charging peaks", () => {
    // s doublet (second step r/(1 + r) = 1/2), then p (6 states) entered early and its charging
    // peaks one Ec/η apart: together far more than the 3 × s a level of six states gives after s.
    const steps = stepsAt(1, [[0.5, 2], [0.8, 6]]);
    const cross = steps.map((s, i) => at(s.biasV, s.heightA, i));
    expectClose(cross[1].peak.stepA / cross[0].peak.stepA, 0.5, { rtol: 0.02, what: "r/(1 + r), closed form" });
    expect(cross[2].peak.stepA / cross[0].peak.stepA).toBeLessThan(ASSIGN_DEFAULTS.tunnelingStepRatioMin);
    const sum = cross.slice(2).reduce((a, p) => a + p.peak.stepA, 0) / cross[0].peak.stepA;
    expect(sum).toBeGreaterThan(ASSIGN_DEFAULTS.splitShellStepRatioMax);
    expect(extraCbPeak(cross, regimeRatios(cross, vb))).toBeNull();
  });
});

describe("classifyRegime: alike CB steps below the level-pair ratio, a short next spacing, and VB levels", () => {
  // Deep in shell tunnelling (r = 0.01, closed forms of lib/model/regimeLimits.ts): s (2 states)
  // with a VB level's resonance under it adding 0.45 × its step, then p split into doubly
  // degenerate sub-levels one 0.03 eV apart, the first stepping levelStepRatio(2, 2, r) = 1/(1 + 4r)
  // × s; the VB levels v1 (2 states) and v2 (4 states), v2 stepping levelStepRatio(2, 4, r) × v1.
  // Positions (ε + Ec/2)/η, Ec = 0.1 eV, η = 0.8; VB x = |bias|.
  const r = 0.01;
  const sStepA = 1e-12;
  const cb = [at(V(0.55), 1.45 * sStepA, 0), at(V(0.85), levelStepRatio(2, 2, r) * sStepA, 1), at(V(0.88), levelStepRatio(2, 2, r) * sStepA, 2)];
  const vb = [at(V(0.65), sStepA, 3), at(V(0.85), levelStepRatio(2, 4, r) * sStepA, 4)];
  const read = (vbAll = vb, vbMain = vb) => {
    const evidence: RegimeEvidence = { ...regimeRatios(cb, vbMain, vbAll), satellitePeaksV: [], satellitePeakIndices: [], secondJunction: [], reasons: [] };
    return { regime: classifyRegime(cb, cb, evidence), evidence };
  };

  it("reads shell tunnelling: the pair is no doublet (next spacing 0.1 × theirs) and the VB shows levels", () => {
    const { regime, evidence } = read();
    expectClose(evidence.secondToFirstStepRatio!, 1 / (1 + 4 * r) / 1.45, { rtol: 1e-12, what: "1/(1 + 4r) over 1.45, closed form" });
    expect(evidence.secondToFirstStepRatio!).toBeGreaterThanOrEqual(ASSIGN_DEFAULTS.fillingStepRatio[0]);
    expect(evidence.secondToFirstStepRatio!).toBeLessThan(levelStepRatio(2, 6, ASSIGN_DEFAULTS.levelPairRateRatioMax));
    expectClose(evidence.thirdToSecondSpacingRatio!, 0.1, { rtol: 1e-9, what: "0.03/0.3, closed form" });
    expect(regime).toBe("shell-tunneling");
    expect(evidence.reasons.join(" ")).toMatch(/levels on both sides/);
  });

  it("leaves it undetermined where the VB edge level shows a weaker peak at the CB pair's spacing, or its second step is a charging peak's", () => {
    const twin = at(vb[0].x + (cb[1].x - cb[0].x), 0.5 * sStepA, 5);
    expect(read([vb[0], twin, vb[1]]).regime).toBe("undetermined");
    const doublet = [vb[0], at(V(0.75), 0.9 * sStepA, 4)];
    expect(read(doublet, doublet).regime).toBe("undetermined");
  });

  it("leaves it undetermined where the next spacing exceeds valenceLevelPairJumpMax × theirs", () => {
    // The third peak 0.7 × the pair's spacing after the second (exact geometry): above 0.6.
    const far = [cb[0], cb[1], at(cb[1].x + 0.7 * (cb[1].x - cb[0].x), cb[2].peak.stepA, 2)];
    const evidence: RegimeEvidence = { ...regimeRatios(far, vb), satellitePeaksV: [], satellitePeakIndices: [], secondJunction: [], reasons: [] };
    expect(evidence.thirdToSecondSpacingRatio!).toBeGreaterThan(ASSIGN_DEFAULTS.valenceLevelPairJumpMax);
    expect(classifyRegime(far, far, evidence)).toBe("undetermined");
  });
});

describe("classifyRegime on two alike CB steps and no third CB peak (the window ends there)", () => {
  // Shell filling at r = 10: s doublet with step ratio r/(1 + r) = 10/11 (closed form), and the VB
  // doublet of ε_v1 = −0.6 eV at the same spacing Ec/η with the same step ratio. Shell tunnelling
  // at r = 0.01: s (0.5 eV) and a doubly degenerate p sub-level (0.8 eV), step ratio 1/(1 + 4r)
  // (closed form, levelStepRatio(2, 2, r)); VB levels v1 (g 2, −0.6 eV) and v2 (g 4, −0.8 eV), step
  // ratio 4/(2(1 + 6r)) (closed form, levelStepRatio(2, 4, r)).
  const withVB = (cb: BandPeak[], vb: BandPeak[]) => {
    const evidence: RegimeEvidence = { ...regimeRatios(cb, vb), satellitePeaksV: [], satellitePeakIndices: [], secondJunction: [], reasons: [] };
    return { regime: classifyRegime(cb, cb, evidence), evidence };
  };
  it("calls an s doublet with a VB doublet of the same spacing shell filling", () => {
    const r = 10, q = r / (1 + r);
    const cb = [at(V(0.55), 1e-11, 0), at(V(0.65), q * 1e-11, 1)];
    const vb = [at(V(0.65), 1e-11, 2), at(V(0.75), q * 1e-11, 3)];
    const { regime, evidence } = withVB(cb, vb);
    expectClose(evidence.valenceSpacingRatio!, 1, { rtol: 1e-12, what: "same Ec on both sides" });
    expect(regime).toBe("shell-filling");
  });
  it("calls s and a p sub-level shell tunnelling when the VB shows levels (second step ≈ 2 × the first)", () => {
    const r = 0.01;
    const cb = [at(V(0.55), 2e-11, 0), at(V(0.85), (1 / (1 + 4 * r)) * 2e-11, 1)];
    const vb = [at(V(0.65), 2e-11, 2), at(V(0.85), (4 / (2 * (1 + 6 * r))) * 2e-11, 3)];
    const { regime, evidence } = withVB(cb, vb);
    expectClose(evidence.valenceStepRatio!, 2 / 1.06, { rtol: 1e-12, what: "g2/(g1(1 + 6r))" });
    expect(regime).toBe("shell-tunneling");
  });
  it("says undetermined without a VB pair", () => {
    const cb = [at(V(0.55), 1e-11, 0), at(V(0.65), 0.95e-11, 1)];
    const { regime, evidence } = withVB(cb, [at(V(0.65), 1e-11, 2)]);
    expect(regime).toBe("undetermined");
    expect(evidence.reasons.join(" ")).toMatch(/fewer than two VB peaks/);
  });
});

describe("classifyRegime: p entered before s is full (Δsp about Ec)", () => {
  // s at 0.5 eV and p (6 states) at 0.61 eV, Ec = 0.1 eV, η = 0.8: peaks at the closed-form
  // positions (ε + Ec(n + ½))/η; p entered at n = 1 lies 1.1 × the s spacing after the doublet,
  // one spacing before p's first charging peak. Step heights from the project's master equation
  // (currentSteps, simulated truth), every step above a fifth of the largest.
  const cbAt = (r: number) => {
    const model = {
      cb: [{ energyEV: 0.5, degeneracy: 2 }, { energyEV: 0.61, degeneracy: 6 }],
      vb: [], chargingEnergyEV: 0.1, eta: 0.8, tipRatePerS: r * 1e8, substrateRatePerS: 1e8, relaxationRatePerS: 1e12, temperatureK: 4.5,
    };
    const steps = currentSteps(model).steps.filter((s) => s.biasV > 0);
    const big = Math.max(...steps.map((s) => s.heightA));
    return steps.filter((s) => s.heightA > 0.2 * big).map((s, i) => at(s.biasV, s.heightA, i));
  };

  it("at Γtip/Γsub = 3 reads the weak third peak as p entered early and names shell filling", () => {
    const cb = cbAt(3);
    expectClose(cb[2].x, (0.61 + 0.15) / 0.8, { rtol: 1e-12, what: "p entered at n = 1, closed form" });
    const { regime, evidence } = classify(cb);
    expectClose(evidence.thirdToSecondSpacingRatio!, 1.1, { rtol: 1e-9, what: "(Δsp)/(Ec), closed form" });
    expect(cb[2].peak.stepA / cb[3].peak.stepA).toBeLessThan(ASSIGN_DEFAULTS.earlyEntryStepRatioMax);
    expect(regime).toBe("shell-filling");
    expect(evidence.reasons.join(" ")).toMatch(/p entered before s is full/);
  });

  it("at the filling limit Γtip/Γsub = 1.5 (doublet ratio 0.6 = r/(1 + r)) leaves it undetermined", () => {
    const { regime, evidence } = classify(cbAt(1.5));
    expectClose(evidence.secondToFirstStepRatio!, 0.6, { rtol: 1e-3, what: "r/(1 + r), closed form" });
    expect(regime).toBe("undetermined");
  });
});

describe("valenceFillingDoublet: the VB read by the CB's shell-filling rule", () => {
  // VB levels v1 (2 states, −0.6 eV) and v2 (4 states, −0.8 eV), Ec = 0.1 eV, η = 0.8: tip-side
  // steps from the project's master equation (currentSteps, simulated truth) at the closed-form
  // positions (|ε| + Ec(n + ½))/η; the main peaks as the assignment takes them (noise below 0.2 ×
  // the median step, then charging satellites below satelliteStepRatioMax × the peak before).
  const vbAt = (r: number) => {
    const model = {
      cb: [], vb: [{ energyEV: -0.6, degeneracy: 2 }, { energyEV: -0.8, degeneracy: 4 }],
      chargingEnergyEV: 0.1, eta: 0.8, tipRatePerS: r * 1e8, substrateRatePerS: 1e8, relaxationRatePerS: 1e12, temperatureK: 4.5,
    };
    const steps = currentSteps(model)
      .steps.filter((s) => s.biasV < 0)
      .map((s, i) => at(-s.biasV, Math.abs(s.heightA), i))
      .sort((a, b) => a.x - b.x);
    return splitSatellites(splitSatellites(steps, ASSIGN_DEFAULTS.noiseStepRatioMax, 0).main, 0, ASSIGN_DEFAULTS.satelliteStepRatioMax).main;
  };

  for (const r of [3, 10]) {
    it(`reads the edge doublet of shell filling at Γtip/Γsub = ${r}: steps r/(1 + r), then a jump of (Ec + Δv)/Ec = 3`, () => {
      const d = valenceFillingDoublet(vbAt(r))!;
      expectClose(d.stepRatio, r / (1 + r), { rtol: 1e-6, what: "r/(1 + r), closed form" });
      expectClose(d.jumpRatio, (0.1 + 0.2) / 0.1, { rtol: 1e-9, what: "(Ec + Δv)/Ec, closed form" });
    });
  }

  it("reads no doublet deep in shell tunnelling (Γtip/Γsub = 0.01): v2 steps about levelStepRatio(2, 4, r) × v1", () => {
    const vb = vbAt(0.01);
    // The closed form leaves out the weak charging satellites the master equation keeps (about 1 %).
    expectClose(regimeRatios(vb).secondToFirstStepRatio!, levelStepRatio(2, 4, 0.01), { rtol: 0.02, what: "4/(2(1 + 6r)), closed form" });
    expect(valenceFillingDoublet(vb)).toBeNull();
  });

  it("reads no doublet below the filling limit (Γtip/Γsub = 1.2): the second step is r/(1 + r) < 0.6 of the first", () => {
    const vb = vbAt(1.2);
    expectClose(regimeRatios(vb).secondToFirstStepRatio!, 1.2 / 2.2, { rtol: 1e-6, what: "r/(1 + r), closed form" });
    expect(valenceFillingDoublet(vb)).toBeNull();
  });

  for (const r of [0.3, 0.8]) {
    it(`reads no doublet at Γtip/Γsub = ${r} where two levels step alike: the next spacing is one Ec, shorter than theirs`, () => {
      const vb = vbAt(r);
      const ratios = regimeRatios(vb);
      expect(ratios.secondToFirstStepRatio!).toBeGreaterThanOrEqual(ASSIGN_DEFAULTS.fillingStepRatio[0]);
      expect(ratios.secondToFirstStepRatio!).toBeLessThanOrEqual(ASSIGN_DEFAULTS.fillingStepRatio[1]);
      expect(ratios.thirdToSecondSpacingRatio!).toBeLessThan(ASSIGN_DEFAULTS.fillingJumpRatioMin);
      expect(valenceFillingDoublet(vb)).toBeNull();
    });
  }

  it("needs a third VB main peak", () => {
    expect(valenceFillingDoublet(vbAt(10).slice(0, 2))).toBeNull();
  });
});
