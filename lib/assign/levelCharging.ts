/**
 * Charging peaks of single levels in shell tunnelling near the crossover: a level of g states
 * charges when g·Γtip/Γsub is not small, so its second and later carriers show as peaks one Ec
 * apart. Ec comes from the charging satellite of a band's gap-edge level (and is reported); the
 * peaks it explains are set aside instead of being read as sub-levels.
 */
import { ASSIGN_DEFAULTS } from "./assignDefaults.ts";
import type { BandPeak } from "./bandPeaks.ts";

/**
 * The charging energy (in bias, V) shown by a charging satellite right after a band's first peak.
 *
 * Parameters
 * ----------
 * bands : readonly { main: readonly BandPeak[]; satellites: readonly BandPeak[] }[]
 *     Per band (CB, VB), its main peaks and the weak peaks set aside after them (charging
 *     satellites), each from the gap edge outward (`x` = |bias|, V).
 *
 * Returns
 * -------
 * { chargingEnergyV: number; sigmaV: number } | null
 *     The spacing from the gap-edge peak to its satellite, V (the mean over the bands that show
 *     one), with its 1σ from the two peaks' position uncertainties in quadrature (V); null when no
 *     band shows one.
 *
 * Notes
 * -----
 * 1. In a band, the satellite counts when it lies between the first and second main peaks, at
 *    least `ASSIGN_DEFAULTS.satelliteEvidenceMin` × the first peak's step: the gap-edge level's
 *    second carrier, one Ec above its first (orthodox theory: (ε + 3Ec/2)/η against (ε + Ec/2)/η).
 *
 * Example
 * -------
 * ```ts
 * const at = (x: number, stepA: number, index: number) => ({ x, index, peak: { biasV: x, stepA } as Peak });
 * satelliteChargingEnergy([{ main: [at(1.25, 7e-12, 0), at(1.82, 6e-12, 2)], satellites: [at(1.39, 2e-12, 1)] }]).chargingEnergyV;  // => 0.14
 * ```
 */
export function satelliteChargingEnergy(bands: readonly { main: readonly BandPeak[]; satellites: readonly BandPeak[] }[]): { chargingEnergyV: number; sigmaV: number } | null {
  const found: { d: number; variance: number }[] = [];
  for (const { main, satellites } of bands) {
    if (!main.length) continue;
    const [first, second] = main;
    const sat = satellites.find((p) => p.x > first.x && (!second || p.x < second.x) && p.peak.stepA >= ASSIGN_DEFAULTS.satelliteEvidenceMin * first.peak.stepA);
    if (sat) found.push({ d: sat.x - first.x, variance: (sat.peak.biasUncertaintyV ?? 0) ** 2 + (first.peak.biasUncertaintyV ?? 0) ** 2 });
  }
  if (!found.length) return null;
  const n = found.length;
  return { chargingEnergyV: found.reduce((a, f) => a + f.d, 0) / n, sigmaV: Math.sqrt(found.reduce((a, f) => a + f.variance, 0)) / n };
}

/**
 * Split the levels of shell tunnelling from the charging peaks that follow them one Ec apart.
 *
 * Parameters
 * ----------
 * main : readonly BandPeak[]
 *     The CB main peaks of a shell-tunnelling spectrum, from the gap edge outward.
 * chargingEnergyV : number
 *     Ec in bias, V (from `satelliteChargingEnergy`).
 *
 * Returns
 * -------
 * { levels: BandPeak[]; charging: BandPeak[] }
 *     The peaks taken as levels and those taken as charging peaks of the level before them.
 *
 * Notes
 * -----
 * 1. From the second peak on (s keeps its own satellite rule), a peak within
 *    (1 ± `ASSIGN_DEFAULTS.levelChargingTolerance`)·Ec of the peak before it (level or charging
 *    peak) continues that level's charging ladder.
 * 2. The first peak after s always stays a level (it opens p).
 *
 * Example
 * -------
 * ```ts
 * const at = (x: number, index: number) => ({ x, index, peak: { biasV: x, stepA: 1e-11 } as Peak });
 * // s at 1.26 V, p at 1.82 V with charging peaks every 0.14 V.
 * levelChargingPeaks([1.26, 1.82, 1.96, 2.10].map(at), 0.14).charging.map((p) => p.index);  // => [2, 3]
 * ```
 */
export function levelChargingPeaks(main: readonly BandPeak[], chargingEnergyV: number): { levels: BandPeak[]; charging: BandPeak[] } {
  const tol = ASSIGN_DEFAULTS.levelChargingTolerance;
  const levels: BandPeak[] = [];
  const charging: BandPeak[] = [];
  main.forEach((p, i) => {
    if (i < 2) {
      levels.push(p);
      return;
    }
    const d = p.x - main[i - 1].x;
    (Math.abs(d - chargingEnergyV) <= tol * chargingEnergyV ? charging : levels).push(p);
  });
  return { levels, charging };
}
