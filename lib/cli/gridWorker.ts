/**
 * Worker thread of `dotspec grid`: receives the cube (a SharedArrayBuffer, read in place) and
 * then parts of pixel passes, and answers each with its values. Started directly when compiled
 * (dist/), through gridWorker.mjs from the TypeScript sources; see workerEntry.
 */
import { parentPort } from "node:worker_threads";
import { runPixelPass, type GridCube, type PixelPass } from "../index.ts";
import type { GridWorkerCube } from "./gridPool.ts";

let cube: GridCube | null = null;

parentPort!.on("message", (msg: { type: "cube"; cube: GridWorkerCube } | { type: "part"; id: number; pass: PixelPass; fromPixel: number; toPixel: number }) => {
  if (msg.type === "cube") {
    const c = msg.cube;
    cube = {
      currentA: c.dtype === "float32" ? new Float32Array(c.buffer) : new Float64Array(c.buffer),
      xNM: c.xNM,
      yNM: c.yNM,
      biasV: c.biasV,
      missing: c.missing,
      source: "worker",
    };
    return;
  }
  try {
    if (!cube) throw new Error("no cube received before the first part");
    const values = runPixelPass(cube, msg.pass, msg.fromPixel, msg.toPixel);
    parentPort!.postMessage({ id: msg.id, values }, [values.buffer as ArrayBuffer]);
  } catch (err) {
    parentPort!.postMessage({ id: msg.id, error: err instanceof Error ? err.message : String(err) });
  }
});
