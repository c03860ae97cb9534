/**
 * The registry of dotspec sub-commands, in the order `dotspec --help` lists them. A command's
 * module (and through it the library) is imported only when that command runs: `dotspec --help`
 * lists the commands from this table alone, so it starts without loading the library.
 * A new command is one module exporting a CliCommand, added here with its summary.
 */
import type { CliCommand } from "./command.ts";

/** One sub-command as the registry lists it. */
export interface CommandEntry {
  /** The word on the command line: `dotspec <name> …`. */
  name: string;
  /** Its arguments in commander's notation (`[FILE...]`, `<INPUT>`; "" for none), as `--help` lists them. */
  arguments: string;
  /** One line for the list of commands in `dotspec --help`. */
  summary: string;
  /** Imports the command's module. */
  load(): Promise<CliCommand>;
}

/** A registry entry: name, arguments and summary as `--help` lists them, and the module's loader. */
const entry = (name: string, args: string, summary: string, load: () => Promise<CliCommand>): CommandEntry => ({ name, arguments: args, summary, load });

export const COMMANDS: readonly CommandEntry[] = Object.freeze([
  entry("analyze", "[FILE...]", "find, assign and measure the peaks of I–V curves", async () => (await import("./analyze.ts")).analyzeCommand),
  entry("sizes", "<DIR...>", "combine the curves of many dots: size dependence, model fits, optical pairing", async () => (await import("./sizes.ts")).sizesCommand),
  entry("fit", "<FILE...>", "fit the double-barrier model to I–V curves", async () => (await import("./fit.ts")).fitCommand),
  entry("grid", "<INPUT>", "maps of each assigned state across a dot from a grid of I–V sweeps", async () => (await import("./grid.ts")).gridCommand),
  entry("simulate", "", "write the simulated I–V curve of a scenario as CSV", async () => (await import("./simulate.ts")).simulateCommand),
]);

export type { CliCommand } from "./command.ts";
