/**
 * Size-series benchmark: a synthetic series made by the project's model from known material
 * parameters, analysed, combined and fitted; prints how well the fits recover the parameters
 * (in units of their standard errors) and how long the job takes.
 *
 *   npm run bench:sizes                      # 100 dots × 2 curves = 200 curves
 *   npm run bench:sizes -- --dots 50 --seed 3
 *
 * The truth: InP's band gap and non-parabolicity, both masses 1.1 × the built-in InP values
 * (so the fitted common mass scale should be 1.1 and the Δsp electron mass 0.088 mₑ), levels of
 * the infinite-wall non-parabolic sphere, Ec = e²/(4πε₀·ε_eff·R) with ε_eff = 6.5, shell
 * filling, η drawn per dot in 0.80–0.92, radii uniform in 1.5–3.0 nm, 600 points per curve,
 * noise 0.3 % of full scale. The fits are given the built-in InP, as a user would.
 *
 * Timed: (1) in this process, reading the 200 files, analyzeCurve on each, and sizeSeries
 * (combination, bins, every model fit); (2) the real command, `dotspec sizes DIR --material InP
 * --json`, as a child process with 1 and 2 worker threads (Node start-up included).
 */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { dirname, join } from "node:path";
import { spawnSync } from "node:child_process";
import { fileURLToPath } from "node:url";
import {
  analysisToJson,
  analyzeCurve,
  etaFromMetadata,
  listCurveFiles,
  readCurveFile,
  resolveMaterial,
  seededRandom,
  simulateCurve,
  sizeFromMetadata,
  sizeSeries,
  writeTextFile,
  type SeriesCurveInput,
} from "../lib/index.ts";
import { seriesDotScenario, type SeriesModel } from "../scripts/make-size-series.ts";

const args = process.argv.slice(2);
const arg = (name: string, fallback: number) => {
  const i = args.indexOf(name);
  return i >= 0 ? Number(args[i + 1]) : fallback;
};
const dots = arg("--dots", 100);
const seed = arg("--seed", 1);
const MASS_SCALE = 1.1;
const EPS_EFF = 6.5;
const nominal = resolveMaterial("InP");
const truthMaterial = resolveMaterial({ base: "InP", electronMassE: nominal.electronMassE * MASS_SCALE, holeMassE: nominal.holeMassE * MASS_SCALE });
const model: SeriesModel = { material: truthMaterial, wall: "infinite", nonParabolic: true, chargingDielectricConstant: EPS_EFF, chargingOffsetEV: 0, conductionEdgeEV: 0.62 };

const bin = join(dirname(fileURLToPath(import.meta.url)), "..", "bin", "dotspec.js");
const dir = mkdtempSync(join(tmpdir(), "dotspec-sizes-bench-"));
try {
  const rng = seededRandom(seed);
  const made = performance.now();
  for (let d = 0; d < dots; d++) {
    const radiusNM = Number((1.5 + 1.5 * rng.uniform()).toFixed(3));
    const eta = Number((0.8 + 0.12 * rng.uniform()).toFixed(3));
    for (let k = 1; k <= 2; k++) {
      const scenario = seriesDotScenario(
        { radiusNM, eta, regime: "filling", points: 600, noiseRelative: 0.003, seed: 1000 * seed + 10 * d + k, broadeningEV: 0.012 },
        model,
        "synthetic benchmark dot",
      );
      const sim = simulateCurve(scenario, { method: "fast", conductance: false });
      const lines = [`# dot: B${d}`, `# radius_nm: ${radiusNM}`, `# eta: ${eta}`, "bias (V),current (A)"];
      for (let i = 0; i < sim.biasV.length; i++) lines.push(`${sim.biasV[i].toPrecision(7)},${sim.currentA[i].toPrecision(7)}`);
      writeTextFile(join(dir, `b${String(d).padStart(3, "0")}-${k}.csv`), lines.join("\n") + "\n");
    }
  }
  console.log(`${2 * dots} curves of 600 points (${dots} dots) written in ${((performance.now() - made) / 1000).toFixed(1)} s\n`);

  // (1) In process: read, analyse, combine and fit.
  const t0 = performance.now();
  const curves: SeriesCurveInput[] = listCurveFiles([dir]).map((file) => {
    const { curve, record } = readCurveFile(file);
    const eta = etaFromMetadata(curve.meta.metadata)!.eta;
    const size = sizeFromMetadata(curve.meta.metadata);
    return { file, dot: size.dot, radiusNM: size.radiusNM, values: analysisToJson(analyzeCurve(curve, { eta }), record) };
  });
  const t1 = performance.now();
  const series = sizeSeries(curves, { material: nominal });
  const t2 = performance.now();
  console.log(`in process: read + analyse ${curves.length} curves ${((t1 - t0) / 1000).toFixed(2)} s, combine + bins + ${series.fits.length} fits ${((t2 - t1) / 1000).toFixed(2)} s, total ${((t2 - t0) / 1000).toFixed(2)} s`);

  // Recovery of the known parameters.
  const rows: [string, string, string, number][] = [
    ["singleParticleGapEV", "sphere-nonparabolic", "massScale", MASS_SCALE],
    ["singleParticleGapEV", "sphere-nonparabolic", "electronMassE", nominal.electronMassE * MASS_SCALE],
    ["singleParticleGapEV", "sphere-nonparabolic", "holeMassE", nominal.holeMassE * MASS_SCALE],
    ["levelSpacingSPEV", "sphere-nonparabolic", "electronMassE", nominal.electronMassE * MASS_SCALE],
    ["chargingEnergyEV", "charging-sphere", "dielectricConstantEff", EPS_EFF],
    ["chargingEnergyEV", "charging-sphere", "offsetEV", 0],
  ];
  console.log("\n| quantity | model | parameter | truth | fitted ± stderr | (fitted − truth)/stderr | χ²_red |");
  console.log("| --- | --- | --- | --- | --- | --- | --- |");
  for (const [quantity, modelName, param, truth] of rows) {
    const fit = series.fits.find((f) => f.quantity === quantity && f.model === modelName);
    if (!fit) {
      console.log(`| ${quantity} | ${modelName} | ${param} | ${truth} | no fit | — | — |`);
      continue;
    }
    const v = fit.params[param];
    const s = fit.stderr[param];
    const z = s ? (v - truth) / s : NaN;
    console.log(`| ${quantity} | ${modelName} | ${param} | ${Number(truth.toPrecision(4))} | ${v.toPrecision(5)} ± ${s === null ? "—" : s.toPrecision(2)} | ${Number.isFinite(z) ? z.toFixed(2) : "—"} | ${fit.reducedChiSquare?.toFixed(2) ?? "—"} |`);
  }
  const flagged = series.dots.reduce((n, d) => n + d.flags.length, 0);
  const regimes = series.dots.filter((d) => d.regime === "shell-filling").length;
  console.log(`\n${series.dots.length} dots, ${regimes} in shell filling, ${flagged} curve flag(s), ${series.unassigned.length} unassigned`);

  // (2) The real command.
  for (const jobs of [1, 2]) {
    const s0 = performance.now();
    const r = spawnSync(process.execPath, [bin, "sizes", dir, "--material", "InP", "--json", "--jobs", String(jobs)], { encoding: "utf8", maxBuffer: 1 << 30 });
    const s = (performance.now() - s0) / 1000;
    console.log(`dotspec sizes ${curves.length} curves --json --jobs ${jobs}: ${s.toFixed(2)} s wall (exit ${r.status})`);
  }
} finally {
  rmSync(dir, { recursive: true, force: true });
}
