/**
 * Worker thread of `dotspec analyze` for large batches: receives jobs, answers with results, in
 * order. Started directly when compiled (dist/), through analyzeWorker.mjs (which registers tsx
 * in the thread) from the TypeScript sources; see workerEntry.
 */
import { parentPort, workerData } from "node:worker_threads";
import { loadCurveFigure, type CurveFigureRenderer } from "../index.ts";
import { analyzeFile, type AnalyzeJob } from "./analyzeFile.ts";
import type { AnalyzeWorkerData, WorkerReadProgress } from "./runAnalyzeJobs.ts";

const { settings, readProgress } = workerData as AnalyzeWorkerData;
const onReadProgress = readProgress ? (readFile: string, fraction: number) => parentPort!.postMessage({ readFile, fraction } satisfies WorkerReadProgress) : undefined;
let figure: Promise<CurveFigureRenderer> | null = null;
const loadFigure = () => (figure ??= loadCurveFigure());
let queue: Promise<void> = Promise.resolve();

parentPort!.on("message", (job: AnalyzeJob) => {
  queue = queue.then(async () => {
    parentPort!.postMessage(await analyzeFile(job, settings, loadFigure, onReadProgress));
  });
});
