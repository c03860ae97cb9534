/**
 * Makes the invented demo grid in sample-curves/grid/:
 *
 *   npm run samples:grid
 *
 * A float32 NPY cube of current (pA), shape [ny, nx, nbias] = [24, 24, 241], with its JSON sidecar
 * (`dot-grid.json`: axes, current unit and a description saying the data are invented). The dot is
 * the particle-in-a-sphere dot of the grid tests, built by the same code
 * (test/fixtures/gridCubes.ts, `sphereDotCube`): R = 2.4 nm, levels from SPHERE_DOT_LEVELS, each
 * pixel's tip rate following the state's density projected on the plane, the current simulated
 * with the project's orthodox-theory model (lib/model) in shell tunnelling, plus seeded white noise.
 * Nothing here is a measurement. The same start of the random numbers gives the same bytes.
 */
import { renameSync, writeFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import { writeTextFile } from "../lib/index.ts";
import { SPHERE_DOT_JUNCTION, SPHERE_DOT_LEVELS, sphereDotCube } from "../test/fixtures/gridCubes.ts";

/** The demo grid: 24 × 24 pixels of 0.3 nm over a dot of R = 2.4 nm, 241 biases from −0.9 to 1.32 V. */
export const SAMPLE_GRID = Object.freeze({
  name: "dot-grid",
  nx: 24,
  ny: 24,
  stepNM: 0.3,
  radiusNM: 2.4,
  /** A bias step of 9.25 mV keeps the narrowest peak (≈ 35 mV wide) over 3.5 steps. */
  bias: Object.freeze({ fromV: -0.9, toV: 1.32, stepV: 0.00925 }),
  noiseRelative: 0.003,
  rngStart: 7,
});

/** The bytes of a little-endian float32 C-order NPY file (format version 1.0) of `values` with `shape`. */
export function float32Npy(values: Float32Array, shape: readonly number[]): Uint8Array {
  const dict = `{'descr': '<f4', 'fortran_order': False, 'shape': (${shape.join(", ")}${shape.length === 1 ? "," : ""}), }`;
  // Magic (6) + version (2) + length (2) + header, padded with spaces to a multiple of 64, ending in "\n".
  const headerLength = Math.ceil((10 + dict.length + 1) / 64) * 64 - 10;
  const header = dict.padEnd(headerLength - 1, " ") + "\n";
  const out = new Uint8Array(10 + headerLength + values.byteLength);
  out.set([0x93, ...Array.from("NUMPY", (c) => c.charCodeAt(0)), 1, 0], 0);
  new DataView(out.buffer).setUint16(8, headerLength, true);
  for (let i = 0; i < header.length; i++) out[10 + i] = header.charCodeAt(i);
  const data = new Uint8Array(values.buffer, values.byteOffset, values.byteLength);
  if (new Uint8Array(Uint16Array.of(1).buffer)[0] !== 1) throw new Error("float32Npy writes little-endian data and needs a little-endian machine");
  out.set(data, 10 + headerLength);
  return out;
}

/** A start written as the user would (−3.45, not −3.4499999999999997); the cube's own starts differ by < 1e-12 nm. */
const round = (v: number): number => Number(v.toFixed(9));

/** The demo grid's two files as the generator makes them: the NPY bytes and the sidecar text. */
export function sampleGridFiles(): { npy: Uint8Array; sidecarText: string } {
  const G = SAMPLE_GRID;
  const cube = sphereDotCube({ nx: G.nx, ny: G.ny, stepNM: G.stepNM, radiusNM: G.radiusNM, bias: G.bias, noiseRelative: G.noiseRelative, seed: G.rngStart, dtype: "float64" });
  const pA = Float32Array.from(cube.currentA, (a) => a * 1e12);
  const J = SPHERE_DOT_JUNCTION;
  const levels = SPHERE_DOT_LEVELS.map((l) => `${l.band.toUpperCase()} ${l.orbital === "pxy" ? "px/py" : l.orbital} at ${l.energyEV} eV (g = ${l.degeneracy})`).join(", ");
  const sidecar = {
    description:
      `Invented demo grid, not a measurement: a dot of radius ${G.radiusNM} nm whose states are those of a particle in a sphere ` +
      `(${levels}), simulated with dotspec's ` +
      `orthodox-theory model in shell tunnelling (eta = ${J.eta}, Ec = ${J.chargingEnergyEV} eV, ${J.temperatureK} K) with white noise; ` +
      `made by scripts/make-sample-grid.ts (npm run samples:grid).`,
    xNM: [round(cube.xNM.start), cube.xNM.step, cube.xNM.count],
    yNM: [round(cube.yNM.start), cube.yNM.step, cube.yNM.count],
    biasV: [cube.biasV.start, cube.biasV.step, cube.biasV.count],
    currentUnit: "pA",
  };
  return { npy: float32Npy(pA, [G.ny, G.nx, cube.biasV.count]), sidecarText: JSON.stringify(sidecar, null, 2) + "\n" };
}

function main(): void {
  const dir = join(dirname(fileURLToPath(import.meta.url)), "..", "sample-curves", "grid");
  const { npy, sidecarText } = sampleGridFiles();
  const npyPath = join(dir, `${SAMPLE_GRID.name}.npy`);
  const tmp = join(dir, `.${SAMPLE_GRID.name}.npy.tmp`);
  writeFileSync(tmp, npy);
  renameSync(tmp, npyPath);
  writeTextFile(join(dir, `${SAMPLE_GRID.name}.json`), sidecarText);
  console.log(`${npyPath}: ${npy.length} bytes`);
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) main();
