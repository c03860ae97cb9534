/**
 * Grid benchmark: `dotspec grid` end to end on float32 NPY cubes (target: 128 × 128 × 512 in
 * ≤ 3 s wall on 2 cores, peak memory ≤ 3 × the cube) and three sizes to show the cost is linear in
 * pixels × bias points. Writes synthetic cubes (invented: the particle-in-a-sphere dot of the
 * tests, with each level's model current scaled by the pixel's projected density) into a
 * temporary folder, then times the real command as a child process under /usr/bin/time (wall
 * time and maximum resident set size).
 *
 *   npm run bench:grid                      # four sizes: the command (default, --jobs 1, --jobs 2), then in process
 *   npm run bench:grid -- --numpy           # also time bench/grid_numpy.py on the same files
 */
import { mkdtempSync, rmSync, writeFileSync, openSync, writeSync, closeSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, dirname } from "node:path";
import { spawnSync } from "node:child_process";
import { fileURLToPath } from "node:url";
import { analyzeGrid, readGridFile, simulateCurve, seededRandom } from "../lib/index.ts";
import { projectedDensity, SPHERE_DOT_JUNCTION, SPHERE_DOT_LEVELS } from "../test/fixtures/gridCubes.ts";

const args = process.argv.slice(2);
const withNumpy = args.includes("--numpy");
const root = join(dirname(fileURLToPath(import.meta.url)), "..");
const bin = join(root, "bin", "dotspec.js");
const dir = mkdtempSync(join(tmpdir(), "dotspec-grid-"));

/** Writes a float32 C-order NPY cube [ny, nx, nb] (format version 1.0) and its sidecar. */
function writeCube(name: string, nx: number, ny: number, nb: number): string {
  const J = SPHERE_DOT_JUNCTION;
  const bias = { fromV: J.bias.fromV, toV: J.bias.toV, stepV: (J.bias.toV - J.bias.fromV) / (nb - 1) };
  // One model curve per level at the base tip rate; a pixel scales each by its projected density
  // (shell tunnelling: current ∝ tip rate to within Γtip/Γsub ≈ 1 %).
  const shapes = SPHERE_DOT_LEVELS.map((level) =>
    simulateCurve(
      {
        cb: level.band === "cb" ? [{ energyEV: level.energyEV, degeneracy: level.degeneracy }] : [],
        vb: level.band === "vb" ? [{ energyEV: level.energyEV, degeneracy: level.degeneracy }] : [],
        chargingEnergyEV: J.chargingEnergyEV,
        eta: J.eta,
        tipRatePerS: J.baseTipRatePerS,
        substrateRatePerS: J.substrateRatePerS,
        temperatureK: J.temperatureK,
        broadeningEV: J.broadeningEV,
        bias,
      },
      { method: "fast", conductance: false },
    ).cleanCurrentA.subarray(0, nb),
  );
  const radiusNM = 2.4, stepNM = (3 * radiusNM) / Math.max(nx, ny); // the grid spans ±1.5 R
  const x0 = -((nx - 1) / 2) * stepNM, y0 = -((ny - 1) / 2) * stepNM;
  const rng = seededRandom(5);
  const sigma = 2e-14;
  const dict = `{'descr': '<f4', 'fortran_order': False, 'shape': (${ny}, ${nx}, ${nb}), }`;
  let head = dict;
  while ((10 + head.length + 1) % 64) head += " ";
  head += "\n";
  const pre = Buffer.alloc(10);
  Buffer.from([0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59, 1, 0]).copy(pre);
  pre.writeUInt16LE(head.length, 8);
  const path = join(dir, `${name}.npy`);
  const fd = openSync(path, "w");
  writeSync(fd, Buffer.concat([pre, Buffer.from(head, "latin1")]));
  const row = new Float32Array(nx * nb);
  for (let iy = 0; iy < ny; iy++) {
    for (let ix = 0; ix < nx; ix++) {
      const rho = Math.hypot(x0 + ix * stepNM, y0 + iy * stepNM) / radiusNM;
      const w = SPHERE_DOT_LEVELS.map((l) => projectedDensity(l.orbital, rho) * (l.orbital === "pxy" ? 0.5 : 1) * Math.PI);
      for (let k = 0; k < nb; k++) {
        let v = 0;
        for (let j = 0; j < shapes.length; j++) v += w[j] * shapes[j][k];
        row[ix * nb + k] = v + sigma * rng.normal();
      }
    }
    writeSync(fd, new Uint8Array(row.buffer));
  }
  closeSync(fd);
  writeFileSync(join(dir, `${name}.json`), JSON.stringify({ xNM: [x0, stepNM, nx], yNM: [y0, stepNM, ny], biasV: [bias.fromV, bias.stepV, nb], currentUnit: "A", description: "invented benchmark cube" }));
  return path;
}

/** Runs a command under /usr/bin/time: wall seconds and maximum RSS in MB. */
function timed(cmd: string, argv: string[]): { s: number; rssMB: number; status: number | null; stderr: string } {
  const r = spawnSync("/usr/bin/time", ["-f", "TIME %e %M", cmd, ...argv], { encoding: "utf8", maxBuffer: 1 << 30 });
  const m = /TIME ([\d.]+) (\d+)/.exec(r.stderr);
  return { s: m ? Number(m[1]) : NaN, rssMB: m ? Number(m[2]) / 1024 : NaN, status: r.status, stderr: r.stderr.replace(/TIME .*\n?/, "") };
}

try {
  const sizes: [number, number, number][] = [[64, 64, 512], [128, 128, 256], [128, 128, 512], [256, 256, 512]];
  const baseline = timed(process.execPath, ["-e", "0"]);
  const base = timed(process.execPath, [bin, "--help"]);
  console.log(`node alone: ${baseline.s.toFixed(2)} s, ${baseline.rssMB.toFixed(0)} MB; dotspec --help: ${base.s.toFixed(2)} s, ${base.rssMB.toFixed(0)} MB`);
  for (const [nx, ny, nb] of sizes) {
    const t0 = performance.now();
    const path = writeCube(`cube-${nx}x${ny}x${nb}`, nx, ny, nb);
    const cubeMB = (nx * ny * nb * 4) / 2 ** 20;
    const made = (performance.now() - t0) / 1000;
    for (const jobs of [null, 1, 2]) {
      for (const out of jobs === null ? [false, true] : [false]) {
        const argv = [bin, "grid", path, "--eta", "0.8", ...(jobs === null ? [] : ["--jobs", String(jobs)]), ...(out ? ["--out", join(dir, "out")] : ["--json"])];
        const r = timed(process.execPath, argv);
        console.log(
          `${nx} × ${ny} × ${nb} (${cubeMB.toFixed(1)} MB, ${(nx * ny * nb / 1e6).toFixed(1)} M samples, written in ${made.toFixed(1)} s) ${jobs === null ? "default jobs" : `--jobs ${jobs}`} ${out ? "--out " : "--json"}: ` +
            `${r.s.toFixed(2)} s wall, max RSS ${r.rssMB.toFixed(0)} MB (${(r.rssMB / cubeMB).toFixed(1)} × the cube; ${((r.rssMB - base.rssMB) / cubeMB).toFixed(1)} × above dotspec --help)` +
            (r.status === 0 ? "" : ` exit ${r.status}: ${r.stderr.trim().split("\n").slice(-2).join(" ")}`),
        );
      }
    }
    // In this process: reading and analysis only (no start-up, no figures), best of three.
    let read = Infinity, analyse = Infinity;
    for (let rep = 0; rep < 3; rep++) {
      const t1 = performance.now();
      const { cube } = readGridFile(path);
      const t2 = performance.now();
      analyzeGrid(cube, { eta: 0.8 });
      const t3 = performance.now();
      read = Math.min(read, t2 - t1);
      analyse = Math.min(analyse, t3 - t2);
    }
    const samples = nx * ny * nb;
    console.log(`  in process, one thread: read ${read.toFixed(0)} ms, analyzeGrid ${analyse.toFixed(0)} ms: ${(((read + analyse) * 1e6) / samples).toFixed(1)} ns per sample`);
    if (withNumpy) {
      const r = timed("python3", [join(root, "bench", "grid_numpy.py"), path]);
      console.log(`  NumPy/SciPy script (smoothing + maps only) on the same file: ${r.s.toFixed(2)} s wall, max RSS ${r.rssMB.toFixed(0)} MB${r.status === 0 ? "" : ` exit ${r.status}: ${r.stderr.trim()}`}`);
    }
  }
} finally {
  rmSync(dir, { recursive: true, force: true });
}
