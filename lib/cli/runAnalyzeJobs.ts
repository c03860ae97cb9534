/**
 * Runs the files of a `dotspec analyze` batch, in the main thread or spread over worker threads.
 */
import { loadCurveFigure, type CurveFigureRenderer } from "../index.ts";
import { workerEntry } from "./workerEntry.ts";
import { analyzeFile, type AnalyzeBatchSettings, type AnalyzeJob, type AnalyzeJobResult } from "./analyzeFile.ts";

/** Tuning of the worker pool. */
export const ANALYZE_JOBS_DEFAULTS = Object.freeze({
  /** Jobs handed to a worker ahead of its results, so it never waits for the next file. */
  jobsAhead: 2,
});

/**
 * Analyses every job and reports each result as it comes.
 *
 * Parameters
 * ----------
 * jobs : AnalyzeJob[]
 *     The files, with their place in the batch.
 * settings : AnalyzeBatchSettings
 *     Shared by all files (sent to the workers as plain data).
 * threads : number
 *     Threads in all, this one included: 1 runs everything here, N adds N − 1 worker threads.
 * onResult : (result) => void
 *     Called once per job, in completion order (not batch order when threads > 1).
 * stop : () => boolean
 *     Checked before each job is started; once true, the remaining jobs are skipped.
 * onReadProgress : (file, fraction) => void, optional
 *     Hears how far a streamed (large) file has been read, from this thread or a worker.
 *
 * Notes
 * -----
 * 1. Each worker gets two jobs ahead and one more per result, so faster workers take more. This
 *    thread takes the next job of the same queue after each of its own: a worker costs a start
 *    and its own warm-up of the optimising compiler (the first few dozen files run several times
 *    slower), which this thread has paid already after its first files.
 * 2. In this thread the event loop gets a turn between files, so stream errors (a closed pipe),
 *    timers and the workers' results are seen during a long batch.
 * 3. A worker that fails before its first result (for example it cannot start) hands its jobs
 *    back; one that fails later fails the jobs it held (one of them made it fail). When no
 *    worker is left the remaining jobs run in this thread.
 */
export async function runAnalyzeJobs(
  jobs: readonly AnalyzeJob[],
  settings: AnalyzeBatchSettings,
  threads: number,
  onResult: (result: AnalyzeJobResult) => void,
  stop: () => boolean = () => false,
  onReadProgress?: (file: string, fraction: number) => void,
): Promise<void> {
  let figure: Promise<CurveFigureRenderer> | null = null;
  const loadFigure = () => (figure ??= loadCurveFigure());
  const queue = [...jobs];
  // This thread takes files from the queue too, so `threads` counts it: --jobs 2 is this thread
  // and one worker.
  const workers = threads > 1 && queue.length > 1 ? Math.min(threads, queue.length) - 1 : 0;
  let inWorkers: Promise<void> | null = null;
  if (workers > 0) {
    // Loaded here, not at start-up: a one-thread run (one file, or --jobs 1) never needs it.
    const { Worker } = await import("node:worker_threads");
    inWorkers = runInWorkers(Worker, queue, settings, workers, onResult, stop, onReadProgress);
  }
  for (;;) {
    // Let the event loop run between files (stream errors, the progress bar's timer, the workers' results).
    await new Promise<void>((resolve) => setImmediate(resolve));
    if (stop()) queue.length = 0;
    const job = queue.shift();
    if (job === undefined) {
      if (inWorkers === null) return;
      // The workers' last jobs: a worker lost meanwhile hands its jobs back to the queue.
      await inWorkers;
      inWorkers = null;
      continue;
    }
    onResult(await analyzeFile(job, settings, loadFigure, onReadProgress));
  }
}

/** What a worker thread sends, besides results, while it streams a large file. */
export interface WorkerReadProgress {
  /** The file being read. */
  readFile: string;
  /** The fraction of its bytes read, 0…1. */
  fraction: number;
}

/** What a worker thread is started with. */
export interface AnalyzeWorkerData {
  settings: AnalyzeBatchSettings;
  /** Send {@link WorkerReadProgress} messages while streaming a large file. */
  readProgress: boolean;
}

/** Runs jobs from `queue` on worker threads until it is empty or no worker is left. */
function runInWorkers(
  Worker: typeof import("node:worker_threads").Worker,
  queue: AnalyzeJob[],
  settings: AnalyzeBatchSettings,
  threads: number,
  onResult: (r: AnalyzeJobResult) => void,
  stop: () => boolean,
  onReadProgress?: (file: string, fraction: number) => void,
): Promise<void> {
  return new Promise((done) => {
    let alive = 0;
    const finish = () => {
      if (alive === 0) done();
    };
    for (let w = 0; w < threads; w++) {
      // The worker reports how far it has read a streamed file only when someone listens.
      const worker = new Worker(workerEntry("analyzeWorker", import.meta.url), { workerData: { settings, readProgress: onReadProgress !== undefined } });
      alive++;
      const held = new Map<number, AnalyzeJob>();
      let answered = 0;
      let closed = false;
      const feed = () => {
        if (stop()) queue.length = 0;
        while (held.size < ANALYZE_JOBS_DEFAULTS.jobsAhead && queue.length) {
          const job = queue.shift()!;
          held.set(job.index, job);
          worker.postMessage(job);
        }
        if (held.size === 0) close();
      };
      const close = () => {
        if (closed) return;
        closed = true;
        alive--;
        void worker.terminate();
        finish();
      };
      const lost = (why: string) => {
        if (closed) return;
        if (answered === 0) queue.unshift(...held.values());
        else for (const job of held.values()) onResult({ index: job.index, ok: false, error: `internal error (the worker thread stopped: ${why}); please report it with the file` });
        held.clear();
        close();
      };
      worker.on("message", (message: AnalyzeJobResult | WorkerReadProgress) => {
        if ("readFile" in message) {
          onReadProgress?.(message.readFile, message.fraction);
          return;
        }
        const result = message;
        held.delete(result.index);
        answered++;
        onResult(result);
        feed();
      });
      worker.on("error", (err) => lost(err instanceof Error ? err.message : String(err)));
      worker.on("exit", (code) => lost(`exit code ${code}`));
      feed();
    }
  });
}
