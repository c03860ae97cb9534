/**
 * Random scenarios with known truth, for the accuracy benchmark and round-trip tests: a dot
 * with an s level, a p level (split or not) and two valence levels, in a chosen regime.
 */
import { seededRandom } from "../util/random.ts";
import { GAUSSIAN_FWHM_PER_SIGMA } from "../util/constants.ts";
import type { Level, Scenario } from "./scenario.ts";
import { REGIME_LIMITS } from "./regimeLimits.ts";
import { currentSteps, type DotModel } from "./bandCurrent.ts";

/** The regime of a synthetic spectrum: shell filling (Γtip/Γsub ≫ 1), shell tunnelling (Γtip/Γsub ≪ 1) or in between. */
export type SyntheticRegime = "shell-filling" | "shell-tunneling" | "intermediate";

/** Ranges the spectra are drawn from (uniform unless said otherwise). */
export interface SyntheticRanges {
  /** Charging energy, eV. Default: SYNTHETIC_DEFAULTS.chargingEnergyEV ([0.06, 0.2]). */
  chargingEnergyEV: [number, number];
  /** Voltage-division factor η. Default: SYNTHETIC_DEFAULTS.eta ([0.65, 0.95]). */
  eta: [number, number];
  /**
   * dI/dV peak FWHM in bias, V (capped so neighbouring peaks stay resolvable, see `resolvability`).
   * Default: SYNTHETIC_DEFAULTS.peakFwhmV ([0.02, 0.1]).
   */
  peakFwhmV: [number, number];
  /** Noise, fraction of full-scale current. Default: SYNTHETIC_DEFAULTS.noiseRelative ([0.002, 0.01]). */
  noiseRelative: [number, number];
  /** s–p level spacing, eV. Default: SYNTHETIC_DEFAULTS.levelSpacingSPEV ([0.15, 0.45]). */
  levelSpacingSPEV: [number, number];
  /** Splitting between p sub-levels when split, eV. Default: SYNTHETIC_DEFAULTS.pSplittingEV ([0.04, 0.1]). */
  pSplittingEV: [number, number];
  /** Probability that p is split (half 2+4, half 2+2+2). Default: SYNTHETIC_DEFAULTS.pSplitProbability (0.5). */
  pSplitProbability: number;
  /** Single-particle gap ε_s − ε_v1, eV. Default: SYNTHETIC_DEFAULTS.singleParticleGapEV ([1.6, 2.4]). */
  singleParticleGapEV: [number, number];
  /**
   * Γtip/Γsub per regime (log-uniform). Default: SYNTHETIC_DEFAULTS.rateRatio (filling [5, 50],
   * tunnelling [0.002, 0.03], intermediate between the {@link REGIME_LIMITS} boundaries, 3/7–1.5).
   */
  rateRatio: Record<SyntheticRegime, [number, number]>;
  /**
   * The FWHM is at most this fraction of the smallest peak spacing in bias.
   * Default: SYNTHETIC_DEFAULTS.resolvability (0.7).
   */
  resolvability: number;
  /**
   * Second-junction resonances (levels crossing the substrate's Fermi level, at |V| = E/(1 − η)
   * for an addition energy E) inside the bias window: "redraw" rejects such draws and draws
   * again; "keep" keeps them and lists them in `SyntheticTruth.secondJunctionPeaksV`.
   * Default: SYNTHETIC_DEFAULTS.secondJunction ("redraw").
   */
  secondJunction: "redraw" | "keep";
  /**
   * With `secondJunction` "keep": a substrate-junction step is listed as a resonance when its
   * height is at least this fraction of the median tip-junction step.
   * Default: SYNTHETIC_DEFAULTS.secondJunctionStepMin (0.25).
   */
  secondJunctionStepMin: number;
  /** Points per curve. Default: SYNTHETIC_DEFAULTS.points (2000). */
  points: number;
  /** Temperature, K. Default: SYNTHETIC_DEFAULTS.temperatureK (4.5). */
  temperatureK: number;
}

/** The ranges of the accuracy benchmark (frozen; pass a copy with changes to draw elsewhere). */
export const SYNTHETIC_DEFAULTS: Readonly<SyntheticRanges> = Object.freeze({
  chargingEnergyEV: [0.06, 0.2],
  eta: [0.65, 0.95],
  peakFwhmV: [0.02, 0.1],
  noiseRelative: [0.002, 0.01],
  levelSpacingSPEV: [0.15, 0.45],
  pSplittingEV: [0.04, 0.1],
  pSplitProbability: 0.5,
  singleParticleGapEV: [1.6, 2.4],
  // Intermediate spectra lie between the regime boundaries of REGIME_LIMITS.
  rateRatio: { "shell-filling": [5, 50], "shell-tunneling": [0.002, 0.03], intermediate: [REGIME_LIMITS.tunnelingRateRatioMax, REGIME_LIMITS.fillingRateRatioMin] },
  resolvability: 0.7,
  secondJunction: "redraw",
  secondJunctionStepMin: 0.25,
  points: 2000,
  temperatureK: 4.5,
} satisfies SyntheticRanges);

/** What the analysis should find. Bias-referred values in V. */
export interface SyntheticTruth {
  /**
   * The regime of the drawn rate ratio: the one asked for, except that an "intermediate" draw
   * outside the {@link REGIME_LIMITS} boundaries (a wider intermediate range, as in the
   * benchmark's crossover mix) is the regime it lies in; the peak lists follow it.
   */
  regime: SyntheticRegime;
  rateRatio: number;
  eta: number;
  chargingEnergyEV: number;
  levelSpacingSPEV: number;
  /** First CB peak − first VB peak, V. */
  gapV: number;
  /** Expected peak positions (V) of the s and p multiplets in the analysis' convention (one per charging peak in shell filling, one per level in shell tunnelling). */
  sPeaksV: number[];
  pPeaksV: number[];
  /**
   * Expected VB peak positions (V, negative), from the gap edge outward, in the same convention:
   * one per charging step in shell filling (v1: 2, v2: 4), one per level in shell tunnelling.
   */
  valencePeaksV: number[];
  /**
   * Expected second-junction resonances inside the bias window (V, signed; CB levels at negative
   * bias, VB levels at positive), ordered by |bias|: V = ∓E/(1 − η) for the addition energies E
   * whose substrate-junction step the model shows (see note 5). Empty when `secondJunction` is
   * "redraw".
   */
  secondJunctionPeaksV: number[];
  pSubgroups: number[];
  peakFwhmV: number;
  noiseRelative: number;
}

/**
 * Draws one scenario with known truth from a seed: a dot with an s level, a p level (whole or
 * split) and two valence levels, in a chosen regime.
 *
 * Parameters
 * ----------
 * seed : number
 *     Integer seed: the same seed, regime and ranges give the same scenario.
 * regime : SyntheticRegime
 *     "shell-filling", "shell-tunneling" or "intermediate": sets the range of Γtip/Γsub.
 * ranges : SyntheticRanges, optional
 *     The ranges drawn from. Default: {@link SYNTHETIC_DEFAULTS}.
 *
 * Returns
 * -------
 * { scenario: Scenario; truth: SyntheticTruth }
 *     A complete scenario (with noise) and what the analysis should find: regime, rate ratio,
 *     η, Ec (eV), Δsp (eV), the gap and the expected s and p peak positions (V), the p
 *     sub-groups, the peak FWHM (V) and the noise.
 *
 * Throws
 * ------
 * Nothing: the ranges are trusted (a range that never gives a valid draw would loop).
 *
 * Notes
 * -----
 * 1. Draw Ec, η, Δsp, the single-particle gap, the noise (uniform) and Γtip/Γsub (log-uniform);
 *    p whole (6) or split (2+4 or 2+2+2, probability pSplitProbability) with a sub-level spacing;
 *    ε_s at 40–60 % of the single-particle gap above the Fermi level; a second VB level 0.12–0.3 eV below the first.
 * 2. Expected peaks: in shell filling one per charging step, V = (ε + Ec·(N + ½))/η; in shell
 *    tunnelling one per level, V = (ε + Ec/2)/η.
 * 3. The FWHM is drawn, then capped at `resolvability` × the smallest spacing of expected peaks;
 *    the broadening in energy is FWHM/2√(2 ln 2)·η (the thermal width is neglected).
 * 4. The bias window covers every expected peak by 4 FWHM + 50 mV. With `secondJunction`
 *    "redraw", a draw whose substrate-junction resonances (at −(ε_s + Ec/2)/(1 − η) and
 *    (|ε_v1| + Ec/2)/(1 − η)) fall within 3 FWHM of the window is rejected and drawn again from
 *    the same generator.
 * 5. Second-junction resonances (`secondJunction` "keep"): a carrier entering through the
 *    substrate junction at addition energy E (E = ε + Ec·(N + ½), the ladder of lib/model/ladder.ts)
 *    gives a step at V = −E/(1 − η) for the CB and +E/(1 − η) for the VB. Through the substrate the
 *    roles of the junctions swap (rate ratio 1/r): the substrate side of a shell-filling dot shows
 *    mainly one step per level (E = ε + Ec/2), that of a shell-tunnelling dot its charging ladder.
 *    The steps are taken from the model itself (`currentSteps`, one band at a time): those on the
 *    substrate side, within the window by 2 FWHM, at least `secondJunctionStepMin` × the median
 *    tip-side step high, are listed.
 *
 * Example
 * -------
 * ```ts
 * const { scenario, truth } = syntheticSpectrum(1, "shell-filling");
 * truth.sPeaksV;        // => [0.921, 0.994] (V: the s doublet)
 * truth.pSubgroups;     // => [2, 4]
 * scenario.cb.length;   // => 3 (s and p split in two)
 * ```
 */
export function syntheticSpectrum(seed: number, regime: SyntheticRegime, ranges: SyntheticRanges = SYNTHETIC_DEFAULTS): { scenario: Scenario; truth: SyntheticTruth } {
  const rng = seededRandom(seed * 7919 + 17);
  for (let attempt = 1; ; attempt++) {
    const drawn = draw(rng, seed, regime, ranges, attempt);
    if (drawn) return drawn;
  }
}

/** One draw, or null when a second-junction resonance would fall inside the bias window. */
function draw(rng: ReturnType<typeof seededRandom>, seed: number, regime: SyntheticRegime, ranges: SyntheticRanges, attempt: number): { scenario: Scenario; truth: SyntheticTruth } | null {
  const u = ([a, b]: [number, number]) => a + (b - a) * rng.uniform();
  const logU = ([a, b]: [number, number]) => Math.exp(Math.log(a) + (Math.log(b) - Math.log(a)) * rng.uniform());
  const ec = u(ranges.chargingEnergyEV);
  const eta = u(ranges.eta);
  const sp = u(ranges.levelSpacingSPEV);
  const gapSP = u(ranges.singleParticleGapEV);
  const r = logU(ranges.rateRatio[regime]);
  const noise = u(ranges.noiseRelative);
  const split = rng.uniform() < ranges.pSplitProbability ? (rng.uniform() < 0.5 ? [2, 4] : [2, 2, 2]) : [6];
  const delta = u(ranges.pSplittingEV);
  const fermiFraction = u([0.4, 0.6]);
  const es = gapSP * fermiFraction;
  const ev1 = es - gapSP;
  const ev2 = ev1 - u([0.12, 0.3]);
  const pLevels: Level[] = split.map((g, k) => ({ energyEV: es + sp + k * delta, degeneracy: g }));
  const cb: Level[] = [{ energyEV: es, degeneracy: 2 }, ...pLevels];
  const vb: Level[] = [
    { energyEV: ev1, degeneracy: 2 },
    { energyEV: ev2, degeneracy: 4 },
  ];
  // Expected peaks in the analysis' convention of the regime drawn (for the widths and the window).
  const { sPeaksV, pPeaksV, vbPeaks } = expectedPeaks(regime !== "shell-tunneling", es, pLevels, ev1, ev2, ec, eta);
  // Smallest spacing between expected main peaks in bias, to keep peaks resolvable.
  const all = [...sPeaksV, ...pPeaksV].sort((a, b) => a - b);
  const vbSorted = [...vbPeaks].sort((a, b) => a - b);
  let minSpacing = Infinity;
  for (const list of [all, vbSorted]) for (let i = 1; i < list.length; i++) minSpacing = Math.min(minSpacing, list[i] - list[i - 1]);
  const fwhm = Math.min(u(ranges.peakFwhmV), ranges.resolvability * minSpacing);
  // Level broadening in energy that gives this FWHM in bias (the thermal width, ≈ 1.7 mV at 4.5 K, adds in quadrature and is neglected).
  const broadeningEV = (fwhm / GAUSSIAN_FWHM_PER_SIGMA) * eta;
  const top = Math.max(...all) + 4 * fwhm + 0.05;
  const bottom = -(Math.max(...vbPeaks) + 4 * fwhm + 0.05);
  // Through the substrate junction the CB opens at −(ε_s + Ec/2)/(1 − η) and the VB at
  // (|ε_v1| + Ec/2)/(1 − η); keep those resonances out of the window (they are not part of the
  // single-junction ladder the criteria describe).
  const cbSecond = -(es + ec / 2) / (1 - eta);
  const vbSecond = (-ev1 + ec / 2) / (1 - eta);
  const keep = ranges.secondJunction === "keep";
  if (!keep && (cbSecond > bottom - 3 * fwhm || vbSecond < top + 3 * fwhm)) return null;
  const model = { cb, vb, chargingEnergyEV: ec, eta, tipRatePerS: r * SUBSTRATE_RATE_PER_S, substrateRatePerS: SUBSTRATE_RATE_PER_S, relaxationRatePerS: relaxationRate(r), temperatureK: ranges.temperatureK };
  const secondJunctionPeaksV = keep ? substrateSteps(model, ranges.secondJunctionStepMin).filter((v) => v > bottom + 2 * fwhm && v < top - 2 * fwhm) : [];
  const stepV = (top - bottom) / (ranges.points - 1);
  const substrateRatePerS = SUBSTRATE_RATE_PER_S;
  const scenario: Scenario = {
    cb,
    vb,
    chargingEnergyEV: ec,
    eta,
    tipRatePerS: r * substrateRatePerS,
    substrateRatePerS,
    temperatureK: ranges.temperatureK,
    broadeningEV,
    relaxationRatePerS: relaxationRate(r),
    lockInVrms: 0,
    bias: { fromV: bottom, toV: bottom + (ranges.points - 1) * stepV, stepV },
    noise: { relative: noise, seed: seed * 100 + attempt },
  };
  // The truth in the convention of the regime the drawn ratio lies in (an "intermediate" draw
  // outside the REGIME_LIMITS boundaries is scored as the regime it is in).
  const truthRegime: SyntheticRegime =
    regime !== "intermediate" ? regime : r >= REGIME_LIMITS.fillingRateRatioMin ? "shell-filling" : r <= REGIME_LIMITS.tunnelingRateRatioMax ? "shell-tunneling" : regime;
  const expected = truthRegime === regime ? { sPeaksV, pPeaksV, vbPeaks } : expectedPeaks(truthRegime === "shell-filling", es, pLevels, ev1, ev2, ec, eta);
  return {
    scenario,
    truth: {
      regime: truthRegime,
      rateRatio: r,
      eta,
      chargingEnergyEV: ec,
      levelSpacingSPEV: sp,
      gapV: expected.sPeaksV[0] + (-ev1 + ec / 2) / eta,
      sPeaksV: expected.sPeaksV,
      pPeaksV: expected.pPeaksV,
      valencePeaksV: [...expected.vbPeaks].sort((a, b) => a - b).map((v) => -v),
      secondJunctionPeaksV,
      pSubgroups: truthRegime === "shell-tunneling" ? split.map(() => 1) : split,
      peakFwhmV: fwhm,
      noiseRelative: noise,
    },
  };
}

/**
 * Expected peak positions (V) in the analysis' convention: one per charging step (`filling`) or one
 * per level: CB s and p from the gap edge, and the VB (|bias|, unsorted) of v1 (2) and v2 (4).
 */
function expectedPeaks(filling: boolean, es: number, pLevels: readonly Level[], ev1: number, ev2: number, ec: number, eta: number): { sPeaksV: number[]; pPeaksV: number[]; vbPeaks: number[] } {
  const sPeaksV = filling ? [(es + ec / 2) / eta, (es + 1.5 * ec) / eta] : [(es + ec / 2) / eta];
  const pPeaksV: number[] = [];
  if (!filling) for (const l of pLevels) pPeaksV.push((l.energyEV + ec / 2) / eta);
  else {
    let n = 2;
    for (const l of pLevels) for (let k = 0; k < l.degeneracy; k++, n++) pPeaksV.push((l.energyEV + ec * (n + 0.5)) / eta);
  }
  const vbPeaks = filling
    ? [(-ev1 + ec / 2) / eta, (-ev1 + 1.5 * ec) / eta, ...[2, 3, 4, 5].map((n) => (-ev2 + ec * (n + 0.5)) / eta)]
    : [(-ev1 + ec / 2) / eta, (-ev2 + ec / 2) / eta];
  return { sPeaksV, pPeaksV, vbPeaks };
}

/** Tunnelling rate through the substrate junction, 1/s (the tip's is r times it). */
const SUBSTRATE_RATE_PER_S = 1e8;

/** In-dot relaxation: 1000 × the faster tunnelling rate, 1/s. */
function relaxationRate(rateRatio: number): number {
  return 1000 * Math.max(rateRatio, 1) * SUBSTRATE_RATE_PER_S;
}

/**
 * Biases (V, ordered by |bias|) of the substrate-junction steps of the model (CB steps at
 * negative bias, VB steps at positive) at least `fraction` × the median tip-junction step high.
 */
function substrateSteps(model: DotModel, fraction: number): number[] {
  const cb = model.cb.length ? currentSteps({ ...model, vb: [] }).steps : [];
  const vb = model.vb.length ? currentSteps({ ...model, cb: [] }).steps : [];
  const substrate = [...cb.filter((s) => s.biasV < 0), ...vb.filter((s) => s.biasV > 0)];
  const tip = [...cb.filter((s) => s.biasV > 0), ...vb.filter((s) => s.biasV < 0)].map((s) => Math.abs(s.heightA)).sort((a, b) => a - b);
  const typical = tip.length ? tip[tip.length >> 1] : 0;
  return substrate.filter((s) => Math.abs(s.heightA) >= fraction * typical).map((s) => s.biasV).sort((a, b) => Math.abs(a) - Math.abs(b));
}
