/**
 * A peak for the assignment tests: position and step as given, 1σ 1 mV by default, FWHM 40 mV,
 * height and prominence that of a 50 mV-wide step, SNR 20.
 */
import type { Peak } from "../../lib/peaks/findPeaks.ts";

export const assignPeak = (biasV: number, stepA = 1e-11, sigma = 0.001): Peak => ({
  biasV,
  biasUncertaintyV: sigma,
  index: 0,
  heightS: stepA / 0.05,
  prominenceS: stepA / 0.05,
  fwhmV: 0.04,
  stepA,
  snr: 20,
  stepSignificance: 30,
});
