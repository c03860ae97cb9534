// Levels beside a predicted second-junction resonance (lib/peaks/resonanceFlankSteps.ts). The
// currents are closed-form Gaussian-broadened steps, I = a + b·x + Σ c_k·Φ((x − x_k)/s) with Φ from
// mathjs.erf, plus seeded white noise; the positions put in are the check values. The resonance
// sits where the formula of the double-barrier junction puts it, |V| = (ε + Ec/2)/(1 − η) (orthodox
// theory, the substrate junction's share of the bias), and a level of the tip-side ladder lies on
// its flank.
import { describe, it, expect } from "vitest";
import { erf } from "mathjs";
import { resonanceFlankSteps, RESONANCE_FLANK_DEFAULTS } from "../../lib/peaks/resonanceFlankSteps.ts";
import { seededRandom } from "../../lib/util/random.ts";
import { GAUSSIAN_FWHM_PER_SIGMA } from "../../lib/util/constants.ts";

const phi = (z: number) => 0.5 * (1 + erf(z / Math.SQRT2));
const axis = (from: number, to: number, step: number) => Float64Array.from({ length: Math.round((to - from) / step) + 1 }, (_, i) => from + i * step);
function stepsCurrent(x: Float64Array, steps: [number, number][], s: number, noiseA: number, rngStart: number): Float64Array {
  const rng = seededRandom(rngStart);
  return x.map((v) => 1e-12 + 2e-12 * v + steps.reduce((sum, [at, height]) => sum + height * phi((v - at) / s), 0) + noiseA * rng.normal());
}

// η = 0.6, ε = 0.95 eV, Ec = 0.1 eV: the level's resonance at (0.95 + 0.05)/0.4 = 2.5 V (closed form).
const eta = 0.6, resonanceV = (0.95 + 0.1 / 2) / (1 - eta);
const fwhmV = 0.07, s = fwhmV / GAUSSIAN_FWHM_PER_SIGMA;
const x = axis(2.0, 3.0, 0.001);
const noiseA = 0.3e-12;

describe("RESONANCE_FLANK_DEFAULTS", () => {
  it("is frozen with the documented values", () => {
    expect(Object.isFrozen(RESONANCE_FLANK_DEFAULTS)).toBe(true);
    expect(RESONANCE_FLANK_DEFAULTS).toEqual({ windowFwhm: 3, minSeparationFwhm: 0.5, maxDistanceFwhm: 2, widthBounds: [0.8, 1.25], resonanceMoveFwhm: 0.25, minStepPerResonance: 0.2, searchTolFwhm: 1 / 64 });
  });
});

describe("resonanceFlankSteps", () => {
  it("recovers a level 0.7 FWHM above the resonance, one peak in the conductance (constructed closed-form steps)", () => {
    expect(resonanceV).toBeCloseTo(2.5, 12);
    const levelV = resonanceV + 0.7 * fwhmV;
    const current = stepsCurrent(x, [[resonanceV, 20e-12], [levelV, 12e-12], [2.85, 15e-12]], s, noiseA, 7);
    const got = resonanceFlankSteps(x, current, noiseA, resonanceV, [2.85], fwhmV, 5);
    expect(got).not.toBeNull();
    expect(got!.levels.length).toBe(1);
    expect(Math.abs(got!.levels[0].biasV - levelV)).toBeLessThan(0.1 * fwhmV);
    expect(Math.abs(got!.levels[0].stepA - 12e-12)).toBeLessThan(0.15 * 12e-12);
    expect(got!.levels[0].significance).toBeGreaterThan(5);
    expect(Math.abs(got!.resonanceV - resonanceV)).toBeLessThan(0.1 * fwhmV);
  });

  it("recovers a level on each side (0.8 FWHM below, 0.9 above)", () => {
    const below = resonanceV - 0.8 * fwhmV, above = resonanceV + 0.9 * fwhmV;
    const current = stepsCurrent(x, [[below, 12e-12], [resonanceV, 20e-12], [above, 12e-12]], s, noiseA, 11);
    const got = resonanceFlankSteps(x, current, noiseA, resonanceV, [], fwhmV, 5);
    expect(got?.levels.length).toBe(2);
    expect(Math.abs(got!.levels[0].biasV - below)).toBeLessThan(0.1 * fwhmV);
    expect(Math.abs(got!.levels[1].biasV - above)).toBeLessThan(0.1 * fwhmV);
  });

  it("finds no level where the resonance steps alone, even 10 mV from its prediction", () => {
    for (const seed of [1, 2, 3, 4, 5]) {
      const current = stepsCurrent(x, [[resonanceV + 0.01, 20e-12], [2.85, 15e-12]], s, noiseA, seed);
      expect(resonanceFlankSteps(x, current, noiseA, resonanceV, [2.85], fwhmV, 5)).toBeNull();
    }
  });

  it("finds no level beside a neighbour it is told of (the neighbour's step is fitted at its place)", () => {
    const current = stepsCurrent(x, [[resonanceV, 20e-12], [resonanceV + 1.5 * fwhmV, 12e-12]], s, noiseA, 13);
    expect(resonanceFlankSteps(x, current, noiseA, resonanceV, [resonanceV + 1.5 * fwhmV], fwhmV, 5)).toBeNull();
  });
});

// A peak known to hold a level and the resonance (a shared peak, note 5): a level 0.6 FWHM below
// the resonance, 15 pA beside 20 pA, at twice the noise above; the positions and the level's step
// put in are the check values.
describe("resonanceFlankSteps with shared", () => {
  const levelV = resonanceV - 0.6 * fwhmV;
  const noisier = 0.6e-12;
  const current = stepsCurrent(x, [[levelV, 15e-12], [resonanceV, 20e-12]], s, noisier, 7);

  it("finds no level without it: one step of the resonance fits the pair within the screen", () => {
    expect(resonanceFlankSteps(x, current, noisier, resonanceV, [], fwhmV, 5)).toBeNull();
  });

  it("places the level and the resonance where they were put in, with the level's step", () => {
    const got = resonanceFlankSteps(x, current, noisier, resonanceV, [], fwhmV, 5, { levelStepMinA: 9e-12 });
    expect(got).not.toBeNull();
    expect(got!.levels.length).toBe(1);
    expect(Math.abs(got!.levels[0].biasV - levelV)).toBeLessThan(0.05 * fwhmV);
    expect(Math.abs(got!.levels[0].stepA - 15e-12)).toBeLessThan(0.15 * 15e-12);
    expect(Math.abs(got!.resonanceV - resonanceV)).toBeLessThan(0.05 * fwhmV);
  });

  it("keeps no level stepping less than levelStepMinA", () => {
    expect(resonanceFlankSteps(x, current, noisier, resonanceV, [], fwhmV, 5, { levelStepMinA: 20e-12 })).toBeNull();
  });
});
