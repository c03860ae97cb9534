// Levels of a particle in a sphere. Check values: the closed form ħ²x²/(2m*R²) with ħ and mₑ
// from mathjs (CODATA 2018, a general-purpose reference library) and the zeros of A&S Table 10.6;
// the bound-state threshold V0·R² = π²ħ²/(8m) of the finite spherical well for l = 0 and equal
// masses (textbook closed form, e.g. D. J. Griffiths, Introduction to Quantum Mechanics, problem
// on the finite spherical well — from memory); the l = 0 equal-mass eigenvalue condition
// x·cot x = −√(X² − x²), X² = 2mV0R²/ħ² (same textbook problem, from memory), solved here by
// plain bisection independent of the library's matching; the Kane relation E(1 + αE) = ħ²k²/2m*.
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { create, all, type Unit } from "mathjs";
import { expectClose } from "../helpers/expectClose.ts";
import { expectError } from "../helpers/errors.ts";
import { sphereLevelEV } from "../../lib/sizes/sphereLevels.ts";

const math = create(all);
const si = (u: unknown, unit: string) => (u as Unit).toNumber(unit);
const HBAR = si(math.reducedPlanckConstant, "J s");
const ME = si(math.electronMass, "kg");
const E = si(math.elementaryCharge, "C");
/** ħ²/(2mₑ) in eV·nm² from mathjs's constants. */
const C = (HBAR * HBAR) / (2 * ME) / E * 1e18;

describe("sphereLevelEV — infinite wall", () => {
  it("1S: ħ²π²/(2m*R²) = 0.94008 eV for m* = 0.1, R = 2 nm (closed form, mathjs constants)", () => {
    expectClose(sphereLevelEV(2, 0.1)!, (C * Math.PI ** 2) / (0.1 * 4), { rtol: 1e-9 });
    expectClose(sphereLevelEV(2, 0.1)!, 0.94008, { atol: 1e-5, what: "hand value" });
  });
  it("1P, 1D, 2S use x_11 = 4.493409, x_12 = 5.763459, x_20 = 2π (A&S Table 10.6)", () => {
    const e0 = C / (0.2 * 3 ** 2);
    expectClose(sphereLevelEV(3, 0.2, { l: 1 })!, e0 * 4.493409 ** 2, { rtol: 3e-7 });
    expectClose(sphereLevelEV(3, 0.2, { l: 2 })!, e0 * 5.763459 ** 2, { rtol: 3e-7 });
    expectClose(sphereLevelEV(3, 0.2, { n: 2 })!, e0 * (2 * Math.PI) ** 2, { rtol: 1e-9 });
  });
  it("non-parabolic: E(1 + αE) equals the parabolic ħ²k²/(2m*) (Kane relation)", () => {
    const alpha = 1.5, E0 = sphereLevelEV(1.5, 0.05, { l: 1 })!;
    const En = sphereLevelEV(1.5, 0.05, { l: 1, nonParabolicityPerEV: alpha })!;
    expect(En).toBeLessThan(E0);
    expectClose(En * (1 + alpha * En), E0, { rtol: 1e-12 });
  });
  it("non-parabolic → parabolic as α → 0 (first order: E ≈ E0 − αE0², closed form)", () => {
    const E0 = sphereLevelEV(2, 0.1)!;
    const alpha = 1e-6;
    expectClose(sphereLevelEV(2, 0.1, { nonParabolicityPerEV: alpha })!, E0 - alpha * E0 * E0, { rtol: 1e-11 });
  });
});

describe("sphereLevelEV — finite wall (BenDaniel–Duke)", () => {
  it("l = 0, equal masses: solves x·cot x = −√(X² − x²) (textbook condition, independent bisection)", () => {
    const R = 2, m = 0.1, V0 = 1.2;
    const X = Math.sqrt((m * V0 * R * R) / C);
    const g = (x: number) => x / Math.tan(x) + Math.sqrt(X * X - x * x);
    let a = Math.PI / 2 + 1e-12, b = Math.min(Math.PI, X) - 1e-12;
    for (let i = 0; i < 200; i++) {
      const c = 0.5 * (a + b);
      if (Math.sign(g(c)) === Math.sign(g(a))) a = c;
      else b = c;
    }
    const expected = (C * a * a) / (m * R * R);
    expectClose(sphereLevelEV(R, m, { wall: "finite", barrierEV: V0, barrierMassE: m })!, expected, { rtol: 1e-10 });
  });

  it("tends to the infinite-wall level as V0 grows (monotonically, within 0.1 % at 10⁸ eV)", () => {
    for (const l of [0, 1, 2]) {
      const inf = sphereLevelEV(2, 0.08, { l })!;
      let previous = 0;
      for (const V0 of [2, 20, 200, 2e4, 1e8]) {
        const e = sphereLevelEV(2, 0.08, { l, wall: "finite", barrierEV: V0 })!;
        expect(e).toBeGreaterThan(previous);
        expect(e).toBeLessThan(inf);
        previous = e;
      }
      expectClose(previous, inf, { rtol: 1e-3, what: `l = ${l}` });
    }
  });

  it("binds an l = 0 level only above V0·R² = π²ħ²/(8m) (equal masses; closed form)", () => {
    const R = 1.5, m = 0.07;
    const threshold = (Math.PI ** 2 * C) / (4 * m * R * R); // π²ħ²/(8mR²) with C = ħ²/2mₑ
    expect(sphereLevelEV(R, m, { wall: "finite", barrierEV: threshold * 0.999, barrierMassE: m })).toBeNull();
    const just = sphereLevelEV(R, m, { wall: "finite", barrierEV: threshold * 1.001, barrierMassE: m })!;
    expect(just).toBeLessThan(threshold * 1.001);
    expect(just).toBeGreaterThan(threshold * 0.99);
  });

  it("the second S level (n = 2) needs V0·R² > 9π²ħ²/(8m) (closed form: x = 3π/2 at threshold)", () => {
    const R = 1.5, m = 0.07;
    const threshold = (9 * Math.PI ** 2 * C) / (4 * m * R * R);
    expect(sphereLevelEV(R, m, { n: 2, wall: "finite", barrierEV: threshold * 0.999, barrierMassE: m })).toBeNull();
    expect(sphereLevelEV(R, m, { n: 2, wall: "finite", barrierEV: threshold * 1.001, barrierMassE: m })).not.toBeNull();
  });

  it("a heavier mass outside lowers the level (the wave leaks further: BenDaniel–Duke, qualitative)", () => {
    const light = sphereLevelEV(2, 0.1, { wall: "finite", barrierEV: 1, barrierMassE: 0.1 })!;
    const heavy = sphereLevelEV(2, 0.1, { wall: "finite", barrierEV: 1, barrierMassE: 1 })!;
    expect(heavy).toBeLessThan(light);
  });

  it("non-parabolic finite wall tends to the non-parabolic infinite wall as V0 grows, and to the parabolic finite wall as α → 0", () => {
    const o = { l: 1, nonParabolicityPerEV: 0.8 };
    const inf = sphereLevelEV(1.8, 0.05, o)!;
    expectClose(sphereLevelEV(1.8, 0.05, { ...o, wall: "finite", barrierEV: 1e8 })!, inf, { rtol: 1e-3 });
    const parabolic = sphereLevelEV(1.8, 0.05, { l: 1, wall: "finite", barrierEV: 3 })!;
    expectClose(sphereLevelEV(1.8, 0.05, { l: 1, wall: "finite", barrierEV: 3, nonParabolicityPerEV: 1e-9 })!, parabolic, { rtol: 1e-8 });
  });

  it("asks for the barrier when the wall is finite, and validates its inputs", () => {
    expectError(() => sphereLevelEV(2, 0.1, { wall: "finite" }), "sizes/missing-barrier", "barrierEV");
    expectError(() => sphereLevelEV(0, 0.1), "options/not-positive", "radiusNM");
    expectError(() => sphereLevelEV(2, -1), "options/not-positive", "massE");
    expectError(() => sphereLevelEV(2, 0.1, { wall: "soft" as "finite" }), "options/not-allowed", "wall");
  });

  it("for random wells: 0 < E < min(V0, infinite-wall level), and E(n−1) < E(n) (min–max principle, closed form of the ordering)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.5, max: 5, noNaN: true }), fc.double({ min: 0.01, max: 1, noNaN: true }), fc.double({ min: 0.05, max: 2, noNaN: true }),
        fc.double({ min: 0.05, max: 6, noNaN: true }), fc.integer({ min: 0, max: 3 }), fc.integer({ min: 2, max: 3 }), fc.double({ min: 0, max: 3, noNaN: true }),
        (R, m, mb, V0, l, n, alpha) => {
          const o = { l, wall: "finite" as const, barrierEV: V0, barrierMassE: mb, nonParabolicityPerEV: alpha };
          const upper = sphereLevelEV(R, m, { ...o, n });
          const lower = sphereLevelEV(R, m, { ...o, n: n - 1 });
          if (upper === null) return;
          expect(lower).not.toBeNull();
          expect(upper).toBeGreaterThan(lower!);
          expect(upper).toBeLessThan(V0);
          expect(upper).toBeLessThan(sphereLevelEV(R, m, { l, n, nonParabolicityPerEV: alpha })!);
        },
      ),
      { numRuns: 300, seed: 7 },
    );
  });
});
