/**
 * The progress bar of long batches, on stderr. Lines printed while it runs go above it.
 */
import { createRequire } from "node:module";
import type * as CliProgress from "cli-progress";
import type { CliStream } from "./context.ts";

// cli-progress (CommonJS) is loaded only when a bar is drawn: a batch piped to a file or a
// program never needs it, and start-up stays short.
const require = createRequire(import.meta.url);

/** Progress of a batch: `tick` per item, `log` for a line that must not garble the bar. */
export interface Progress {
  tick(): void;
  /** Prints a line (with its `\n`) on the bar's stream, above the bar. */
  log(line: string): void;
  stop(): void;
}

/** Settings of the progress bar. */
export const PROGRESS_DEFAULTS = Object.freeze({
  /** A bar is shown only for batches of more than this many files. */
  minFiles: 5,
  /** Redraws per second at most. */
  fps: 10,
});

/**
 * Starts a progress bar on `stream` when it is a terminal and the batch is large; otherwise
 * returns a silent stand-in whose `log` writes straight to the stream.
 *
 * Parameters
 * ----------
 * total : number
 *     Items in the batch.
 * stream : CliStream
 *     Where to draw (stderr).
 * label : string
 *     Word before the bar, e.g. "analyze".
 * unit : string, optional
 *     What is counted, after the numbers. Default "files".
 */
export function startProgress(total: number, stream: CliStream, label: string, unit = "files"): Progress {
  if (!(total > PROGRESS_DEFAULTS.minFiles && stream.isTTY === true)) {
    return { tick() {}, log: (line) => void stream.write(line), stop() {} };
  }
  const cliProgress = require("cli-progress") as typeof CliProgress;
  const bars = new cliProgress.MultiBar(
    {
      stream: stream as unknown as NodeJS.WritableStream,
      format: `${label} [{bar}] {value}/{total} ${unit}  {percentage}%  eta {eta_formatted}`,
      barCompleteChar: "#",
      barIncompleteChar: "-",
      hideCursor: false,
      clearOnComplete: true,
      fps: PROGRESS_DEFAULTS.fps,
      etaBuffer: 50,
    },
    cliProgress.Presets.legacy,
  );
  const bar = bars.create(total, 0);
  // The bar redraws on a timer, which cannot fire while files are analysed synchronously in
  // this thread: redraw from here too, at most `fps` times a second.
  let drawn = 0;
  const redraw = (force: boolean) => {
    const now = Date.now();
    if (force || now - drawn >= 1000 / PROGRESS_DEFAULTS.fps) {
      drawn = now;
      bars.update();
    }
  };
  return {
    tick: () => {
      bar.increment();
      redraw(false);
    },
    log: (line) => {
      bars.log(line);
      redraw(true);
    },
    stop: () => bars.stop(),
  };
}
