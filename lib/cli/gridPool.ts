/**
 * Worker threads for the per-pixel passes of `dotspec grid`. The cube lives on a
 * SharedArrayBuffer: each worker reads its share of pixels in place, nothing is copied.
 */
import { Worker } from "node:worker_threads";
import { workerEntry } from "./workerEntry.ts";
import { analyzeGrid, combinePixelPass, gridAnalysisSteps, pixelCount, type AnalyzeGridOptions, type GridAnalysis, type GridCube, type PixelPass, type PixelPassPart } from "../index.ts";

/** Tuning of the grid worker pool (locked by a test). */
export const GRID_JOBS_DEFAULTS = Object.freeze({
  /**
   * Below this many current samples (pixels × bias points) everything runs in this thread even
   * when workers were asked for: the passes take about 25 ns per sample in one thread, well under
   * a worker's start-up.
   */
  minSamplesForWorkers: 2_000_000,
  /**
   * Without --jobs, workers are started only for input files at least this large, bytes (1 GiB:
   * 256 M float32 samples). Measured with npm run bench:grid on 2 cores: up to 256 × 256 × 512
   * (128 MiB) one thread was faster (its passes take about 8 ns per sample, 0.2 s there, while two
   * workers need 0.5–1.2 s to load tsx and the library); at 1 GiB the passes take about 2 s and
   * halving them should repay the start-up (extrapolated, not measured).
   */
  autoWorkersMinBytes: 1024 * 1024 * 1024,
  /** Each pass is cut into this many parts per worker (the progress bar moves per part). */
  partsPerWorker: 4,
});

/** What a grid worker receives first: the cube's buffers and shape. */
export interface GridWorkerCube {
  buffer: SharedArrayBuffer;
  dtype: "float32" | "float64";
  missing: Uint8Array | null;
  xNM: GridCube["xNM"];
  yNM: GridCube["yNM"];
  biasV: GridCube["biasV"];
}

/** A started pool: `run` one part of a pass; `close` when done. */
export interface GridPool {
  threads: number;
  setCube(cube: GridCube): void;
  run(pass: PixelPass, fromPixel: number, toPixel: number): Promise<Float64Array>;
  close(): Promise<void>;
}

/**
 * Starts `threads` worker threads (they load the library while the main thread reads the file).
 *
 * Notes
 * -----
 * 1. Each worker gets the cube once (`setCube`: the SharedArrayBuffer and the axes), then parts
 *    `{ pass, fromPixel, toPixel }`, and answers each with the Float64Array of `runPixelPass`
 *    (transferred, not copied).
 * 2. Parts are handed to the least busy worker.
 * 3. A worker that fails rejects the parts it holds; the command reports it and exits 1.
 */
export function startGridPool(threads: number): GridPool {
  const workers = Array.from({ length: threads }, () => new Worker(workerEntry("gridWorker", import.meta.url)));
  const pending = workers.map(() => new Map<number, { resolve: (v: Float64Array) => void; reject: (e: Error) => void }>());
  let nextId = 0;
  workers.forEach((w, i) => {
    w.on("message", (msg: { id: number; values?: Float64Array; error?: string }) => {
      const p = pending[i].get(msg.id);
      if (!p) return;
      pending[i].delete(msg.id);
      if (msg.error !== undefined) p.reject(new Error(msg.error));
      else p.resolve(msg.values!);
    });
    const fail = (why: string) => {
      for (const p of pending[i].values()) p.reject(new Error(`internal error (a grid worker thread stopped: ${why}); please report it with the file`));
      pending[i].clear();
    };
    w.on("error", (err) => fail(err instanceof Error ? err.message : String(err)));
    w.on("exit", (code) => fail(`exit code ${code}`));
  });
  return {
    threads,
    setCube(cube: GridCube) {
      if (!(cube.currentA.buffer instanceof SharedArrayBuffer)) throw new Error("grid pool: the cube must live on a SharedArrayBuffer");
      const msg: GridWorkerCube = {
        buffer: cube.currentA.buffer,
        dtype: cube.currentA instanceof Float32Array ? "float32" : "float64",
        missing: cube.missing,
        xNM: cube.xNM,
        yNM: cube.yNM,
        biasV: cube.biasV,
      };
      for (const w of workers) w.postMessage({ type: "cube", cube: msg });
    },
    run(pass, fromPixel, toPixel) {
      let best = 0;
      for (let i = 1; i < workers.length; i++) if (pending[i].size < pending[best].size) best = i;
      const id = nextId++;
      return new Promise((resolve, reject) => {
        pending[best].set(id, { resolve, reject });
        workers[best].postMessage({ type: "part", id, pass, fromPixel, toPixel });
      });
    },
    async close() {
      await Promise.all(workers.map((w) => w.terminate()));
    },
  };
}

/** A cube on a SharedArrayBuffer: the same cube when it already is, else a shared copy. */
export function sharedCube(cube: GridCube): GridCube {
  if (cube.currentA.buffer instanceof SharedArrayBuffer) return cube;
  const Ctor = cube.currentA instanceof Float32Array ? Float32Array : Float64Array;
  const buffer = new SharedArrayBuffer(cube.currentA.byteLength);
  const data = Ctor === Float32Array ? new Float32Array(buffer as unknown as ArrayBuffer) : new Float64Array(buffer as unknown as ArrayBuffer);
  data.set(cube.currentA);
  return { ...cube, currentA: data };
}

/**
 * Runs {@link analyzeGrid} with its pixel passes on the pool (or in this thread for small cubes
 * or without a pool), calling `onPart` after each finished part with (done, total) parts.
 */
export async function runGridAnalysis(
  cube: GridCube,
  options: AnalyzeGridOptions,
  pool: GridPool | null,
  onPart: (done: number, total: number) => void = () => {},
): Promise<GridAnalysis> {
  const n = pixelCount(cube);
  const nb = cube.biasV.count;
  if (!pool || n * nb < GRID_JOBS_DEFAULTS.minSamplesForWorkers || !(cube.currentA.buffer instanceof SharedArrayBuffer)) {
    const grid = analyzeGrid(cube, options);
    onPart(1, 1);
    return grid;
  }
  pool.setCube(cube);
  const parts = Math.min(n, pool.threads * GRID_JOBS_DEFAULTS.partsPerWorker);
  const total = 2 * parts; // two passes: the reference spectrum and the maps
  let done = 0;
  const steps = gridAnalysisSteps(cube, options);
  let step = steps.next();
  while (!step.done) {
    const pass = step.value;
    const cuts = Array.from({ length: parts + 1 }, (_, i) => Math.round((i * n) / parts));
    const results: PixelPassPart[] = await Promise.all(
      cuts.slice(1).map(async (to, i) => {
        const values = await pool.run(pass, cuts[i], to);
        onPart(++done, total);
        return { fromPixel: cuts[i], toPixel: to, values };
      }),
    );
    step = steps.next(combinePixelPass(pass, results, n, nb));
  }
  return step.value;
}

