import { describe, expect, it } from "vitest";
import { conductance } from "../../lib/signal/conductance.ts";
import { NORMALIZED_CONDUCTANCE_DEFAULTS, normalizedConductance } from "../../lib/signal/normalizedConductance.ts";
import { isDotspecError } from "../../lib/util/errors.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { erfStep, uniformBias } from "./fixtures/curves.ts";
import { whiteNoise } from "./fixtures/random.ts";

function expectAllFinite(values: ArrayLike<number>): void {
  for (let i = 0; i < values.length; i++) expect(Number.isFinite(values[i]), `value ${values[i]} at index ${i}`).toBe(true);
}

describe("normalizedConductance({biasV, currentA, didvS}, {broadeningV})", () => {
  it("is 1 everywhere for an ohmic I = V/R (closed form), with 0 V on the grid", () => {
    const biasV = uniformBias(2001, -2, 0.002); // BIAS[1000] is 0 V up to rounding
    const R = 1e9;
    const r = normalizedConductance({ biasV, currentA: biasV.map((v) => v / R), didvS: new Float64Array(2001).fill(1 / R) });
    expectClose(r.normalized, new Float64Array(2001).fill(1), { rtol: 1e-12 });
    expectClose(r.broadenedConductanceS, new Float64Array(2001).fill(1 / R), { rtol: 1e-12 });
    expect(r.broadeningV).toBe(0.5);
  });

  it("is 1 everywhere for an ohmic I = V/R on a grid that straddles 0 V, and on a non-uniform grid", () => {
    const R = 2.5e8;
    const straddle = uniformBias(400, -0.999, 0.005); // no point at 0 V: nearest ±0.001 V
    const a = normalizedConductance({ biasV: straddle, currentA: straddle.map((v) => v / R), didvS: new Float64Array(400).fill(1 / R) });
    expectClose(a.normalized, new Float64Array(400).fill(1), { rtol: 1e-12 });
    const irregular = Float64Array.from({ length: 300 }, (_, i) => -1.5 + 0.01 * i + 0.003 * Math.sin(i));
    const b = normalizedConductance(
      { biasV: irregular, currentA: irregular.map((v) => v / R), didvS: new Float64Array(300).fill(1 / R) },
      { broadeningV: 0.2 },
    );
    expectClose(b.normalized, new Float64Array(300).fill(1), { rtol: 1e-12 });
  });

  it("matches the closed-form broadening of a piecewise-ohmic |I/V|", () => {
    // |I/V| = c₁ for V < 0, c₂ for V > 0. On an infinite axis the broadened value is
    // c₂ + (c₁ − c₂)/2·e^{−V/ΔV} for V > 0 and c₁ + (c₂ − c₁)/2·e^{V/ΔV} for V < 0 (closed form:
    // ∫₋∞⁰ e^{−(V−V′)/ΔV}dV′ = ΔV·e^{−V/ΔV}, ∫ over the whole axis = 2ΔV). The axis ends at ±5 V
    // with ΔV = 0.2 V, so the ends change it by e^{−20} within ±1 V; the trapezoid rule on 1 mV adds
    // O((h/ΔV)²) ≈ 2.5e-5.
    const c1 = 3e-10;
    const c2 = 1e-9;
    const dv = 0.2;
    const biasV = uniformBias(10001, -5, 0.001);
    const currentA = biasV.map((v) => (v < 0 ? c1 * v : c2 * v));
    const didvS = biasV.map((v) => (v < 0 ? c1 : v > 0 ? c2 : (c1 + c2) / 2));
    const r = normalizedConductance({ biasV, currentA, didvS }, { broadeningV: dv });
    for (let i = 4000; i <= 6000; i += 50) {
      const v = biasV[i];
      const expected = v > 0 ? c2 + ((c1 - c2) / 2) * Math.exp(-v / dv) : c1 + ((c2 - c1) / 2) * Math.exp(v / dv);
      expectClose(r.broadenedConductanceS[i], expected, { rtol: 1e-4, what: `broadened I/V at ${v.toFixed(3)} V` });
      expectClose(r.normalized[i], didvS[i] / expected, { rtol: 1e-4, what: `normalized at ${v.toFixed(3)} V` });
    }
  });

  it("stays finite inside a gap with exactly zero current, and for a current that is zero everywhere", () => {
    const biasV = uniformBias(2001, -2, 0.002);
    const currentA = biasV.map((v) => erfStep(v, 0.8, 0.04, 1e-10) - erfStep(-v, 1.0, 0.04, 1e-10));
    for (let i = 700; i < 1300; i++) currentA[i] = 0; // exactly zero in the gap
    const res = conductance({ biasV, currentA, sweeps: [currentA], didvS: null, meta: { source: "test", metadata: {} } });
    const r = normalizedConductance(res);
    expectAllFinite(r.normalized);
    expectAllFinite(r.broadenedConductanceS);
    const zero = normalizedConductance({ biasV, currentA: new Float64Array(2001), didvS: new Float64Array(2001) });
    expect(Array.from(zero.normalized).every((x) => x === 0)).toBe(true);
  });

  it("stays finite for a noisy curve whose grid misses 0 V by rounding only", () => {
    const biasV = Float64Array.from({ length: 2001 }, (_, i) => -2 + i * 0.002 + 1e-17);
    const noise = whiteNoise(2001, 1e-13, 8);
    const currentA = biasV.map((v, i) => 1e-9 * Math.sinh(v) + noise[i]);
    const res = conductance({ biasV, currentA, sweeps: [currentA], didvS: null, meta: { source: "test", metadata: {} } });
    const r = normalizedConductance(res);
    expectAllFinite(r.normalized);
    // Far from the gap, where I/V ≈ sinh(V)/V varies slowly, the normalized conductance of
    // I = G·sinh(V) is close to V·cosh(V)/sinh(V) (closed form for an unbroadened I/V); the
    // broadening averages I/V over ±0.5 V, so only a loose agreement is expected at 1 V.
    const i1 = 1500; // 1 V
    expect(r.normalized[i1]).toBeGreaterThan(0.8 * (Math.cosh(1) / Math.sinh(1)));
    expect(r.normalized[i1]).toBeLessThan(1.5 * (Math.cosh(1) / Math.sinh(1)));
  });

  it("rejects bad options and mismatched input", () => {
    const biasV = uniformBias(10, 0, 0.1);
    const ok = { biasV, currentA: new Float64Array(10), didvS: new Float64Array(10) };
    const codeOf = (f: () => unknown): string | undefined => {
      try {
        f();
      } catch (err) {
        expect(isDotspecError(err)).toBe(true);
        return (err as { code: string }).code;
      }
      return undefined;
    };
    expect(codeOf(() => normalizedConductance(ok, { broadeningV: 0 }))).toBe("options/not-positive");
    expect(codeOf(() => normalizedConductance(ok, { width: 1 } as never))).toBe("options/unknown-key");
    expect(codeOf(() => normalizedConductance({ ...ok, didvS: new Float64Array(9) }))).toBe("signal/length-mismatch");
    expect(codeOf(() => normalizedConductance({ ...ok, biasV: biasV.slice().reverse() }))).toBe("signal/not-ascending");
    expect(codeOf(() => normalizedConductance({ biasV: [0], currentA: [0], didvS: [0] }))).toBe("signal/too-few-points");
  });

  it("NORMALIZED_CONDUCTANCE_DEFAULTS are locked", () => {
    expect({ ...NORMALIZED_CONDUCTANCE_DEFAULTS }).toEqual({ broadeningV: 0.5 });
  });
});
