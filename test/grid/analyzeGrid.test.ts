import { describe, expect, it } from "vitest";
import { analyzeGrid, ANALYZE_GRID_DEFAULTS, gridAnalysisSteps } from "../../lib/grid/analyzeGrid.ts";
import { analyzeCurve } from "../../lib/pipeline/analyzeCurve.ts";
import { simulateCurve } from "../../lib/model/simulate.ts";
import { runPixelPass, combinePixelPass } from "../../lib/grid/pixelPass.ts";
import { pixelCount } from "../../lib/grid/gridCube.ts";
import { EXAMPLE_SCENARIO } from "../fixtures/exampleScenario.ts";
import { j1, simpson, sphereDotCube, uniformCube, X11 } from "../fixtures/gridCubes.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { expectError } from "../helpers/errors.ts";

const R = 2.4; // nm, the dot of sphereDotCube
const CENTRE: [number, number] = [0.2, -0.1];
const grid = analyzeGrid(sphereDotCube({ radiusNM: R, centreNM: CENTRE }), { eta: 0.8 });
const map = (label: string) => {
  const m = grid.maps.find((x) => x.label === label);
  if (!m) throw new Error(`no map ${label}; maps: ${grid.maps.map((x) => x.label).join(", ")}`);
  return m;
};

// Closed forms of the particle in a sphere (infinite wall), projected on the plane:
// 1s: ⟨r²⟩ = R²(1/3 − 1/(2π²)) (integral of sin²(πr/R) r² dr, closed form); a spherically
// symmetric density has ⟨x² + y²⟩ = (2/3)⟨r²⟩; the in-plane p pair (|px|² + |py|² ∝ sin²θ) has
// ⟨x² + y²⟩ = (4/5)⟨r²⟩ (∫sin⁵θ/∫sin³θ = 4/5); ⟨r²⟩ of 1p = ∫j1(x11 r/R)² r⁴ dr / ∫j1² r² dr
// (Simpson's rule on the closed-form j1; x11 = 4.493409, Abramowitz & Stegun Table 10.6).
const rmsS = R * Math.sqrt((2 / 3) * (1 / 3 - 1 / (2 * Math.PI ** 2)));
const r2P = simpson((r) => j1(X11 * r) ** 2 * r ** 4, 0, 1, 4000) / simpson((r) => j1(X11 * r) ** 2 * r ** 2, 0, 1, 4000);
const rmsPWhole = R * Math.sqrt((2 / 3) * r2P);
const rmsPInPlane = R * Math.sqrt((4 / 5) * r2P);

describe("analyzeGrid(cube) on a particle-in-a-sphere dot (model spectra, shell tunnelling)", () => {
  it("assigns the reference spectrum: s, a p shell split into pz and (px, py), one VB level", () => {
    const a = grid.reference.analysis.assignment;
    expect(a.regime).toBe("shell-tunneling");
    expect(a.multiplets.map((m) => [m.label, m.peaksV.length])).toEqual([["s", 1], ["p", 2], ["v1", 1]]);
    // closed form: steps at (ε + Ec/2)/η = 0.625, 1.0625, 1.1875 V (scenario of the fixture); ±½ bias step
    expectClose(a.multiplets[1].peaksV, [1.0625, 1.1875], { atol: 0.004, what: "(ε + Ec/2)/η" });
    expect(grid.maps.map((m) => m.label)).toEqual(["v1", "s", "p1", "p2", "s (multiplet)", "p (multiplet)", "v1 (multiplet)", "current"]);
  });
  it("the s map is round, centred on the dot, without a dip, and its RMS radius is the 1s closed form", () => {
    const s = map("s");
    expectClose(s.centreNM!, CENTRE, { atol: 0.05, what: "the dot centre of the fixture" });
    expect(s.roundness!).toBeGreaterThan(0.95);
    expect(s.dipDepth!).toBeLessThan(0.05);
    expectClose(s.rmsRadiusNM!, rmsS, { rtol: 0.05, what: "R·√((2/3)(1/3 − 1/(2π²)))" });
  });
  it("the in-plane p map (px, py) is a ring: larger than s, a deep central dip, RMS radius √(4/5 ⟨r²⟩)", () => {
    const p = map("p2");
    expect(p.rmsRadiusNM!).toBeGreaterThan(1.15 * map("s").rmsRadiusNM!);
    expect(p.dipDepth!).toBeGreaterThan(0.6);
    expect(p.roundness!).toBeGreaterThan(0.95);
    expectClose(p.rmsRadiusNM!, rmsPInPlane, { rtol: 0.06, what: "R·√((4/5)⟨r²⟩_1p)" });
  });
  it("the map over the whole p multiplet is round again: shallow dip, RMS radius √(2/3 ⟨r²⟩)", () => {
    const p = map("p (multiplet)");
    expect(p.roundness!).toBeGreaterThan(0.95);
    // projected j1² is 0.81 of its maximum at the centre (numerical integration of the closed form): depth ≈ 0.19
    expect(p.dipDepth!).toBeLessThan(0.3);
    expect(p.dipDepth!).toBeLessThan(map("p2").dipDepth! / 2);
    expectClose(p.rmsRadiusNM!, rmsPWhole, { rtol: 0.06, what: "R·√((2/3)⟨r²⟩_1p)" });
  });
  it("every map has a noise floor and keeps only pixels above it", () => {
    for (const m of grid.maps) {
      expect(m.noiseSigma).toBeGreaterThan(0);
      expect(m.pixelsAboveFloor).toBeLessThan(256);
      expect(m.pixelsAboveFloor).toBeGreaterThan(20);
    }
  });
  it("leaves missing pixels out: NaN in the maps, not in the reference, the s map still centred", () => {
    const cube = sphereDotCube({ radiusNM: R, centreNM: CENTRE });
    const missing = new Uint8Array(256);
    for (const p of [0, 17, 100, 255]) missing[p] = 1;
    const g = analyzeGrid({ ...cube, missing }, { eta: 0.8 });
    expect(g.reference.pixels).toBe(252);
    const s = g.maps.find((m) => m.label === "s")!;
    expect(Number.isNaN(s.image.values[100])).toBe(true);
    expectClose(s.centreNM!, CENTRE, { atol: 0.05, what: "the dot centre of the fixture" });
  });
  it("maps at given biases replace the peak maps", () => {
    const g = analyzeGrid(sphereDotCube({ nx: 8, ny: 8, stepNM: 0.9 }), { eta: 0.8, atV: [0.625, 1.1875] });
    expect(g.maps.filter((m) => m.kind === "bias").map((m) => m.label)).toEqual(["at 0.625 V", "at 1.188 V"]);
    expect(g.maps.some((m) => m.kind === "peak")).toBe(false);
  });
});

describe("analyzeGrid(cube) on a cube whose pixels are all the same curve", () => {
  const sim = simulateCurve(EXAMPLE_SCENARIO, { method: "fast", conductance: false });
  const nx = 6, ny = 4, step = 0.5;
  const g = analyzeGrid(uniformCube(sim.currentA, { start: EXAMPLE_SCENARIO.bias.fromV, step: EXAMPLE_SCENARIO.bias.stepV }, nx, ny, step), { eta: 0.8 });
  const single = analyzeCurve({ biasV: sim.biasV, currentA: sim.currentA, sweeps: [sim.currentA], didvS: null, meta: { source: "one", metadata: {} } }, { eta: 0.8 });
  it("gives the single-curve assignment", () => {
    expect(g.reference.analysis.assignment.regime).toBe(single.assignment.regime);
    expect(g.reference.analysis.assignment.multiplets.map((m) => m.label)).toEqual(single.assignment.multiplets.map((m) => m.label));
    expectClose(
      g.reference.analysis.assignment.multiplets.flatMap((m) => m.peaksV),
      single.assignment.multiplets.flatMap((m) => m.peaksV),
      { atol: 1e-9, what: "the single-curve analysis" },
    );
  });
  it("gives flat maps: centre at the grid centre, RMS radius of a uniform grid, no dip", () => {
    // closed form for equal weights on an nx × ny grid: ⟨Δx²⟩ = (nx² − 1)/12·dx²
    const rmsUniform = step * Math.sqrt((nx * nx - 1) / 12 + (ny * ny - 1) / 12);
    for (const m of g.maps) {
      expect(m.pixelsAboveFloor, m.label).toBe(nx * ny);
      expectClose(m.centreNM!, [((nx - 1) / 2) * step, ((ny - 1) / 2) * step], { rtol: 1e-9, what: `${m.label}: grid centre` });
      expectClose(m.rmsRadiusNM!, rmsUniform, { rtol: 1e-9, what: `${m.label}: uniform grid` });
      expectClose(m.dipDepth!, 0, { atol: 1e-9, what: `${m.label}: flat profile` });
    }
  });
});

describe("gridAnalysisSteps(cube)", () => {
  it("gives the same analysis when its pixel passes are split in parts (as on worker threads)", () => {
    const cube = sphereDotCube({ nx: 8, ny: 8, stepNM: 0.9 });
    const whole = analyzeGrid(cube, { eta: 0.8 });
    const n = pixelCount(cube);
    const steps = gridAnalysisSteps(cube, { eta: 0.8 });
    let step = steps.next();
    while (!step.done) {
      const pass = step.value;
      const cuts = [0, 13, 40, n];
      const parts = cuts.slice(1).map((to, i) => ({ fromPixel: cuts[i], toPixel: to, values: runPixelPass(cube, pass, cuts[i], to) }));
      step = steps.next(combinePixelPass(pass, parts, n, cube.biasV.count));
    }
    const split = step.value;
    expect(split.maps.map((m) => m.rmsRadiusNM)).toEqual(whole.maps.map((m) => m.rmsRadiusNM));
  });
  it("rejects unknown options and bad references", () => {
    const cube = sphereDotCube({ nx: 4, ny: 4, stepNM: 1.8 });
    expectError(() => analyzeGrid(cube, { etaa: 1 } as never), "options/unknown-key", "etaa");
    expectError(() => analyzeGrid(cube, { reference: { pixel: [4, 0] } }), "grid/bad-reference", "ix < 4");
  });
  it("defaults are locked", () => {
    expect(Object.isFrozen(ANALYZE_GRID_DEFAULTS)).toBe(true);
    expect(ANALYZE_GRID_DEFAULTS).toEqual({ reference: "mean", floorSigma: 3 }); // common practice (no source): 3σ detection
  });
});
