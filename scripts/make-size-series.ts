/**
 * Makes the invented demo size series in sample-curves/series/ from its parameter file,
 * sample-curves/series/parameters.json:
 *
 *   npm run samples:series
 *
 * Every curve is invented: a made-up batch of InP dots on gold at 4.5 K, simulated with the
 * project's orthodox-theory model (lib/model) from levels of the effective-mass sphere model of
 * the material (lib/sizes/sphereLevels) and a charging energy e²/(4πε₀·ε_eff·R)
 * (lib/sizes/chargingEnergy). Nothing here is a measurement.
 *
 * The functions that turn a radius into a model dot ({@link seriesDotLevels},
 * {@link seriesDotScenario}) are exported for the size-series benchmark and the tests, which
 * build their own series from known parameters the same way.
 */
import { readFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import {
  BRUS_DEFAULTS,
  COULOMB_EV_NM,
  brusGap,
  chargingEnergyEV,
  resolveMaterial,
  simulateCurve,
  sphereLevelEV,
  writeTextFile,
  type Material,
} from "../lib/index.ts";

/** How radii become model dots: the material, the wall model and the electrostatics. */
export interface SeriesModel {
  material: Material;
  /** Sphere model of the levels: "infinite" or "finite" wall (the material's barrier). */
  wall: "infinite" | "finite";
  /** Use the material's non-parabolicity (true) or parabolic bands (false). */
  nonParabolic: boolean;
  /** Effective dielectric constant of the charging energy Ec = e²/(4πε₀·ε_eff·R). */
  chargingDielectricConstant: number;
  /** Constant added to Ec, eV (0 for a pure 1/R law). */
  chargingOffsetEV: number;
  /** Height of the bulk conduction-band edge above the electrodes' Fermi level, eV. */
  conductionEdgeEV: number;
}

/** The levels of one model dot (energies relative to the Fermi level at zero bias, eV). */
export interface SeriesDotLevels {
  /** 1S and 1P of the electron (g = 2 and 6). */
  cb: { energyEV: number; degeneracy: number }[];
  /** 1S and 1P of the hole (g = 2 and 4; the hole degeneracy is a modelling choice). */
  vb: { energyEV: number; degeneracy: number }[];
  chargingEnergyEV: number;
  /** The true quantities the analysis should find, eV. */
  truth: { singleParticleGapEV: number; levelSpacingSPEV: number; valenceSpacing1EV: number; gapEV: number };
}

/** Levels of a dot of radius R under `model`. */
export function seriesDotLevels(radiusNM: number, model: SeriesModel): SeriesDotLevels {
  const m = model.material;
  const opts = {
    wall: model.wall,
    nonParabolicityPerEV: model.nonParabolic ? m.nonParabolicityPerEV : 0,
    ...(model.wall === "finite" ? { barrierEV: m.barrierEV, barrierMassE: m.barrierMassE } : {}),
  };
  const level = (mass: number, l: number) => {
    const e = sphereLevelEV(radiusNM, mass, { ...opts, l });
    if (e === null) throw new Error(`no bound ${l === 0 ? "S" : "P"} level at R = ${radiusNM} nm`);
    return e;
  };
  const e1s = level(m.electronMassE, 0);
  const e1p = level(m.electronMassE, 1);
  const h1s = level(m.holeMassE, 0);
  const h1p = level(m.holeMassE, 1);
  const cbEdge = model.conductionEdgeEV;
  const vbEdge = cbEdge - m.bandGapEV;
  const ec = chargingEnergyEV(radiusNM, { dielectricConstant: model.chargingDielectricConstant, offsetEV: model.chargingOffsetEV });
  const singleParticleGapEV = m.bandGapEV + e1s + h1s;
  return {
    cb: [
      { energyEV: cbEdge + e1s, degeneracy: 2 },
      { energyEV: cbEdge + e1p, degeneracy: 6 },
    ],
    vb: [
      { energyEV: vbEdge - h1s, degeneracy: 2 },
      { energyEV: vbEdge - h1p, degeneracy: 4 },
    ],
    chargingEnergyEV: ec,
    truth: { singleParticleGapEV, levelSpacingSPEV: e1p - e1s, valenceSpacing1EV: h1p - h1s, gapEV: singleParticleGapEV + ec },
  };
}

/** Junction and sweep of one model curve. */
export interface SeriesCurveSpec {
  radiusNM: number;
  eta: number;
  /** Shell filling (Γtip/Γsub = 15) or shell tunnelling (Γtip/Γsub = 0.01). */
  regime: "filling" | "tunneling";
  /** Points of the sweep (the bias window is set from the levels). */
  points: number;
  /** Noise, fraction of the full-scale current. */
  noiseRelative: number;
  seed: number;
  /** Level broadening (Gaussian σ), eV. */
  broadeningEV: number;
}

/** The model scenario (the `dotspec simulate --config` keys) of one curve of the series. */
export function seriesDotScenario(spec: SeriesCurveSpec, model: SeriesModel, description: string) {
  const dot = seriesDotLevels(spec.radiusNM, model);
  const ec = dot.chargingEnergyEV;
  const top = (dot.cb[1].energyEV + ec * 6.5) / spec.eta + 0.25;
  const bottom = -(Math.abs(dot.vb[1].energyEV) + ec * 4) / spec.eta - 0.25;
  const stepV = Number(((top - bottom) / (spec.points - 1)).toPrecision(6));
  return {
    description,
    cb: dot.cb,
    vb: dot.vb,
    chargingEnergyEV: ec,
    eta: spec.eta,
    tipRatePerS: spec.regime === "filling" ? 1.5e9 : 1e7,
    substrateRatePerS: spec.regime === "filling" ? 1e8 : 1e9,
    temperatureK: 4.5,
    broadeningEV: spec.broadeningEV,
    bias: { fromV: Number(bottom.toFixed(4)), toV: Number((bottom + stepV * (spec.points - 1)).toFixed(6)), stepV },
    noise: { relative: spec.noiseRelative, seed: spec.seed },
  };
}

/** The parameter file of the demo series (sample-curves/series/parameters.json). */
interface SeriesParameters {
  note: string;
  batch: string;
  material: string;
  model: Omit<SeriesModel, "material">;
  points: number;
  noiseRelative: number;
  broadeningEV: number;
  dots: {
    dot: string;
    radiusNM: number;
    eta: number;
    regime: "filling" | "tunneling";
    curves: number;
    /** Curves listed in META.csv (default all); the others are in the folder without a size. */
    unsized?: number[];
    /** Curves (1-based) simulated with another η than the metadata states (a tip change), to show the outlier rule. */
    tipChange?: { curve: number; eta: number };
  }[];
  optical: { radiiNM: number[]; noiseEV: number; seed: number };
}

const g = (v: number, digits = 6) => Number(v.toPrecision(digits)).toString();

function main(): void {
  const root = join(dirname(fileURLToPath(import.meta.url)), "..", "sample-curves", "series");
  const p = JSON.parse(readFileSync(join(root, "parameters.json"), "utf8")) as SeriesParameters;
  const material = resolveMaterial(p.material);
  const model: SeriesModel = { material, ...p.model };
  const meta: string[] = ["# Invented demo data (not measurements): the size table of batch " + p.batch, "file,dot,radius_nm,eta,notes"];
  let seed = 101;
  let files = 0;
  for (const d of p.dots) {
    for (let k = 1; k <= d.curves; k++) {
      const file = `${d.dot.toLowerCase()}-${k}.csv`;
      const simulatedEta = d.tipChange?.curve === k ? d.tipChange.eta : d.eta;
      const scenario = seriesDotScenario(
        { radiusNM: d.radiusNM, eta: simulatedEta, regime: d.regime, points: p.points, noiseRelative: p.noiseRelative, seed: seed++, broadeningEV: p.broadeningEV },
        model,
        `Invented demo dot ${d.dot} (batch ${p.batch}, radius ${d.radiusNM} nm), curve ${k}: not a measurement`,
      );
      const sim = simulateCurve(scenario, { method: "exact", conductance: false });
      const unsized = d.unsized?.includes(k) === true;
      const lines = [
        `# dot: ${d.dot}`,
        `# batch: ${p.batch} (invented demo data)`,
        `# material: ${p.material} on Au(111)`,
        ...(unsized ? [] : [`# radius_nm: ${d.radiusNM}`]),
        `# eta: ${d.eta}`,
        `# temperature_K: 4.5`,
        `# curve: ${k} of ${d.curves}`,
        "bias (V),current (nA)",
      ];
      for (let i = 0; i < sim.biasV.length; i++) lines.push(`${g(sim.biasV[i], 7)},${g(sim.currentA[i] * 1e9)}`);
      writeTextFile(join(root, "curves", file), lines.join("\n") + "\n");
      files++;
      if (!unsized) meta.push(`${file},${d.dot},${d.radiusNM},${d.eta},${d.tipChange?.curve === k ? "invented tip change before this curve" : ""}`);
    }
  }
  writeTextFile(join(root, "META.csv"), meta.join("\n") + "\n");

  // The invented optical table: 1S_h–1S_e and 1P_h–1P_e transitions less the electron–hole
  // Coulomb term 1.786·e²/(4πε₀·ε·R) of the material's ε, with a little seeded scatter.
  let state = p.optical.seed >>> 0;
  const uniform = () => ((state = (Math.imul(state, 1664525) + 1013904223) >>> 0) / 2 ** 32) * 2 - 1;
  const optical = ["# Invented demo data (not measurements): ensemble absorption peaks of batch " + p.batch, "radius_nm,peak_ev_1,peak_ev_2"];
  for (const r of p.optical.radiiNM) {
    const lv = seriesDotLevels(r, model);
    const jeh = (BRUS_DEFAULTS.coulombCoefficient * COULOMB_EV_NM) / (material.dielectricConstant * r);
    const p1 = lv.cb[0].energyEV - lv.vb[0].energyEV - jeh + p.optical.noiseEV * uniform();
    const p2 = lv.cb[1].energyEV - lv.vb[1].energyEV - jeh + p.optical.noiseEV * uniform();
    optical.push(`${r},${p1.toFixed(3)},${p2.toFixed(3)}`);
  }
  writeTextFile(join(root, "optical.csv"), optical.join("\n") + "\n");
  console.log(`${files} curves in sample-curves/series/curves, META.csv, optical.csv (${p.optical.radiiNM.length} sizes)`);
  console.log(`for comparison, the Brus optical gap of ${p.material} at R = 2 nm: ${brusGap(2, material).gapEV.toFixed(3)} eV`);
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) main();
