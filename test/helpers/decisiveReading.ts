/**
 * Peak lists for the tests of lib/assign/decisive/: closed-form peak positions of orthodox theory,
 * (ε + Ec·(n + ½))/η, read by the real rules (assignSpectrum).
 * ε_s = 0.5, ε_p = 0.8 (CB), ε_v1 = −0.6 (g 2), ε_v2 = −0.8 (g 4) eV; Ec = 0.1 eV; η = 0.8.
 */
import { assignSpectrum } from "../../lib/assign/assignSpectrum.ts";
import type { Peak } from "../../lib/peaks/findPeaks.ts";
import { assignPeak } from "./assignPeak.ts";

export const eta = 0.8, ec = 0.1;
export const ecV = ec / eta;
export const sV = [0.5 + 0.05, 0.5 + 0.15].map((e) => e / eta);
export const pV = [2, 3, 4, 5, 6, 7].map((n) => (0.8 + ec * (n + 0.5)) / eta);
export const vbV = [0.6 + 0.05, 0.6 + 0.15, ...[2, 3, 4, 5].map((n) => 0.8 + ec * (n + 0.5))].map((e) => -e / eta);
/** The two VB levels deep in shell tunnelling: one peak each at (|ε| + Ec/2)/η. */
export const vbTunnelingV = [0.6, 0.8].map((e) => -(e + ec / 2) / eta);

/** These CB peaks with the VB's, sorted, and the rules' assignment of them. */
export function reading(cbPeaks: Peak[], valenceV: readonly number[] = vbV) {
  const peaks = [...valenceV.map((v) => assignPeak(v)), ...cbPeaks].sort((a, b) => a.biasV - b.biasV);
  return { peaks, assignment: assignSpectrum(peaks, { eta, secondJunction: false }) };
}
