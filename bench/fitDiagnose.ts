/**
 * Diagnosis of comparison fits on synthetic spectra: for each start number, the fit's status and
 * reasons, its values against the truth, and the χ² of the model evaluated at the truth (and
 * polished from it), so that a search miss (truth far better) can be told from a status or
 * calibration issue (truth no better).
 *
 *   node bin/run-ts.mjs bench/fitDiagnose.ts --mix crossover 5 46 47
 *   node bin/run-ts.mjs bench/fitDiagnose.ts --mix low-eta --regime intermediate 15 22
 *
 * At low η the truth's CB side is scored three ways: the CB levels alone below the first VB
 * crossing (cbSideEndV), the CB levels alone over the whole positive side, and the CB levels with
 * the assignment's VB levels held (heldValenceLevels) over the whole positive side.
 */
import { simulateCurve } from "../lib/model/simulate.ts";
import { syntheticSpectrum, SYNTHETIC_DEFAULTS, type SyntheticRanges } from "../lib/model/syntheticSpectrum.ts";
import { analyzeCurve } from "../lib/pipeline/analyzeCurve.ts";
import { fitCurve, FIT_DEFAULTS } from "../lib/model/fit/fitCurve.ts";
import { fitRunner } from "../lib/model/fit/fitRunner.ts";
import { fitHypotheses, type FitHypothesis } from "../lib/model/fit/fitHypotheses.ts";
import type { LevelSeed } from "../lib/model/fit/levelsToFit.ts";
import { bandStepsMemo } from "../lib/model/fit/bandStepsMemo.ts";
import { residualStructure } from "../lib/model/fit/residualStructure.ts";
import { heldValenceLevels } from "../lib/model/fit/heldValenceLevels.ts";
import { heldHoleEntry } from "../lib/model/fit/cbSideEnd.ts";

const args = process.argv.slice(2);
const mixAt = args.indexOf("--mix");
const mix = mixAt >= 0 ? args[mixAt + 1] : "crossover";
const regimeAt = args.indexOf("--regime");
const starts = args.filter((a, i) => /^\d+$/.test(a) && args[i - 1] !== "--mix" && args[i - 1] !== "--regime").map(Number);
const ranges: SyntheticRanges =
  mix === "crossover" ? { ...SYNTHETIC_DEFAULTS, rateRatio: { ...SYNTHETIC_DEFAULTS.rateRatio, intermediate: [0.2, 5] } } : mix === "low-eta" ? { ...SYNTHETIC_DEFAULTS, eta: [0.55, 0.65], secondJunction: "keep" } : SYNTHETIC_DEFAULTS;
const regime = (regimeAt >= 0 ? args[regimeAt + 1] : mix === "crossover" || mix === "low-eta" ? "intermediate" : mix) as "intermediate";

for (const k of starts) {
  const { scenario, truth } = syntheticSpectrum(k, regime, ranges);
  const sim = simulateCurve(scenario, { method: "fast" });
  const curve = { biasV: sim.biasV, currentA: sim.currentA, sweeps: [sim.currentA], didvS: sim.didvS, meta: { source: `d-${k}`, metadata: {} } };
  const analysis = analyzeCurve(curve, { eta: truth.eta });
  let fitLine = "";
  try {
    const fit = fitCurve(analysis, { compareModels: true });
    const cbLevels = fit.levels.filter((l) => l.band === "CB").map((l) => `${l.degeneracy}@${(l.energyEV.value * 1000).toFixed(0)}`).join(" ");
    fitLine = `fit ${fit.status} χ²r ${fit.reducedChiSquare.toFixed(2)} Ec ${(fit.chargingEnergyEV.value * 1000).toFixed(1)} r ${fit.rateRatio.value.toPrecision(3)} CB ${cbLevels} [${fit.hypothesis}] reasons: ${fit.statusReasons.join(" | ")}`;
  } catch (e) {
    fitLine = `fit threw ${(e as Error).message}`;
  }
  // The truth as a hypothesis: its CB and VB levels, Ec, rate ratio and broadening.
  const eta = truth.eta;
  const h0 = fitHypotheses(analysis, eta, true)[0];
  let before = 0;
  const cbSorted = [...scenario.cb].sort((a, b) => a.energyEV - b.energyEV);
  const cbSeeds: LevelSeed[] = cbSorted.map((l, j) => {
    const s: LevelSeed = { band: "CB", label: j === 0 ? "s" : `p${j}`, degeneracy: l.degeneracy, firstPeakV: (l.energyEV + scenario.chargingEnergyEV * (before + 0.5)) / eta, before };
    before += l.degeneracy;
    return s;
  });
  before = 0;
  const vbSorted = [...scenario.vb].sort((a, b) => b.energyEV - a.energyEV);
  const vbSeeds: LevelSeed[] = vbSorted.map((l, j) => {
    const s: LevelSeed = { band: "VB", label: `v${j + 1}`, degeneracy: l.degeneracy, firstPeakV: -(-l.energyEV + scenario.chargingEnergyEV * (before + 0.5)) / eta, before };
    before += l.degeneracy;
    return s;
  });
  const settings = { eta, temperatureK: 4.5, maxPoints: 800, maxEvaluations: 1e6, timeLimitMs: null, maxIterations: 60, chargingEnergyGuessEV: 0.1, chunkIterations: 4, convergenceTolerance: 1e-5, cbSideMarginFwhm: 2 };
  const runner = fitRunner(analysis, settings);
  const uncut = fitRunner(analysis, { ...settings, cbSideHeldHole: true });
  const truthParams = (seeds: LevelSeed[]) => [...seeds.map((s, j) => (s.band === "CB" ? cbSorted[j].energyEV : -vbSorted[j - cbSeeds.length].energyEV)), scenario.chargingEnergyEV, Math.log10(scenario.tipRatePerS / scenario.substrateRatePerS), Math.log10(scenario.broadeningEV)];
  const hAll: FitHypothesis = { ...h0, seeds: [...cbSeeds, ...vbSeeds], cbDegeneracies: cbSeeds.map((s) => s.degeneracy), vbReadings: [vbSeeds] };
  const hCb: FitHypothesis = { ...hAll, seeds: cbSeeds, vbReadings: [[]] };
  const at = (h: FitHypothesis, set: typeof runner.all, it: number, r = runner) => {
    const t = r.run(h, null, it, truthParams(h.seeds), set);
    const model = r.projectorOf(set)(r.currentOf(h)(t.loop.parameters, set.biasV)).out;
    const z = residualStructure(set.biasV, set.dataA.map((v, i) => v - model[i]), r.noiseA, analysis.settings.peakWidthMV / 1000).largestZ;
    return `${r.reduced(t).toFixed(2)} (z ${z.toFixed(1)})`;
  };
  let topV = -Infinity;
  for (const v of uncut.cbSide.biasV) topV = Math.max(topV, v);
  const held = heldValenceLevels(h0.seeds, heldHoleEntry(analysis.peaks, eta)?.entry.biasV ?? null, eta, topV);
  const hHeld: FitHypothesis = { ...hCb, heldVb: held };
  let truthLine = "";
  try {
    truthLine = `truth χ²r whole ${at(hAll, runner.all, 1)} polished ${at(hAll, runner.all, 60)}; CB ${at(hCb, runner.cbSide, 1)} (to ${Math.max(...runner.cbSide.biasV).toFixed(2)} V), below the next crossing ${at(hCb, uncut.cbSide, 1, uncut)}, with ${held.map((s) => `${s.label}(g${s.degeneracy})@${s.firstPeakV.toFixed(2)}V`).join(" ") || "no VB level"} held ${at(hHeld, uncut.cbSide, 1, uncut)}, polished ${at(hHeld, uncut.cbSide, 60, uncut)} (to ${topV.toFixed(2)} V)`;
  } catch (e) {
    truthLine = `truth threw ${(e as Error).message}`;
  }
  console.log(`#${k} ${truth.regime} r ${truth.rateRatio.toPrecision(3)} Ec ${(truth.chargingEnergyEV * 1000).toFixed(1)} η ${eta.toFixed(2)} CB ${cbSorted.map((l) => `${l.degeneracy}@${(l.energyEV * 1000).toFixed(0)}`).join(" ")} VB ${vbSorted.map((l) => `${l.degeneracy}@${(l.energyEV * 1000).toFixed(0)} (${(-(-l.energyEV + scenario.chargingEnergyEV / 2) / eta).toFixed(2)} V)`).join(" ")} noise ${(truth.noiseRelative * 100).toFixed(2)}% fwhm ${(truth.peakFwhmV * 1000).toFixed(0)} rules ${analysis.assignment.regime}\n   ${fitLine}\n   ${truthLine}`);
}
void FIT_DEFAULTS;
