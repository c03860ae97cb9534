// assignSpectrum: no peak in two multiplets when the spin-pair stage re-reads a reading whose s
// the rules do not remake. The peak list is a low-η draw's (syntheticSpectrum's low-η mix, start 37,
// simulated by the project's fast model) as the pipeline passed it to assignSpectrum in a variant
// whose short-shell search passes over less around predicted resonances (SHORT_SHELL_DEFAULTS
// resonanceFwhm 0.75 instead of 1; with the defaults the draw does not reach this): the VB's charging doublet reads shell filling and keeps s's
// second peak (2.151 V, its step set by the VB doublet's ratio); the spin-pair stage re-read p as
// six peaks from 2.604 V and, its own rules not keeping that s peak, made s of 1.873 and 2.604 V,
// a peak of p as well. Each peak holds one carrier's addition, so it belongs to one multiplet at
// most (derived: orthodox theory of the charging ladder; the record's peak ↔ multiplet link relies
// on it); s lies below 2.3 V, before p's first peak at 2.604 V (derived from the peak list above).
import { describe, it, expect } from "vitest";
import { assignSpectrum } from "../../lib/assign/assignSpectrum.ts";
import { withMultiplets } from "../../lib/assign/peakMultiplets.ts";
import type { Peak } from "../../lib/peaks/findPeaks.ts";

// biasV, biasUncertaintyV, fwhmV (V), stepA (A), heightS, prominenceS (S), snr, stepSignificance, prominenceStepA (A), sample index
const ROWS: number[][] = [
  [-3.04752, 0.00721371, 0.035972, 1.88161e-11, 3.96109e-10, 6.25693e-10, 7.17102, 9.61789, 2.39585e-11, 6],
  [-2.73247, 0.00393637, 0.0298879, 8.41698e-12, 1.87303e-10, 3.34114e-10, 3.82925, 6.04491, 1.06297e-11, 94],
  [-2.50866, 0.00530405, 0.0809064, 1.08333e-11, 2.87197e-10, 4.68782e-10, 5.37267, 6.26952, 4.03726e-11, 157],
  [-2.27392, 0.0036216, 0.0304481, 1.09649e-11, 3.57474e-10, 5.39316e-10, 6.18105, 7.54372, 1.74798e-11, 215],
  [-2.06123, 0.00471961, 0.0197763, 5.16631e-12, 5.02865e-10, 7.09335e-10, 8.12963, 9.93507, 1.49324e-11, 265],
  [-2.05589, 0.00301266, 0.0183688, 9.26445e-12, 4.20148e-10, 4.37267e-10, 5.01148, 9.56495, 8.54988e-12, 274],
  [-1.56367, 0.00587666, 0.104503, 1.07911e-11, 2.69291e-10, 5.53391e-10, 6.34236, 6.69568, 6.15593e-11, 406],
  [-1.34461, 0.0115113, 0.026969, 9.80477e-12, 2.61675e-10, 4.12828e-10, 4.73139, 6.36927, 1.18513e-11, 453],
  [1.87267, 0.00335623, 0.0462101, 1.15112e-11, 3.60526e-10, 5.78102e-10, 6.62557, 8.67621, 2.84363e-11, 1307],
  [2.15081, 0.00444801, 0.0311993, 0, 4.49479e-10, 6.48508e-10, 7.4325, 8.44154, 2.15374e-11, 1373],
  [2.15378, 0.0043457, 0.0347392, 2.64996e-11, 4.2136e-10, 3.90455e-10, 4.47498, 16.7705, 1.44385e-11, 1384],
  [2.60444, 0.00191429, 0.096972, 2.78979e-11, 3.63765e-10, 7.20054e-10, 8.25248, 9.66152, 7.43265e-11, 1506],
  [2.82648, 0.00378189, 0.0356185, 1.13906e-11, 3.15971e-10, 4.5857e-10, 5.25563, 7.69992, 1.73865e-11, 1553],
  [2.98869, 0.00392243, 0.110263, 1.685e-11, 3.03491e-10, 4.78286e-10, 5.4816, 9.0721, 5.61372e-11, 1596],
  [3.07345, 0.0116197, 0.042136, 5.36479e-12, 8.32966e-11, 1.09388e-10, 1.25369, 4.48972, 4.90632e-12, 1621],
  [3.36982, 0.00398863, 0.042136, 1.07308e-11, 2.33295e-10, 2.37676e-10, 2.72398, 8.20827, 1.06603e-11, 1699],
  [3.92585, 0.00414712, 0.0314891, 9.79952e-12, 2.96957e-10, 5.22407e-10, 5.98726, 6.20206, 1.75106e-11, 1844],
  [4.15253, 0.00591687, 0.042136, 5.74842e-12, 7.29551e-11, 1.48248e-10, 1.69906, 5.65156, 6.64928e-12, 1905],
];
const peaks: Peak[] = ROWS.map(([biasV, biasUncertaintyV, fwhmV, stepA, heightS, prominenceS, snr, stepSignificance, prominenceStepA, index]) => ({
  biasV, biasUncertaintyV, fwhmV, stepA, heightS, prominenceS, snr, stepSignificance, prominenceStepA, index, sweepSpreadV: null, sweepsFound: 1,
}) as Peak);

describe("assignSpectrum: the spin-pair stage leaves s as the reading had it", () => {
  it("reads shell filling with every peak in one multiplet at most, s clear of p", () => {
    const a = assignSpectrum(peaks, { eta: 0.618814 });
    expect(a.regime).toBe("shell-filling");
    const claimed = a.multiplets.flatMap((m) => m.peakIndices);
    expect(new Set(claimed).size).toBe(claimed.length);
    expect(() => withMultiplets(peaks, a.multiplets)).not.toThrow();
    const s = a.multiplets.find((m) => m.label === "s")!;
    const p = a.multiplets.find((m) => m.label === "p");
    expect(s.peaksV.every((v) => v < 2.3)).toBe(true);
    if (p) expect(p.peakIndices.some((i) => s.peakIndices.includes(i))).toBe(false);
  });
});
