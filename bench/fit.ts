/**
 * Fit benchmark over the filling–tunnelling crossover: synthetic spectra with Γtip/Γsub drawn
 * log-uniformly from 0.2 to 5 (the accuracy benchmark's dots otherwise: Ec, η, s–p spacing,
 * p whole or split, widths and noise drawn from its ranges), simulated with known truth, analysed,
 * then fitted with `fitCurve`. Reports, per regime of the true rate ratio (REGIME_LIMITS), how
 * often the fit names the right regime, recovers Ec within 3 % and Γtip/Γsub within × 1.5, the
 * statuses, the model evaluations per fit (the work its budget counts), and the time per fit (median and 90th percentile, after one warm-up fit), with a digest
 * of every reported value (equal digests: no result moved by a bit).
 *
 *   npm run bench:fit                          # 60 spectra from seed 1, fast-model simulation
 *   npm run bench:fit -- --n 20 --seed 101 --compare-models --verbose
 *   npm run bench:fit -- --method exact        # simulate with the exact master equation
 *   npm run bench:fit -- --max-evaluations 2000 # a smaller work budget (default FIT_DEFAULTS.maxEvaluations)
 */
import { loadavg } from "node:os";
import { simulateCurve } from "../lib/model/simulate.ts";
import { syntheticSpectrum, SYNTHETIC_DEFAULTS, type SyntheticRanges } from "../lib/model/syntheticSpectrum.ts";
import { analyzeCurve } from "../lib/pipeline/analyzeCurve.ts";
import { fitCurve, FIT_DEFAULTS } from "../lib/model/fit/fitCurve.ts";
import { REGIME_LIMITS } from "../lib/model/regimeLimits.ts";

const args = process.argv.slice(2);
const arg = (name: string, fallback: string) => {
  const i = args.indexOf(`--${name}`);
  return i >= 0 ? args[i + 1] : fallback;
};
const count = Number(arg("n", "60"));
const firstSeed = Number(arg("seed", "1"));
const method = arg("method", "fast") as "exact" | "fast";
const compareModels = args.includes("--compare-models");
const verbose = args.includes("--verbose");
const maxEvaluations = args.includes("--max-evaluations") ? Number(arg("max-evaluations", "")) : undefined;
const ratioRange: [number, number] = [Number(arg("from", "0.2")), Number(arg("to", "5"))];

const ranges: SyntheticRanges = { ...SYNTHETIC_DEFAULTS, rateRatio: { ...SYNTHETIC_DEFAULTS.rateRatio, intermediate: ratioRange } };
const truthRegime = (r: number) => (r >= REGIME_LIMITS.fillingRateRatioMin ? "shell-filling" : r <= REGIME_LIMITS.tunnelingRateRatioMax ? "shell-tunneling" : "intermediate");

interface Row {
  regime: string;
  regimeRight: boolean;
  ecWithin: boolean;
  ratioWithin: boolean;
  status: string;
  /** Reduced χ² of the fit reported. */
  chi: number;
  /** Largest |Σ r|/√w of its residuals over a peak's width (residualStructure). */
  z: number;
  ms: number;
  /** Model evaluations the fit asked for (all runs: the work its budget counts). */
  evaluations: number;
  /** What cut it short (FitWork.stoppedBy). */
  stoppedBy: string | null;
  /** CPU time of the fit's thread (process.cpuUsage: user + system), ms: less sensitive to other jobs on the machine than the wall time. */
  cpuMs: number;
}
const rows: Row[] = [];
// A digest of every fit's reported values (hypothesis, status, Ec, Γtip/Γsub, reduced χ² to 17
// digits): equal digests say that a change of the code moved no result by a single bit.
let digest = 0x811c9dc5;
const fold = (text: string) => {
  for (let i = 0; i < text.length; i++) digest = Math.imul(digest ^ text.charCodeAt(i), 0x01000193) >>> 0;
};
const cpuSince = (c0: NodeJS.CpuUsage) => {
  const d = process.cpuUsage(c0);
  return (d.user + d.system) / 1000;
};
const curveOf = (seed: number) => {
  const { scenario, truth } = syntheticSpectrum(seed, "intermediate", ranges);
  const sim = simulateCurve(scenario, { method, conductance: false });
  const curve = { biasV: sim.biasV, currentA: sim.currentA, sweeps: [sim.currentA], didvS: null, meta: { source: `crossover-${seed}`, metadata: {} } };
  return { analysis: analyzeCurve(curve, { eta: truth.eta }), truth };
};
// Warm-up (compilation), not timed.
fitCurve(curveOf(firstSeed).analysis, { compareModels, maxEvaluations });
const started = performance.now();
for (let k = 0; k < count; k++) {
  const seed = firstSeed + k;
  const { analysis, truth } = curveOf(seed);
  const t0 = performance.now();
  const c0 = process.cpuUsage();
  let fit;
  try {
    fit = fitCurve(analysis, { compareModels, maxEvaluations });
  } catch (err) {
    rows.push({ regime: truthRegime(truth.rateRatio), regimeRight: false, ecWithin: false, ratioWithin: false, status: "no levels", chi: NaN, z: NaN, evaluations: 0, stoppedBy: null, ms: performance.now() - t0, cpuMs: cpuSince(c0) });
    fold(`${seed}|no levels;`);
    continue;
  }
  const ms = performance.now() - t0;
  const cpuMs = cpuSince(c0);
  fold(`${seed}|${fit.hypothesis}|${fit.status}|${fit.chargingEnergyEV.value.toPrecision(17)}|${fit.rateRatio.value.toPrecision(17)}|${fit.reducedChiSquare.toPrecision(17)};`);
  const regime = truthRegime(truth.rateRatio);
  const usable = fit.status !== "failed";
  const row = {
    regime,
    regimeRight: usable && fit.regime === regime,
    ecWithin: usable && Math.abs(fit.chargingEnergyEV.value - truth.chargingEnergyEV) <= 0.03 * truth.chargingEnergyEV,
    ratioWithin: usable && Math.abs(Math.log(fit.rateRatio.value / truth.rateRatio)) <= Math.log(1.5),
    status: fit.status,
    chi: fit.reducedChiSquare,
    z: fit.residualStructure.largestZ,
    evaluations: fit.work.evaluations,
    stoppedBy: fit.work.stoppedBy,
    ms,
    cpuMs,
  };
  rows.push(row);
  if (verbose && (!(row.regimeRight && row.ecWithin && row.ratioWithin) || fit.status !== "good")) {
    console.log(
      `seed ${seed} r=${truth.rateRatio.toFixed(3)} Ec=${(truth.chargingEnergyEV * 1e3).toFixed(0)}meV η=${truth.eta.toFixed(2)} split=${truth.pSubgroups.join("+")} rules=${analysis.assignment.regime}: ` +
        `${fit.status} ${fit.hypothesis} → ${fit.regime}, Ec ${(fit.chargingEnergyEV.value * 1e3).toFixed(1)} meV, r ${fit.rateRatio.value.toPrecision(3)}, χ²_red ${fit.reducedChiSquare.toPrecision(3)}, residual structure ${fit.residualStructure.largestZ.toFixed(1)} σ, ${ms.toFixed(0)} ms` +
        (fit.status === "good" ? "" : ` (${fit.statusReasons.join("; ")})`),
    );
  }
}
const pct = (k: number, n: number) => `${k}/${n} (${n ? ((100 * k) / n).toFixed(0) : "—"} %)`;
const lines: string[] = [];
for (const regime of ["shell-tunneling", "intermediate", "shell-filling", "all"]) {
  const set = regime === "all" ? rows : rows.filter((r) => r.regime === regime);
  if (!set.length) continue;
  const all = set.filter((r) => r.regimeRight && r.ecWithin && r.ratioWithin).length;
  const statuses = ["good", "poor", "failed"].map((s) => `${s} ${set.filter((r) => r.status === s).length}`).join(", ");
  lines.push(
    `${regime.padEnd(16)} ${String(set.length).padStart(3)} fits: regime right ${pct(set.filter((r) => r.regimeRight).length, set.length)}, Ec within 3 % ${pct(set.filter((r) => r.ecWithin).length, set.length)}, ` +
      `Γtip/Γsub within ×1.5 ${pct(set.filter((r) => r.ratioWithin).length, set.length)}, all three ${pct(all, set.length)}; ${statuses}`,
  );
}
// Reduced χ² reached by the fits that got all three right, and by the rest: where the status
// limits of fitStatus should fall on noise-calibrated simulated curves.
const chiQuantiles = (set: Row[], key: "chi" | "z" = "chi") => {
  const c = set.map((r) => r[key]).filter(Number.isFinite).sort((a, b) => a - b);
  const at = (p: number) => (c.length ? c[Math.min(c.length - 1, Math.floor(p * c.length))].toPrecision(3) : "—");
  return `${c.length} fits, median ${at(0.5)}, 90th pct ${at(0.9)}, max ${c.length ? c[c.length - 1].toPrecision(3) : "—"}`;
};
const right = (r: Row) => r.regimeRight && r.ecWithin && r.ratioWithin;
lines.push(`reduced χ², all three right: ${chiQuantiles(rows.filter(right))}; the rest: ${chiQuantiles(rows.filter((r) => !right(r)))}`);
lines.push(`residual structure (σ), all three right: ${chiQuantiles(rows.filter(right), "z")}; the rest: ${chiQuantiles(rows.filter((r) => !right(r)), "z")}`);
const statusesOf = (set: Row[]) => ["good", "poor", "failed"].map((s) => `${s} ${set.filter((r) => r.status === s).length}`).join(", ");
lines.push(`status, all three right: ${statusesOf(rows.filter(right))}; the rest: ${statusesOf(rows.filter((r) => !right(r)))}`);
const work = rows.map((r) => r.evaluations).sort((a, b) => a - b);
const qw = (p: number) => work[Math.min(work.length - 1, Math.floor(p * work.length))];
lines.push(
  `model evaluations per fit (the work budget counts them): median ${qw(0.5)}, 90th percentile ${qw(0.9)}, 99th percentile ${qw(0.99)}, max ${work[work.length - 1]}; ` +
    `budget ${maxEvaluations ?? FIT_DEFAULTS.maxEvaluations}, cut short by it ${rows.filter((r) => r.stoppedBy === "budget").length}, by a time limit ${rows.filter((r) => r.stoppedBy === "time").length}`,
);
const times = rows.map((r) => r.ms).sort((a, b) => a - b);
const q = (p: number) => times[Math.min(times.length - 1, Math.floor(p * times.length))];
const cpu = rows.map((r) => r.cpuMs).sort((a, b) => a - b);
const qc = (p: number) => cpu[Math.min(cpu.length - 1, Math.floor(p * cpu.length))];
lines.push(
  `time per fit: median ${q(0.5).toFixed(0)} ms, 90th percentile ${q(0.9).toFixed(0)} ms, max ${times[times.length - 1].toFixed(0)} ms (CPU time: median ${qc(0.5).toFixed(0)} ms, 90th percentile ${qc(0.9).toFixed(0)} ms); load average ${loadavg().map((x) => x.toFixed(1)).join(", ")}`,
);
lines.push(
  `Γtip/Γsub ${ratioRange[0]}–${ratioRange[1]} (log-uniform), ${compareModels ? "--compare-models" : "default comparison (only where the rules are not decisive)"}, ${method} simulation, seeds ${firstSeed}…${firstSeed + count - 1}, ${((performance.now() - started) / 1000).toFixed(1)} s; results digest ${digest.toString(16).padStart(8, "0")}`,
);
console.log(lines.join("\n"));
