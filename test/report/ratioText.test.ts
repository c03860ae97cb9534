// How the fit's text and JSON give Γtip/Γsub: a value with its error, or, where the fit ran onto a
// bound of the ratio, the one-sided limit the curve sets (Δχ² = 1.645² = 2.71, closed form). The
// integration case is a master-equation curve at Γtip/Γsub = 10⁵, far beyond the bound 10⁴: its
// text must give a lower limit, never "1.00e+4 ± …".
import { describe, it, expect } from "vitest";
import { ratioText, fitToJson, formatFitText } from "../../lib/report/fitJson.ts";
import { analysisToJson } from "../../lib/report/analysisJson.ts";
import { fitCurve } from "../../lib/model/fit/fitCurve.ts";
import { twoShellAnalysis, substrateRatePerS } from "../helpers/twoShellDot.ts";

describe("ratioText(rateRatio, standardError, limit)", () => {
  it("gives a value with its error, or a one-sided limit with the bound it ran onto", () => {
    expect(ratioText(3.2, 0.15, null)).toBe("= 3.20 ± 0.15");
    expect(ratioText(1e4, Infinity, { kind: "lower", rateRatio: 12.5, chiSquareRise: 2.71 })).toBe("≥ 12.5 (one-sided 95 %; the fit ran onto its bound 1.0e+4)");
    expect(ratioText(1e-4, Infinity, { kind: "upper", rateRatio: 1.6e-4, chiSquareRise: 2.71 })).toBe("≤ 0.000160 (one-sided 95 %; the fit ran onto its bound 1.0e-4)");
  });

  it("a deep shell-filling curve (Γtip/Γsub = 10⁵): the JSON carries the limit and the text gives it", () => {
    const analysis = twoShellAnalysis(1e5 * substrateRatePerS);
    const json = fitToJson(fitCurve(analysis), analysisToJson(analysis));
    expect(json.rateRatioLimit?.kind).toBe("lower");
    expect(json.rateRatioLimit!.rateRatio).toBeLessThan(1e5);
    const text = formatFitText(json);
    expect(text).toMatch(/Γtip\/Γsub +≥ \d/);
    expect(text).not.toMatch(/Γtip\/Γsub += 1\.00e\+4/);
    expect(json.regime).toBe("shell-filling");
  });
});
