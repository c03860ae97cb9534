/**
 * The dotspec command line: parses the arguments, runs one sub-command, returns the exit code.
 * Thin by design: the work is done by the library (lib/index.ts).
 */
import { readFileSync } from "node:fs";
import { Command, CommanderError } from "commander";
import { COMMANDS } from "./commands/index.ts";
import { EXIT, makeContext, UsageError, type CliContext, type CliIO, type CliStream } from "./context.ts";

export { EXIT, type CliIO, type CliStream } from "./context.ts";

/**
 * The package version, from package.json (two folders up from lib/cli and from dist/cli alike).
 * Read here rather than taken from the library, which `--help` and `--version` do not load.
 */
function packageVersion(): string {
  try {
    const manifest = JSON.parse(readFileSync(new URL("../../package.json", import.meta.url), "utf8")) as { version?: unknown };
    return typeof manifest.version === "string" ? manifest.version : "unknown";
  } catch {
    return "unknown";
  }
}

/**
 * Runs the dotspec command.
 *
 * Parameters
 * ----------
 * argv : string[]
 *     The arguments after the program name, e.g. `["analyze", "dot.csv", "--eta", "0.85"]`.
 * io : Partial<CliIO>, optional
 *     Streams and environment. Default: the process's stdout, stderr and env.
 *
 * Returns
 * -------
 * Promise<number>
 *     The exit code: 0 success (also for --help and --version), 1 some file failed, 2 usage error.
 *     Never calls `process.exit`; the caller sets the process's exit code.
 *
 * Notes
 * -----
 * 1. commander parses with `exitOverride`, so its errors come back as exceptions: help and
 *    version map to 0, every parse error (unknown option or command, missing argument, an option
 *    value out of range) to 2, its message already printed on stderr.
 * 2. Sub-commands come from the registry in lib/cli/commands/index.ts. Only the command named
 *    on the command line is imported (and with it the library); the others are listed from the
 *    registry's table, so `dotspec --help` and `--version` load neither the library nor any
 *    command module.
 * 3. A DotspecError that escapes a command prints `dotspec: <message>` (exit 1); any other error
 *    is a bug and prints its stack (exit 1).
 *
 * Example
 * -------
 * ```ts
 * const code = await main(["analyze", "data/", "--eta", "0.85", "--out", "report"]);
 * ```
 */
export async function main(argv: string[], io: Partial<CliIO> = {}): Promise<number> {
  const ctx = makeContext(io);
  const program = new Command("dotspec");
  program
    .description("Tunnelling spectroscopy of single quantum dots: from I–V sweeps to assigned shells, gaps and charging energies.")
    .version(packageVersion(), "-V, --version", "print the version")
    .helpOption("-h, --help", "print help")
    .helpCommand(false)
    .exitOverride()
    .configureOutput({
      writeOut: (s) => void ctx.stdout.write(s),
      writeErr: (s) => void ctx.stderr.write(s),
      outputError: (s, write) => write(`dotspec: ${s.replace(/^error: /, "")}`),
      // Width and colour from this run's own streams, not from process.stdout and process.stderr,
      // which Node builds on first use (loading its stream and terminal modules, a few ms of a
      // `--help`): the same answers for the process's streams, the right ones for any other.
      getOutHelpWidth: () => helpWidth(ctx.stdout),
      getErrHelpWidth: () => helpWidth(ctx.stderr),
      getOutHasColors: () => colorFromEnv(ctx.env) ?? hasColors(ctx.stdout),
      getErrHasColors: () => colorFromEnv(ctx.env) ?? hasColors(ctx.stderr),
    })
    .showHelpAfterError("(add --help for usage)")
    .addHelpText("after", "\nRun dotspec <command> --help for a command's options.\n");
  // Every command has options, also a stand-in below that declares none: list them all as `name [options] …`.
  const defaultHelp = program.createHelp();
  program.configureHelp({
    subcommandTerm: (cmd) => {
      const term = defaultHelp.subcommandTerm(cmd);
      return term.includes(" [options]") ? term : term.replace(/^\S+/, "$& [options]");
    },
  });
  try {
    // The first word that is not an option names the command (the program's own options take no value).
    const named = argv.find((a) => !a.startsWith("-"));
    let args = argv;
    for (const entry of COMMANDS) {
      if (entry.name === named) {
        const command = await entry.load();
        command.register(program, ctx);
        program.commands[program.commands.length - 1].summary(entry.summary);
        if (command.prepareArgs) args = command.prepareArgs(argv);
      } else {
        // A stand-in that only lists the command; it never runs (the command named runs the real one).
        program.command(`${entry.name} ${entry.arguments}`.trim()).summary(entry.summary);
      }
    }
    await program.parseAsync(args, { from: "user" });
    return ctx.exitCode;
  } catch (err) {
    return await failure(err, ctx);
  }
}

/** The help's width for a stream: its columns on a terminal, else commander's default (80; undefined). */
function helpWidth(stream: CliStream): number {
  return (stream.isTTY ? stream.columns : undefined) as number;
}

/** Whether a stream shows colours: a terminal that says it does. */
function hasColors(stream: CliStream): boolean {
  return stream.isTTY === true && (stream as { hasColors?: () => boolean }).hasColors?.() === true;
}

/**
 * Colour forced on or off by the environment, as commander decides it (NO_COLOR, FORCE_COLOR,
 * CLICOLOR_FORCE); undefined when it says nothing.
 */
function colorFromEnv(env: Record<string, string | undefined>): boolean | undefined {
  if (env.NO_COLOR || env.FORCE_COLOR === "0" || env.FORCE_COLOR === "false") return false;
  if (env.FORCE_COLOR || env.CLICOLOR_FORCE !== undefined) return true;
  return undefined;
}

/** The exit code for an error that ended a command, after printing it. */
async function failure(err: unknown, ctx: CliContext): Promise<number> {
  if (err instanceof CommanderError) return err.exitCode === 0 ? EXIT.ok : EXIT.usage;
  if (err instanceof UsageError) {
    ctx.error(err.message);
    return EXIT.usage;
  }
  // The library is loaded by now if it threw (only a command loads it); importing it again is free.
  // If it is what failed to load, the error is reported as the internal error it is.
  const isDotspecError = await import("../core.ts").then((lib) => lib.isDotspecError, () => () => false);
  if (isDotspecError(err)) {
    ctx.error(err.message);
    return EXIT.failed;
  }
  ctx.error(`internal error: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}`);
  return EXIT.failed;
}
