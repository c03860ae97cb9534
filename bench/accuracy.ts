/**
 * Accuracy benchmark: synthetic spectra from the orthodox-theory model with known truth, analysed
 * by the full pipeline, scored against the project's quality bar.
 *
 *   npm run bench:accuracy                 # 200 spectra per regime, exact model
 *   npm run bench:accuracy -- --n 50 --method fast --verbose
 *   npm run bench:accuracy -- --path measured       # analyse a simulated lock-in dI/dV column
 *   npm run bench:accuracy -- --mix crossover        # Γtip/Γsub 0.2–5, regime from the true ratio
 *   npm run bench:accuracy -- --mix cut-window       # the bias window ends inside the p shell
 *   npm run bench:accuracy -- --mix low-eta          # η 0.55–0.65 (the default mix otherwise)
 *   npm run bench:accuracy -- --mix crossover --n 100 --method fast --compare-models
 *   npm run bench:accuracy -- --mix crossover --method fast --count-only   # which spectra it would fit
 *   npm run bench:accuracy -- --mix low-eta --method fast --compare-all   # fit every spectrum, as `analyze --compare-models all`
 *   npm run bench:accuracy -- --mix crossover --method fast --compare-models --ec-check   # each fit's Ec against the rules' in σ
 *   npm run bench:accuracy -- --mix low-eta --method fast --compare-models --verbose --only 15,99   # only these draws (seeds), to follow a change on a few
 *   npm run bench:accuracy -- --mix low-eta --method fast --compare-all --regime shell-tunneling   # only the spectra of one true regime
 *
 * A spectrum passes when: the regime is right; the s and p multiplets have the true number of
 * peaks, each within 25 % of Ec of the truth; the gap is within 2 %; Ec (shell filling) and Δsp
 * within 10 %. Intermediate spectra (Γtip/Γsub between 3/7 and 1.5, REGIME_LIMITS) are reported separately: for
 * them "undetermined" is an acceptable answer, a wrong definite regime is not.
 *
 * The other mixes (--mix) leave the default figures alone: "crossover" draws Γtip/Γsub
 * log-uniformly from 0.2 to 5 and reports, per regime of the true ratio (REGIME_LIMITS), how often
 * the rules name it, say undetermined, or name the wrong one, and for the two regimes how many
 * spectra pass every criterion (the truth in the convention of the regime the ratio lies in); "cut-window" ends the bias window
 * halfway through the p shell (the p multiplet then has the peaks inside the window); "low-eta"
 * draws η from 0.55 to 0.65 and keeps the second-junction resonances that fall in the window
 * (syntheticSpectrum's `secondJunction: "keep"`). In every mix a peak at a true second-junction
 * resonance (and at no true tip-junction peak) that the analysis puts in a multiplet fails the
 * spectrum; the low-eta mix also reports how many resonances were labelled as such.
 *
 * With --compare-models, every spectrum on which the rules are not decisive (`rulesDecisive`: the
 * regime undetermined, the s doublet's step ratio near a regime boundary, a filling shell short of
 * its charging peaks inside the window, a dip in a filling shell's charging steps, an even
 * tunnelling ladder, a split tunnelling shell whose sub-levels and strong satellites form one, a
 * broad or strong peak set aside as a satellite, a regime read from two CB peaks, a filling sub-group with an
 * odd number of charging peaks, a tunnelling d level close after a p that steps like a sub-level, a rise in a filling
 * sub-group's charging steps, …) and that has levels is also
 * fitted with `fitCurve(analysis, { compareModels: true })`, as `dotspec analyze --compare-models`
 * does, and the command's decision (`comparisonDecision`: a good fit whose answer carries ≥ 0.9 of
 * the BIC weight, within its regime over ± 1 SE where it overrides a named one) says which answer
 * the record stands by. That answer is scored: the rules' on the criteria above, or the fit's
 * (fitToJson's quantities): in shell filling or shell tunnelling, the fit's regime, its Ec within
 * 10 % and, where the truth has one, its Δsp within 10 % (in shell tunnelling an Ec the fit says is
 * not determined, with no finite error where its χ² profile over Ec stays flat, ecProfile, is not
 * asked, as the rules' criteria ask no Ec of a tunnelling reading; an Ec it says is determined
 * must still be right); in the intermediate range, the regime
 * "intermediate" with Ec within 3 % and Γtip/Γsub within × 1.5 (the issue's bar). Per regime the
 * rules alone and the answer the record stands by are printed, with how many spectra were fitted,
 * what the fit made of them, how often it decided, fixed a failing answer or broke a passing
 * one, which reasons sent spectra to the fit, and the fits' time, and, per regime, how the fitted
 * Ec's errors cover the truth where the fit reads the true regime and determines Ec (the share
 * within 1, 2 and 3 standard errors, against a normal distribution's 68 / 95 / 99.7 %).
 * --count-only lists which spectra would be fitted and why without fitting them (seconds instead
 * of minutes).
 */
import { loadavg } from "node:os";
import { simulateCurve } from "../lib/model/simulate.ts";
import { syntheticSpectrum, SYNTHETIC_DEFAULTS, type SyntheticRanges, type SyntheticRegime, type SyntheticTruth } from "../lib/model/syntheticSpectrum.ts";
import { REGIME_LIMITS } from "../lib/model/regimeLimits.ts";
import { analyzeCurve, type CurveAnalysis } from "../lib/pipeline/analyzeCurve.ts";
import { fitCurve } from "../lib/model/fit/fitCurve.ts";
import { analysisToJson } from "../lib/report/analysisJson.ts";
import { fitToJson } from "../lib/report/fitJson.ts";
import { modelComparisonJson, type ModelComparisonJson } from "../lib/report/modelComparisonJson.ts";
import { rulesDecisive } from "../lib/assign/rulesDecisive.ts";
import { peakChargingEnergy } from "../lib/model/fit/fitStatus.ts";

const args = process.argv.slice(2);
const arg = (name: string, fallback: string) => {
  const i = args.indexOf(`--${name}`);
  return i >= 0 ? args[i + 1] : fallback;
};
const perRegime = Number(arg("n", "200"));
const method = arg("method", "exact") as "exact" | "fast";
const verbose = args.includes("--verbose");
// With --compare-all: every spectrum with levels is fitted, as `dotspec analyze --compare-models all` does (implies --compare-models).
const compareAll = args.includes("--compare-all");
const compareModels = args.includes("--compare-models") || args.includes("--count-only") || compareAll;
// With --ec-check: for every comparison fit where the rules read shell filling and the fit a charging ladder, the fit's Ec from the peak-based one in combined σ, its CB layout, status and outcome.
const ecCheck = args.includes("--ec-check");
// With --count-only: which spectra --compare-models would fit and why (the rules' answers, no fit).
const countOnly = args.includes("--count-only");
const firstSeed = Number(arg("seed", "1"));
// With --only S1,S2,…: analyse only the draws with these seeds (the range still starts at --seed and runs --n); the totals then count those draws alone.
const only = args.includes("--only") ? new Set(arg("only", "").split(",").map(Number)) : null;
/** Spectra analysed per regime: --n, or those of --only inside the range. */
const analysedPerRegime = only ? [...only].filter((s) => s >= firstSeed && s < firstSeed + perRegime).length : perRegime;
// "current": differentiate the simulated current; "measured": analyse a simulated lock-in dI/dV column.
const path = arg("path", "current") as "current" | "measured";
const mix = arg("mix", "default") as "default" | "crossover" | "cut-window" | "low-eta";
if (!["default", "crossover", "cut-window", "low-eta"].includes(mix)) throw new Error(`--mix must be default, crossover, cut-window or low-eta; got ${mix}`);
const ranges: SyntheticRanges =
  mix === "low-eta" ? { ...SYNTHETIC_DEFAULTS, eta: [0.55, 0.65], secondJunction: "keep" } : mix === "crossover" ? { ...SYNTHETIC_DEFAULTS, rateRatio: { ...SYNTHETIC_DEFAULTS.rateRatio, intermediate: [0.2, 5] } } : SYNTHETIC_DEFAULTS;

interface Score {
  pass: boolean;
  failures: string[];
}

/** Second-junction resonances of the truth: in the window, found as peaks, labelled as such, counted in a multiplet. */
const resonanceTally = { inWindow: 0, found: 0, labelled: 0, inMultiplet: 0 };

function score(a: CurveAnalysis, t: SyntheticTruth, tipPeaksV: readonly number[]): Score {
  const failures: string[] = [];
  const asg = a.assignment;
  // Resonances through the substrate junction are never levels or VB groups.
  const resTolV = (0.25 * t.chargingEnergyEV) / (1 - t.eta);
  const tipTolV = (0.25 * t.chargingEnergyEV) / t.eta;
  for (const r of t.secondJunctionPeaksV) {
    resonanceTally.inWindow++;
    if (tipPeaksV.some((v) => Math.abs(v - r) <= tipTolV + resTolV)) continue; // overlaps a level: cannot be told
    const k = a.peaks.findIndex((p) => Math.abs(p.biasV - r) <= resTolV);
    if (k < 0) continue;
    resonanceTally.found++;
    if (asg.evidence.secondJunction.some((x) => x.index === k)) resonanceTally.labelled++;
    const m = asg.multiplets.find((x) => x.peakIndices.includes(k));
    if (m) {
      resonanceTally.inMultiplet++;
      failures.push(`resonance at ${r.toFixed(3)} V counted in ${m.label}`);
    }
  }
  const expectRegime = t.regime;
  if (asg.regime !== expectRegime) failures.push(`regime ${asg.regime}`);
  const tolV = (0.25 * t.chargingEnergyEV) / t.eta;
  for (const [label, truth] of [["s", t.sPeaksV], ["p", t.pPeaksV]] as const) {
    const m = asg.multiplets.find((x) => x.band === "CB" && x.label === label);
    if (!m) {
      failures.push(`no ${label}`);
      continue;
    }
    if (m.peaksV.length !== truth.length) failures.push(`${label} has ${m.peaksV.length} peaks, truth ${truth.length}`);
    else m.peaksV.forEach((v, i) => Math.abs(v - truth[i]) > tolV && failures.push(`${label}${i + 1} off by ${((v - truth[i]) * 1e3).toFixed(1)} mV`));
  }
  const q = asg.quantities;
  if (q.gapV === null || Math.abs(q.gapV - t.gapV) > 0.02 * t.gapV) failures.push(`gap ${q.gapV?.toFixed(4)} vs ${t.gapV.toFixed(4)}`);
  if (t.regime === "shell-filling") {
    const ec = asg.energies.chargingEnergyEV;
    if (ec === null || Math.abs(ec - t.chargingEnergyEV) > 0.1 * t.chargingEnergyEV) failures.push(`Ec ${ec?.toFixed(4)} vs ${t.chargingEnergyEV.toFixed(4)}`);
  }
  const sp = asg.energies.levelSpacingSPEV;
  if (sp === null || Math.abs(sp - t.levelSpacingSPEV) > 0.1 * t.levelSpacingSPEV) failures.push(`Δsp ${sp?.toFixed(4)} vs ${t.levelSpacingSPEV.toFixed(4)}`);
  return { pass: failures.length === 0, failures };
}

/** What the model comparison gave on one spectrum the command fits: the fit's own score and whether the record stands by it. */
type Comparison = { outcome: "undetermined" | "pass" | "fail"; decides: boolean; detail: string; reasons: string[] };
/** Wall time of each comparison fit, ms. */
const comparisonMs: number[] = [];
/**
 * Per true regime: spectra the command fits (the rules not decisive), those left undetermined by
 * the rules among them, what the fit made of them, and where the record stands by the fit: how
 * often that turned a failing rules' answer into a pass (fixed) or a passing one into a failure
 * (broke).
 */
const comparisonTally = new Map<string, { fitted: number; undecided: number; pass: number; fail: number; undetermined: number; decides: number; fixed: number; broke: number }>();
/**
 * Per true regime: (fitted Ec − true Ec)/its standard error, over the fits that read the true regime
 * and determine Ec (a finite error). For errors that are honest standard deviations of a normally
 * distributed estimate, 68 / 95 / 99.7 % of these lie within 1 / 2 / 3 (the normal distribution's
 * coverage; any statistics handbook).
 */
const ecCalibration = new Map<string, number[]>();
/** How many spectra each rule of `rulesDecisive` (its code) sent to the fit. */
const reasonTally = new Map<string, number>();

/** The fit's answer scored against the truth: the fit's regime, Ec and, per regime, Δsp or Γtip/Γsub. */
function scoreFit(m: ModelComparisonJson, t: SyntheticTruth): { outcome: Comparison["outcome"]; detail: string } {
  if (m.status === "failed" || m.regime === "undetermined") return { outcome: "undetermined", detail: `fit ${m.status}, ${m.regime}` };
  const failures: string[] = [];
  const ec = m.quantities.chargingEnergyEV?.value ?? NaN;
  if (m.regime !== t.regime) failures.push(`regime ${m.regime}`);
  const ecTol = t.regime === "intermediate" ? 0.03 : 0.1;
  // In shell tunnelling an Ec the fit leaves undetermined (no finite error) is not asked, as of the rules; a determined one is.
  const ecUndetermined = m.regime === "shell-tunneling" && !Number.isFinite(m.quantities.chargingEnergyEV?.standardError ?? NaN);
  if (!ecUndetermined && !(Math.abs(ec - t.chargingEnergyEV) <= ecTol * t.chargingEnergyEV)) failures.push(`Ec ${ec.toFixed(4)} vs ${t.chargingEnergyEV.toFixed(4)}`);
  if (t.regime === "intermediate") {
    const r = m.rateRatio?.value ?? NaN;
    if (!(Math.abs(Math.log(r / t.rateRatio)) <= Math.log(1.5))) failures.push(`Γtip/Γsub ${r.toPrecision(3)} vs ${t.rateRatio.toPrecision(3)}`);
  } else {
    const sp = m.quantities.levelSpacingSPEV?.value ?? null;
    if (sp === null || Math.abs(sp - t.levelSpacingSPEV) > 0.1 * t.levelSpacingSPEV) failures.push(`Δsp ${sp?.toFixed(4)} vs ${t.levelSpacingSPEV.toFixed(4)}`);
  }
  return { outcome: failures.length ? "fail" : "pass", detail: `fit ${m.status} ${m.hypothesis}${ecUndetermined ? " (Ec undetermined)" : ""}${failures.length ? ": " + failures.join("; ") : ""}` };
}

/**
 * The fit `dotspec analyze --compare-models` adds to a curve whose rules are not decisive
 * (`rulesDecisive`), with the command's decision (`comparisonDecision`), scored against the truth;
 * null where the command would not fit (rules decisive, or no levels). `rulesPass`: whether the
 * rules' answer passes (false for intermediate spectra, which need Γtip/Γsub).
 */
function compareWithModel(a: CurveAnalysis, t: SyntheticTruth, rulesPass: boolean): Comparison | null {
  if (!compareModels) return null;
  const json = analysisToJson(a);
  if (json.noLevels !== null) return null;
  const bias = a.conductance.biasV;
  const verdict = rulesDecisive({ peaks: a.peaks, assignment: a.assignment, biasRangeV: [bias[0], bias[bias.length - 1]] });
  if (verdict.decisive && !compareAll) return null;
  // Each rule once per spectrum, by its code (a rule can give several reasons on one spectrum).
  for (const code of new Set(verdict.codes)) reasonTally.set(code, (reasonTally.get(code) ?? 0) + 1);
  const tally = comparisonTally.get(t.regime) ?? { fitted: 0, undecided: 0, pass: 0, fail: 0, undetermined: 0, decides: 0, fixed: 0, broke: 0 };
  comparisonTally.set(t.regime, tally);
  tally.fitted++;
  if (a.assignment.regime === "undetermined") tally.undecided++;
  if (countOnly) {
    // Which spectra the command would fit, without fitting them (fast): the rules' answer stands.
    // (`pass`/`fail` then count the rules' answers on the spectra that would be fitted.)
    tally[rulesPass ? "pass" : "fail"]++;
    return { outcome: "undetermined", decides: false, detail: "not fitted (--count-only)", reasons: verdict.reasons };
  }
  const t0 = performance.now();
  let result: Comparison;
  try {
    const fit = fitCurve(a, { compareModels: true });
    const m = modelComparisonJson(fitToJson(fit, json), compareAll ? "all" : "undecided", { ranBecause: verdict.reasons, rules: { regime: json.regime, chargingEnergyEV: a.assignment.energies.chargingEnergyEV } });
    const sc = scoreFit(m, t);
    const ecFit = m.quantities.chargingEnergyEV;
    if (m.regime === t.regime && ecFit && Number.isFinite(ecFit.standardError) && ecFit.standardError > 0) {
      const zs = ecCalibration.get(t.regime) ?? [];
      ecCalibration.set(t.regime, zs);
      zs.push((ecFit.value - t.chargingEnergyEV) / ecFit.standardError);
    }
    result = { ...sc, decides: m.decides === true, detail: `${sc.detail}; ${m.decision}`, reasons: verdict.reasons };
    if (ecCheck) {
      // Where the rules read shell filling and the fit a charging ladder: how far the fit's Ec lies from the peak-based one, by layout and outcome.
      const peakEc = peakChargingEnergy(a, fit.eta);
      if (peakEc && fit.regime !== "shell-tunneling" && fit.regime !== "undetermined") {
        const sigmas = Math.abs(fit.chargingEnergyEV.value - peakEc.valueEV) / Math.hypot(fit.chargingEnergyEV.standardError, peakEc.standardErrorEV);
        const layout = fit.levels.filter((l) => l.band === "CB").map((l) => l.degeneracy).join("+");
        const others = fit.statusReasons.filter((r) => !/peak-based/.test(r)).length;
        console.log(`ec-check ${t.regime} ${sigmas.toFixed(2)} σ layout ${layout} status ${fit.status} other-reasons ${others} fit-values ${sc.outcome} (${sc.detail.replace(/; the record.*/, "")})`);
      }
    }
  } catch (err) {
    result = { outcome: "undetermined", decides: false, detail: `fit threw: ${(err as Error).message}`, reasons: verdict.reasons };
  }
  comparisonMs.push(performance.now() - t0);
  tally[result.outcome]++;
  if (result.decides) {
    tally.decides++;
    if (result.outcome === "pass" && !rulesPass) tally.fixed++;
    if (result.outcome !== "pass" && rulesPass) tally.broke++;
  }
  return result;
}

/** Whether the record's standing answer passes: the fit's where it decides, else the rules'. */
function standingPass(rulesPass: boolean, cmp: Comparison | null): boolean {
  return cmp?.decides ? cmp.outcome === "pass" : rulesPass;
}

/** With --verbose: a fitted spectrum whose standing answer fails, or where the fit changed the outcome. */
function logComparison(seed: number, regime: string, t: SyntheticTruth, rulesRegime: string, rulesPass: boolean, cmp: Comparison | null): void {
  if (!verbose || !cmp) return;
  const standing = standingPass(rulesPass, cmp);
  if (standing && rulesPass) return;
  const change = standing === rulesPass ? (standing ? "" : "still fails") : standing ? "FIXED" : "BROKE";
  console.log(`seed ${seed} ${regime} r=${t.rateRatio.toFixed(3)} Ec=${t.chargingEnergyEV.toFixed(3)} rules ${rulesRegime} (${rulesPass ? "pass" : "fail"}); fitted because ${cmp.reasons.map((r) => r.slice(0, 60)).join(" | ")}; fit ${cmp.outcome}, ${cmp.decides ? "decides" : "rules stand"} ${change}: ${cmp.detail}`);
}

/** Per true regime: spectra, and how many the rules alone pass on every criterion. */
const rulesTally = new Map<string, { total: number; passed: number; standing: number }>();
function tallyRules(regime: string, passed: boolean, cmp: Comparison | null): void {
  const r = rulesTally.get(regime) ?? { total: 0, passed: 0, standing: 0 };
  r.total++;
  if (passed) r.passed++;
  if (standingPass(passed, cmp)) r.standing++;
  rulesTally.set(regime, r);
}

/** Time of each analyzeCurve call, ms (the first few include warm-up). */
const analysisMs: number[] = [];

// With --regime R: only the spectra of that true regime (default mixes; the totals then count those alone).
const onlyRegime = args.includes("--regime") ? (arg("regime", "") as SyntheticRegime) : null;
if (onlyRegime !== null && (mix === "crossover" || !["shell-filling", "shell-tunneling", "intermediate"].includes(onlyRegime))) throw new Error(`--regime must be shell-filling, shell-tunneling or intermediate, and is not for the crossover mix (its regimes come from the drawn ratio); got ${onlyRegime} with --mix ${mix}`);
const regimes: SyntheticRegime[] = mix === "crossover" ? [] : (["shell-filling", "shell-tunneling", "intermediate"] as SyntheticRegime[]).filter((r) => !onlyRegime || r === onlyRegime);
const started = performance.now();
const lines: string[] = [];
if (mix === "crossover") {
  // Regime of the true ratio against the rules' answer; the two regimes' spectra scored on every criterion.
  const counts = new Map<string, { right: number; undetermined: number; wrong: number; total: number; passed: number }>();
  const reasons = new Map<string, Map<string, number>>();
  const tunnelingEc = { reported: 0, within10: 0 }; // Ec from a charging satellite, tunnelling side
  for (let k = 0; k < perRegime; k++) {
    const seed = firstSeed + k;
    if (only && !only.has(seed)) continue;
    const { scenario, truth } = syntheticSpectrum(seed, "intermediate", ranges);
    const sim = simulateCurve(scenario, { method, conductance: path === "measured" });
    const curve = { biasV: sim.biasV, currentA: sim.currentA, sweeps: [sim.currentA], didvS: sim.didvS, meta: { source: `crossover-${seed}`, metadata: {} } };
    const t0 = performance.now();
    const analysis = analyzeCurve(curve, { eta: truth.eta, useMeasured: path === "measured" });
    analysisMs.push(performance.now() - t0);
    const got = analysis.assignment.regime;
    const want = truth.regime;
    const c = counts.get(want) ?? { right: 0, undetermined: 0, wrong: 0, total: 0, passed: 0 };
    c.total++;
    if (got === want) c.right++;
    else if (got === "undetermined") c.undetermined++;
    else c.wrong++;
    if (want === "shell-tunneling" && got === want) {
      const ec = analysis.assignment.energies.chargingEnergyEV;
      if (ec !== null) {
        tunnelingEc.reported++;
        if (Math.abs(ec - truth.chargingEnergyEV) <= 0.1 * truth.chargingEnergyEV) tunnelingEc.within10++;
      }
    }
    const sc = want === "intermediate" ? null : score(analysis, truth, [...truth.sPeaksV, ...truth.pPeaksV, ...truth.valencePeaksV]);
    const cmp = compareWithModel(analysis, truth, sc?.pass ?? false);
    logComparison(seed, want, truth, got, sc?.pass ?? false, cmp);
    if (sc) {
      tallyRules(want, sc.pass, cmp);
      if (sc.pass) c.passed++;
      else {
        const key = sc.failures[0].replace(/[-\d.]+/g, "#");
        const m = reasons.get(want) ?? new Map<string, number>();
        m.set(key, (m.get(key) ?? 0) + 1);
        reasons.set(want, m);
      }
      if (!sc.pass && verbose) console.log(`seed ${seed} ${want} r=${truth.rateRatio.toFixed(3)} Ec=${truth.chargingEnergyEV.toFixed(3)} η=${truth.eta.toFixed(2)} fwhm=${(truth.peakFwhmV * 1e3).toFixed(0)}mV noise=${(truth.noiseRelative * 100).toFixed(2)}% split=${truth.pSubgroups.join("+")}: ${sc.failures.join("; ")}`);
    } else {
      tallyRules(want, false, cmp);
      if (got !== "undetermined" && verbose) console.log(`seed ${seed} intermediate r=${truth.rateRatio.toFixed(3)}: named ${got}`);
    }
    counts.set(want, c);
  }
  for (const want of ["shell-filling", "shell-tunneling", "intermediate"]) {
    const c = counts.get(want);
    if (!c) continue;
    const all = want === "intermediate" ? "" : `, all criteria ${c.passed} (${((100 * c.passed) / c.total).toFixed(1)} %)`;
    lines.push(`${want.padEnd(16)} ${c.total} spectra (true Γtip/Γsub): named ${c.right}, undetermined ${c.undetermined}, another regime ${c.wrong}${all}`);
    const r = reasons.get(want);
    if (r?.size) lines.push("   first failure: " + [...r.entries()].sort((a, b) => b[1] - a[1]).map(([k, v]) => `${k} ×${v}`).join(", "));
  }
  lines.push(`tunnelling side named shell tunnelling with Ec from a charging satellite: ${tunnelingEc.reported}, within 10 % of the truth ${tunnelingEc.within10}`);
}
const calibration: number[] = []; // (found − true)/σ for the s and p peaks of passing spectra
for (const regime of regimes) {
  let passed = 0, regimeRight = 0, undetermined = 0, wrongDefinite = 0;
  const reasons = new Map<string, number>();
  for (let k = 0; k < perRegime; k++) {
    const seed = firstSeed + k;
    if (only && !only.has(seed)) continue;
    const drawn = syntheticSpectrum(seed, regime, ranges);
    const { scenario } = drawn;
    let { truth } = drawn;
    const sim = simulateCurve(scenario, { method, conductance: path === "measured" });
    let curve = { biasV: sim.biasV, currentA: sim.currentA, sweeps: [sim.currentA], didvS: sim.didvS, meta: { source: `synthetic-${regime}-${seed}`, metadata: {} } };
    if (mix === "cut-window" && truth.pPeaksV.length >= 2) {
      // End the window halfway through the p shell, between two of its peaks.
      const k = Math.floor(truth.pPeaksV.length / 2);
      const topV = (truth.pPeaksV[k - 1] + truth.pPeaksV[k]) / 2;
      const keep = (a: Float64Array | null) => (a ? a.filter((_, i) => sim.biasV[i] <= topV) : null);
      const currentA = keep(sim.currentA)!;
      curve = { ...curve, biasV: keep(sim.biasV)!, currentA, sweeps: [currentA], didvS: keep(sim.didvS) };
      truth = { ...truth, pPeaksV: truth.pPeaksV.slice(0, k) };
    }
    const t0 = performance.now();
    const analysis = analyzeCurve(curve, { eta: truth.eta, useMeasured: path === "measured" });
    analysisMs.push(performance.now() - t0);
    if (regime === "intermediate") {
      const cmp = compareWithModel(analysis, truth, false);
      logComparison(seed, regime, truth, analysis.assignment.regime, false, cmp);
      tallyRules(regime, false, cmp);
      if (analysis.assignment.regime === "undetermined") undetermined++;
      else wrongDefinite++;
      continue;
    }
    const s = score(analysis, truth, [...drawn.truth.sPeaksV, ...drawn.truth.pPeaksV, ...truth.valencePeaksV]);
    const cmp = compareWithModel(analysis, truth, s.pass);
    logComparison(seed, regime, truth, analysis.assignment.regime, s.pass, cmp);
    tallyRules(regime, s.pass, cmp);
    if (analysis.assignment.regime === regime) regimeRight++;
    if (s.pass) {
      passed++;
      for (const label of ["s", "p"] as const) {
        const m = analysis.assignment.multiplets.find((x) => x.band === "CB" && x.label === label)!;
        const truthV = label === "s" ? truth.sPeaksV : truth.pPeaksV;
        m.peaksV.forEach((v, i) => calibration.push((v - truthV[i]) / m.peakUncertaintiesV[i]));
      }
    } else {
      const key = s.failures[0].replace(/[-\d.]+/g, "#");
      reasons.set(key, (reasons.get(key) ?? 0) + 1);
      if (verbose) console.log(`seed ${seed} ${regime} r=${truth.rateRatio.toFixed(3)} Ec=${truth.chargingEnergyEV.toFixed(3)} η=${truth.eta.toFixed(2)} fwhm=${(truth.peakFwhmV * 1e3).toFixed(0)}mV noise=${(truth.noiseRelative * 100).toFixed(2)}% split=${truth.pSubgroups.join("+")}: ${s.failures.join("; ")}`);
    }
  }
  if (regime === "intermediate") {
    lines.push(`intermediate     ${analysedPerRegime} spectra: undetermined ${undetermined}, a definite regime ${wrongDefinite}`);
  } else {
    lines.push(
      `${regime.padEnd(16)} ${analysedPerRegime} spectra: all criteria ${passed} (${((100 * passed) / analysedPerRegime).toFixed(1)} %), regime right ${regimeRight} (${((100 * regimeRight) / analysedPerRegime).toFixed(1)} %)`,
    );
    if (reasons.size) lines.push("   first failure: " + [...reasons.entries()].sort((a, b) => b[1] - a[1]).map(([k, v]) => `${k} ×${v}`).join(", "));
  }
}
if (mix === "low-eta") {
  const t = resonanceTally;
  lines.push(`second-junction resonances in the window ${t.inWindow}, found apart from any level ${t.found}: labelled second-junction ${t.labelled}, counted in a multiplet ${t.inMultiplet}`);
}
if (compareModels) {
  // Rules alone, then rules plus what the comparison made of the spectra they left undetermined.
  const pc = (k: number, n: number) => `${k}/${n} (${n ? ((100 * k) / n).toFixed(1) : "—"} %)`;
  for (const regime of ["shell-filling", "shell-tunneling", "intermediate"]) {
    const r = rulesTally.get(regime);
    if (!r) continue;
    const c = comparisonTally.get(regime) ?? { fitted: 0, undecided: 0, pass: 0, fail: 0, undetermined: 0, decides: 0, fixed: 0, broke: 0 };
    const what = regime === "intermediate" ? "intermediate, Ec within 3 % and Γtip/Γsub within ×1.5" : "all criteria";
    lines.push(
      `${regime.padEnd(16)} ${what}: rules alone ${pc(r.passed, r.total)}, as the command reports with the comparison ${pc(r.standing, r.total)} ` +
        `(fitted ${c.fitted}, ${c.undecided} of them undetermined by the rules; the fit got ${c.pass} right, ${c.fail} wrong, ${c.undetermined} undetermined or failed; it decided ${c.decides}: fixed ${c.fixed}, broke ${c.broke})`,
    );
  }
  lines.push("fitted because (rulesDecisive codes, spectra): " + [...reasonTally.entries()].sort((a, b) => b[1] - a[1]).map(([k, v]) => `${k} ×${v}`).join("; "));
  const ms = comparisonMs.slice().sort((a, b) => a - b);
  const at = (p: number) => (ms.length ? ms[Math.min(ms.length - 1, Math.floor(p * ms.length))].toFixed(0) : "—");
  lines.push(`comparison fits ${ms.length}: median ${at(0.5)} ms, 90th percentile ${at(0.9)} ms, total ${(ms.reduce((x, y) => x + y, 0) / 1000).toFixed(1)} s; load average ${loadavg().map((x) => x.toFixed(1)).join(", ")}`);
}
const coverage = (zs: readonly number[], k: number) => zs.filter((z) => Math.abs(z) <= k).length / Math.max(zs.length, 1);
const within = (k: number) => coverage(calibration, k);
for (const [regime, zs] of ecCalibration)
  lines.push(`fitted Ec uncertainty calibration, ${regime} (${zs.length} fits reading the true regime with Ec determined): |error| ≤ 1σ ${(100 * coverage(zs, 1)).toFixed(0)} %, ≤ 2σ ${(100 * coverage(zs, 2)).toFixed(0)} %, ≤ 3σ ${(100 * coverage(zs, 3)).toFixed(0)} % (normal: 68/95/99.7)`);
if (mix !== "crossover") lines.push(
  `peak-position uncertainty calibration over ${calibration.length} peaks: |error| ≤ 1σ ${(100 * within(1)).toFixed(0)} %, ≤ 2σ ${(100 * within(2)).toFixed(0)} %, ≤ 3σ ${(100 * within(3)).toFixed(0)} % (normal: 68/95/99.7)`,
);
const sortedMs = analysisMs.slice(20).sort((a, b) => a - b);
if (sortedMs.length) lines.push(`analyzeCurve after 20 warm-up calls: median ${sortedMs[sortedMs.length >> 1].toFixed(2)} ms, 90th percentile ${sortedMs[Math.floor(0.9 * sortedMs.length)].toFixed(2)} ms`);
lines.push(`${mix === "default" ? "" : `mix ${mix}, `}${compareModels ? "--compare-models, " : ""}method ${method}, ${path} dI/dV, seeds ${firstSeed}…${firstSeed + perRegime - 1}, ${((performance.now() - started) / 1000).toFixed(1)} s`);
console.log(lines.join("\n"));
