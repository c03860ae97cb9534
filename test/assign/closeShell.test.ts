// withoutCloseShellPeaks on peak positions from the closed form (|ε| + Ec(n + ½))/η, n counting the
// carriers already in the CB (orthodox theory), with ε_s = 0.5, ε_p = 0.8, ε_d = 1.2 eV,
// Ec = 0.1 eV, η = 0.8 (Ec_V = 0.125 V), ε_v = −0.6 eV: a new shell opens (Ec + Δ)/η beyond the
// full shell below, Δ > 0, so never less than Ec_V.
import { describe, it, expect } from "vitest";
import { assignSpectrum } from "../../lib/assign/assignSpectrum.ts";
import { withoutCloseShellPeaks, CLOSE_SHELL_DEFAULTS } from "../../lib/assign/closeShell.ts";
import type { Peak } from "../../lib/peaks/findPeaks.ts";

const eta = 0.8, ec = 0.1, ecV = ec / eta;
const V = (e: number, n: number) => (e + ec * (n + 0.5)) / eta;
const peak = (biasV: number): Peak => ({ biasV, biasUncertaintyV: 0.001, index: 0, heightS: 1e-9, prominenceS: 1e-9, fwhmV: 0.04, stepA: 1e-11, snr: 20, stepSignificance: 30 });
const ladder = [-V(0.6, 1), -V(0.6, 0), V(0.5, 0), V(0.5, 1), ...[2, 3, 4, 5, 6, 7].map((n) => V(0.8, n))];
const read = (cbExtra: number[]) => assignSpectrum([...ladder, ...cbExtra].sort((a, b) => a - b).map(peak));

describe("withoutCloseShellPeaks", () => {
  it("opens a shell past p no nearer than one Ec_V (the default is that bound)", () => {
    expect(CLOSE_SHELL_DEFAULTS.openingSpacingMin).toBe(1);
  });

  it("leaves out a 'd' peak 0.7 Ec_V beyond p's last (Δpd would be negative) and drops the empty d", () => {
    const extra = V(0.8, 7) + 0.7 * ecV;
    const a = read([extra]);
    expect(a.multiplets.find((m) => m.label === "d")?.peaksV).toEqual([extra]);
    const b = withoutCloseShellPeaks(a);
    expect(b.multiplets.map((m) => m.label)).toEqual(["s", "p", "v1"]);
    expect(b.multiplets.find((m) => m.label === "p")!.found).toBe(6);
    expect(b.quantities.levelSpacingPDV).toBeNull();
    expect(b.energies.levelSpacingPDEV).toBeNull();
    expect(b.evidence.reasons.some((r) => r.startsWith(`peak at ${extra.toFixed(3)} V left out of d`))).toBe(true);
  });

  it("keeps d opened by ε_d = 1.2 eV (n = 8, 9): Δpd = 0.4 eV, 0.5 V", () => {
    const a = read([V(1.2, 8), V(1.2, 9)]);
    const b = withoutCloseShellPeaks(a);
    expect(b).toBe(a);
    expect(b.multiplets.find((m) => m.label === "d")!.found).toBe(2);
    expect(b.quantities.levelSpacingPDV).toBeCloseTo(0.4 / eta, 6);
  });

  it("leaves out a close peak read alone as d, and the shell after it (ε_d = 1.2 eV, n = 8, 9) is d", () => {
    const close = V(0.8, 7) + 0.7 * ecV;
    const a = read([close, V(1.2, 8), V(1.2, 9)]);
    expect(a.multiplets.filter((m) => m.band === "CB").map((m) => [m.label, m.peaksV.length])).toEqual([["s", 2], ["p", 6], ["d", 1], ["f", 2]]);
    const b = withoutCloseShellPeaks(a);
    const d = b.multiplets.find((m) => m.label === "d")!;
    expect(b.multiplets.map((m) => m.label)).toEqual(["s", "p", "d", "v1"]);
    expect(d.peaksV).toEqual([V(1.2, 8), V(1.2, 9)]);
    expect([d.degeneracy, d.expected]).toEqual([10, 10]);
    expect(b.quantities.levelSpacingPDV).toBeCloseTo(0.4 / eta, 6);
  });

  it("leaves a reading that is not shell filling as it is", () => {
    const a = { ...read([V(0.8, 7) + 0.7 * ecV]), regime: "shell-tunneling" as const };
    expect(withoutCloseShellPeaks(a)).toBe(a);
  });
});
