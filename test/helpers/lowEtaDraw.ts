// A spectrum of the accuracy benchmark's low-η mix (η 0.55–0.65, second-junction resonances kept),
// drawn by syntheticSpectrum, simulated by the fast model and analysed with its η: the truth is
// the simulation's own parameters.
import { expect } from "vitest";
import { expectClose } from "./expectClose.ts";
import { simulateCurve } from "../../lib/model/simulate.ts";
import { syntheticSpectrum, SYNTHETIC_DEFAULTS, type SyntheticRegime } from "../../lib/model/syntheticSpectrum.ts";
import { analyzeCurve } from "../../lib/pipeline/analyzeCurve.ts";
import type { fitCurve } from "../../lib/model/fit/fitCurve.ts";

/** The low-η mix's ranges: the benchmark's defaults with η 0.55–0.65 and the resonances kept. */
export const LOW_ETA_RANGES = { ...SYNTHETIC_DEFAULTS, eta: [0.55, 0.65] as [number, number], secondJunction: "keep" as const };

/**
 * Start `start` of the low-η mix in `regime` (shell filling unless said): its scenario, truth,
 * simulation and analysis, and the project's quality bar for a peak (25 % of Ec/η), V.
 */
export function lowEtaDraw(start: number, regime: SyntheticRegime = "shell-filling") {
  const { truth, scenario } = syntheticSpectrum(start, regime, LOW_ETA_RANGES);
  const sim = simulateCurve(scenario, { method: "fast", conductance: false });
  const analysis = analyzeCurve({ biasV: sim.biasV, currentA: sim.currentA, sweeps: [sim.currentA], didvS: null, meta: { source: "simulated", metadata: {} } }, { eta: truth.eta });
  return { scenario, truth, sim, analysis, tolV: (0.25 * truth.chargingEnergyEV) / truth.eta };
}

/**
 * Check a draw's p against the simulation's truth: shell filling, six peaks each within 25 % of
 * Ec/η of the truth's (the project's quality bar), and none within half that of `resonancesV`.
 */
export function expectTrueP(draw: ReturnType<typeof lowEtaDraw>, resonancesV: readonly number[]) {
  const { analysis: a, truth, tolV } = draw;
  expect(a.assignment.regime).toBe("shell-filling");
  const p = a.assignment.multiplets.find((m) => m.band === "CB" && m.label === "p")!;
  expect(p.peaksV.length).toBe(6);
  expectClose(p.peaksV, truth.pPeaksV, { atol: tolV, what: "p, the simulation's truth" });
  for (const v of resonancesV) expect(p.peaksV.some((q) => Math.abs(q - v) < tolV / 2), `p holds the resonance at ${v} V`).toBe(false);
}

/**
 * The truth's second-junction resonances between s's second peak and p's first, each more than
 * the draw's tolerance from both: resonances that can lead p, clear of its own levels.
 */
export function leadResonancesV(draw: Pick<ReturnType<typeof lowEtaDraw>, "truth" | "tolV">): number[] {
  const { truth, tolV } = draw;
  return truth.secondJunctionPeaksV.filter((v) => v > truth.sPeaksV[1] + tolV && v < truth.pPeaksV[0] - tolV);
}

/**
 * The accuracy benchmark's bar for an intermediate draw against the simulation's truth: the
 * regime intermediate, Ec within 3 %, Γtip/Γsub within × 1.5 (common practice, no source), and
 * a fit that reaches the noise (reduced χ² below FIT_STATUS_DEFAULTS.poorChiSquare, 3).
 */
export function expectIntermediateTruth(fit: ReturnType<typeof fitCurve>, draw: Pick<ReturnType<typeof lowEtaDraw>, "scenario" | "truth">): void {
  const { scenario, truth } = draw;
  const trueRatio = scenario.tipRatePerS / scenario.substrateRatePerS;
  expect(fit.regime).toBe("intermediate");
  expect(Math.abs(fit.chargingEnergyEV.value / truth.chargingEnergyEV - 1)).toBeLessThan(0.03);
  expect(Math.abs(Math.log(fit.rateRatio.value / trueRatio))).toBeLessThan(Math.log(1.5));
  expect(fit.reducedChiSquare).toBeLessThan(3);
}
