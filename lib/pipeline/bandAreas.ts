/**
 * The current steps of a curve's peaks by band: a Gaussian decomposition of each band's
 * conductance with the width of its gap-edge peak.
 */
import type { Peak } from "../peaks/findPeaks.ts";
import { peakAreas } from "../peaks/peakAreas.ts";
import { median } from "../signal/noise.ts";

/**
 * The current step of each peak from a Gaussian decomposition of its band (findPeaks' own
 * estimate where the decomposition gives nothing), and the common widths used; the peaks are
 * not modified.
 */
export function bandAreas(biasV: Float64Array, didvS: Float64Array, peaks: readonly Peak[]): { stepsA: number[]; widthsV: { CB: number | null; VB: number | null } } {
  const widthsV: { CB: number | null; VB: number | null } = { CB: null, VB: null };
  const stepsA = peaks.map((p) => p.stepA);
  for (const band of ["CB", "VB"] as const) {
    const members = peaks.map((p, k) => [p, k] as const).filter(([p]) => (band === "CB" ? p.biasV > 0 : p.biasV < 0));
    if (!members.length) continue;
    const edge = band === "CB" ? members[0][0] : members[members.length - 1][0];
    const fwhm = gapSideFwhm(biasV, didvS, edge) ?? median(members.map(([p]) => p.fwhmV));
    widthsV[band] = fwhm;
    const areas = peakAreas(biasV, didvS, members.map(([p]) => p.biasV), { fwhmV: fwhm });
    if (!areas.amplitudesS.some((a) => a > 0)) continue;
    members.forEach(([, k], i) => (stepsA[k] = areas.areasA[i]));
  }
  return { stepsA, widthsV };
}
/** Twice the half width at half maximum of a peak on its side facing 0 V (above the gap floor), V; null if not reached. */
export function gapSideFwhm(biasV: Float64Array, didvS: Float64Array, peak: Peak): number | null {
  const dir = peak.biasV > 0 ? -1 : 1;
  let floor = didvS[peak.index];
  for (let i = peak.index; i >= 0 && i < biasV.length && (dir < 0 ? biasV[i] >= 0 : biasV[i] <= 0); i += dir) floor = Math.min(floor, didvS[i]);
  const half = floor + (peak.heightS - floor) / 2;
  for (let i = peak.index; i + dir >= 0 && i + dir < biasV.length; i += dir) {
    const j = i + dir;
    if (didvS[j] <= half) {
      const x = biasV[i] + ((half - didvS[i]) / (didvS[j] - didvS[i])) * (biasV[j] - biasV[i]);
      return 2 * Math.abs(peak.biasV - x);
    }
    if (dir < 0 ? biasV[j] < 0 : biasV[j] > 0) break;
  }
  return null;
}
