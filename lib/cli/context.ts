/**
 * What a dotspec command needs from its surroundings: where to print, whether those are
 * terminals, and the exit code it settles on. Passed in by {@link main}, so tests can run the
 * commands in-process with captured output.
 */

import { cliOptionNames } from "./cliOptionNames.ts";

/** An output stream: `process.stdout` or anything with `write` (a test's capture). */
export interface CliStream {
  write(text: string): unknown;
  /** True for a terminal. Default false. */
  isTTY?: boolean;
  /** Width of the terminal in characters, when it is one. */
  columns?: number;
  /** Set by Node streams once the reader has gone (for example `dotspec … | head`). */
  destroyed?: boolean;
  /** Node streams: listen for write errors (EPIPE when the reader has gone). */
  on?(event: "error", listener: (err: Error) => void): unknown;
}

/** The surroundings {@link main} runs in; every field optional (default: the process's own). */
export interface CliIO {
  /** Results: the readable report or the JSON. Default `process.stdout`. */
  stdout: CliStream;
  /** Errors, summaries and the progress bar. Default `process.stderr`. */
  stderr: CliStream;
  /** Environment variables (for `NO_COLOR`). Default `process.env`. */
  env: Record<string, string | undefined>;
}

/** Exit codes of the dotspec command. */
export const EXIT = Object.freeze({
  /** Every file succeeded. */
  ok: 0,
  /** At least one file failed (unreadable, bad format, too short…); the others were processed. */
  failed: 1,
  /** The command line was wrong (unknown option, missing argument, value out of range). */
  usage: 2,
});

/** Handed to each command: the streams and a slot for its exit code. */
export interface CliContext extends CliIO {
  exitCode: number;
  /** Writes one `dotspec: …` line on stderr, with library option names turned into the CLI's. */
  error(message: string): void;
  /** True once stdout's reader has gone (`dotspec … | head`): stop producing output. */
  stdoutGone(): boolean;
}

/** A command-line mistake: printed as `dotspec: <message>` and mapped to exit code 2. */
export class UsageError extends Error {
  override readonly name = "UsageError";
}

/**
 * The context of one run of {@link main}. A write error on stdout (EPIPE: the reader has gone,
 * as in `dotspec analyze data | head`) ends the output quietly instead of crashing the process.
 * The listener stays on the stream: the error event can come after main has returned.
 */
export function makeContext(io: Partial<CliIO> = {}): CliContext {
  const stdout = io.stdout ?? process.stdout;
  const stderr = io.stderr ?? process.stderr;
  let gone = false;
  const onError = (err: Error) => {
    if ((err as NodeJS.ErrnoException).code === "EPIPE") gone = true;
    else stderr.write(`dotspec: cannot write the output (${err.message})\n`);
  };
  stdout.on?.("error", onError);
  return {
    stdout,
    stderr,
    env: io.env ?? process.env,
    exitCode: EXIT.ok,
    error(message: string) {
      stderr.write(`dotspec: ${cliOptionNames(message)}\n`);
    },
    stdoutGone: () => gone || stdout.destroyed === true,
  };
}
