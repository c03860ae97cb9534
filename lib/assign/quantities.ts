/**
 * The numbers users tabulate (gap, single-particle gap, level spacings, valence spacings) with
 * their uncertainties, from the grouped peaks and the charging energy.
 */
import type { BandPeak } from "./bandPeaks.ts";
import type { Regime } from "./regime.ts";

/** The numbers users tabulate, bias-referred (V); null where the regime does not define them. */
export interface SpectrumQuantities {
  /** First CB peak − first VB peak, V. */
  gapV: number | null;
  /** Charging (addition) energy Ec in bias: mean spacing inside the CB multiplets, V. */
  chargingEnergyV: number | null;
  /** gap − Ec, V (shell filling only). */
  singleParticleGapV: number | null;
  /** s–p spacing in bias, V: (first p − last s) − Ec in shell filling, p − s in shell tunnelling. */
  levelSpacingSPV: number | null;
  /** p–d spacing in bias when a d shell is seen, V. */
  levelSpacingPDV: number | null;
  /** Jumps between successive VB groups (less Ec in shell filling), V, from the gap edge outward. */
  valenceSpacingsV: number[];
}

/** 1σ uncertainties of {@link SpectrumQuantities}, same keys, V. */
export type SpectrumUncertainties = { [K in keyof SpectrumQuantities]: SpectrumQuantities[K] };

/** What {@link spectrumQuantities} reads: the grouped peaks and Ec. */
export interface QuantityInputs {
  regime: Regime;
  /** CB peaks used for the gap (the first is the gap edge), from the gap edge outward. */
  cb: readonly BandPeak[];
  /** VB main peaks, from the gap edge outward. */
  vb: readonly BandPeak[];
  /** Per CB shell (s, p, d, …) its sub-groups of peaks. */
  cbGroups: readonly (readonly BandPeak[][])[];
  /** VB groups, from the gap edge outward. */
  vbGroups: readonly BandPeak[][];
  /** Ec in bias, V, or null (not measured). */
  chargingEnergyV: number | null;
  /** Standard error of Ec, V, or null. */
  chargingEnergySEV: number | null;
}

/**
 * Compute the bias-referred quantities and their 1σ uncertainties.
 *
 * Parameters
 * ----------
 * inputs : QuantityInputs
 *     Regime, peaks (positions `peak.biasV` and 1σ `peak.biasUncertaintyV` in V, `x` = |bias|),
 *     groups, and Ec with its standard error (V).
 * warnings : string[]
 *     Receives a warning when a band has no peak (the gap is then not defined).
 *
 * Returns
 * -------
 * { quantities: SpectrumQuantities; uncertainties: SpectrumUncertainties }
 *     All in V of bias; null where the regime or the peaks do not define a value.
 *
 * Notes
 * -----
 * 1. gap = first CB − first VB peak (|x| summed).
 * 2. single-particle gap = gap − Ec (when Ec is measured).
 * 3. Δsp: shell filling (first p − last s) − Ec; otherwise p − s (first peaks). Δpd the same with
 *    p and d.
 * 4. VB spacing = first peak of the next group − last peak of the previous, less Ec in shell
 *    filling with a measured Ec.
 * 5. Uncertainties: the peak-position uncertainties in quadrature (correlations neglected) and
 *    the standard error of Ec wherever Ec enters.
 *
 * References
 * ----------
 * Propagation in quadrature: JCGM 100:2008, Evaluation of measurement data — Guide to the
 * expression of uncertainty in measurement (GUM), §5.1.2. The formulas for the quantities are
 * common practice (no source).
 *
 * Example
 * -------
 * ```ts
 * const at = (x: number, biasV: number, index: number) => ({ x, index, peak: { biasV, biasUncertaintyV: 0.001 } as Peak });
 * const s = [at(0.6875, 0.6875, 2), at(0.8125, 0.8125, 3)], p = [at(1.3125, 1.3125, 4)], v = [at(0.8125, -0.8125, 1)];
 * spectrumQuantities({ regime: "shell-filling", cb: [...s, ...p], vb: v, cbGroups: [[s], [p]], vbGroups: [v],
 *   chargingEnergyV: 0.125, chargingEnergySEV: 0 }, []).quantities.levelSpacingSPV;  // => 0.375
 * ```
 */
export function spectrumQuantities(inputs: QuantityInputs, warnings: string[]): { quantities: SpectrumQuantities; uncertainties: SpectrumUncertainties } {
  const { regime, cb, vb, cbGroups, vbGroups, chargingEnergyV: ecV, chargingEnergySEV: ecSE } = inputs;
  const q: SpectrumQuantities = {
    gapV: null,
    chargingEnergyV: ecV,
    singleParticleGapV: null,
    levelSpacingSPV: null,
    levelSpacingPDV: null,
    valenceSpacingsV: [],
  };
  const u: SpectrumUncertainties = {
    gapV: null,
    chargingEnergyV: ecSE,
    singleParticleGapV: null,
    levelSpacingSPV: null,
    levelSpacingPDV: null,
    valenceSpacingsV: [],
  };
  const sig = (p: BandPeak) => p.peak.biasUncertaintyV;
  const firstCB = cb[0];
  const firstVB = vb[0];
  if (firstCB && firstVB) {
    q.gapV = firstCB.x + firstVB.x;
    u.gapV = Math.hypot(sig(firstCB), sig(firstVB));
  } else warnings.push(`no ${firstCB ? "VB" : firstVB ? "CB" : "CB or VB"} peak: the gap between peaks is not defined`);
  const ec = ecV ?? 0;
  const ecVar = (ecSE ?? 0) ** 2;
  if (q.gapV !== null && ecV !== null) {
    q.singleParticleGapV = q.gapV - ecV;
    u.singleParticleGapV = Math.sqrt(u.gapV! ** 2 + ecVar);
  }
  const shellSpacing = (a: number, b: number): [number, number] | null => {
    const lower = cbGroups[a]?.flat();
    const upper = cbGroups[b]?.flat();
    if (!lower?.length || !upper?.length) return null;
    const last = lower[lower.length - 1], first = upper[0];
    if (regime === "shell-filling") return spacingLessCharging(last.x, sig(last), first.x, sig(first), ec, ecSE ?? 0);
    return [first.x - lower[0].x, Math.hypot(sig(first), sig(lower[0]))];
  };
  const sp = shellSpacing(0, 1);
  if (sp) [q.levelSpacingSPV, u.levelSpacingSPV] = sp;
  const pd = shellSpacing(1, 2);
  if (pd) [q.levelSpacingPDV, u.levelSpacingPDV] = pd;
  for (let i = 1; i < vbGroups.length; i++) {
    const last = vbGroups[i - 1][vbGroups[i - 1].length - 1];
    const first = vbGroups[i][0];
    const filling = regime === "shell-filling" && ecV !== null;
    const [spacingV, sigmaV] = spacingLessCharging(last.x, sig(last), first.x, sig(first), filling ? ec : 0, filling ? ecSE ?? 0 : 0);
    q.valenceSpacingsV.push(spacingV);
    u.valenceSpacingsV.push(sigmaV);
  }
  return { quantities: q, uncertainties: u };
}

/**
 * The spacing of two peaks less the charging energy, with its 1σ uncertainty: (upper − lower) − Ec
 * and √(σ_upper² + σ_lower² + σ_Ec²) (notes 3–5 of {@link spectrumQuantities}; Ec = 0 and σ_Ec = 0
 * where no Ec is taken off).
 *
 * Parameters
 * ----------
 * lowerV, lowerSigmaV : number
 *     |bias| of the lower peak and its 1σ, V.
 * upperV, upperSigmaV : number
 *     |bias| of the upper peak and its 1σ, V.
 * ecV, ecSigmaV : number
 *     Ec in bias and its standard error, V.
 *
 * Returns
 * -------
 * [number, number]
 *     The spacing and its 1σ, V.
 */
export function spacingLessCharging(lowerV: number, lowerSigmaV: number, upperV: number, upperSigmaV: number, ecV: number, ecSigmaV: number): [number, number] {
  return [upperV - lowerV - ecV, Math.sqrt(upperSigmaV ** 2 + lowerSigmaV ** 2 + ecSigmaV ** 2)];
}
