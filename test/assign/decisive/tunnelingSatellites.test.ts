// The tests of notes 8 and 12 of rulesDecisive on shell-tunnelling peak lists at the closed-form
// positions of orthodox theory, (ε + Ec(n + ½))/η, a level's charging satellite stepping
// r/(1 + r) × it (C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991); see secondToFirstStepRatio).
// Where the expected values come from: the peak positions and step ratios are closed form (above),
// each verdict derived by hand from them against the limits of RULES_DECISIVE_DEFAULTS (common
// practice (no source), as documented there).
import { describe, expect, it } from "vitest";
import { broadSatelliteReasons, strongSatelliteReasons } from "../../../lib/assign/decisive/tunnelingSatellites.ts";
import { assignPeak as peak } from "../../helpers/assignPeak.ts";
import { ec, eta, reading, sV, vbTunnelingV } from "../../helpers/decisiveReading.ts";

describe("broadSatelliteReasons(peaks, assignment, broadRatio)", () => {
  it("flags s's satellite 200 mV wide (5 × the 40 mV of the others), not 40 mV", () => {
    // s at 0.75 V, its satellite one Ec/η = 0.1 V after it stepping 0.25 × s (r = 1/3), p at 1.1 V.
    const run = (fwhmV: number) => reading([peak(0.75), { ...peak(0.85, 0.25e-11), fwhmV }, peak(1.1, 3e-11)], vbTunnelingV);
    const broad = run(0.2);
    expect(broad.assignment.regime).toBe("shell-tunneling");
    expect(broadSatelliteReasons(broad.peaks, broad.assignment, 2)).toEqual([{
      code: "broad-satellite",
      text: "shell tunnelling with the CB peak at 0.850 V set aside as a charging satellite although it is 200 mV wide, 5.0 × the median FWHM of the CB peaks read (40 mV; ≥ 2): unresolved peaks, among which a level (a sub-level of p merged with a charging peak) may hide",
    }]);
    const narrow = run(0.04);
    expect(broadSatelliteReasons(narrow.peaks, narrow.assignment, 2)).toEqual([]);
  });
});

describe("strongSatelliteReasons(peaks, assignment, satelliteMax)", () => {
  it("flags p's charging peak set aside although it steps 0.9 × p (≥ 0.8), not 0.7 ×", () => {
    const pChargingV = (0.8 + 1.5 * ec) / eta;
    const run = (step: number) => reading([peak(sV[0]), peak(sV[1], 0.28e-11), peak((0.8 + ec / 2) / eta, 1.5e-11), peak(pChargingV, step * 1.5e-11)], vbTunnelingV);
    const strong = run(0.9);
    expect(strong.assignment.regime).toBe("shell-tunneling");
    expect(strongSatelliteReasons(strong.peaks, strong.assignment, 0.8)).toEqual([{
      code: "strong-satellite",
      text: `shell tunnelling with the CB peak at ${pChargingV.toFixed(3)} V set aside as a charging satellite although it steps 0.90 × the peak before it (≥ 0.8; a level's charging peak steps less): it may be a sub-level the rules did not count`,
    }]);
    const weak = run(0.7);
    expect(weak.assignment.evidence.satellitePeaksV).toContain(pChargingV);
    expect(strongSatelliteReasons(weak.peaks, weak.assignment, 0.8)).toEqual([]);
  });
});
