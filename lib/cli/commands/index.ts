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

export const COMMANDS: readonly CommandEntry[] = Object.freeze([
  {
    name: "analyze",
    arguments: "[FILE...]",
    summary: "find, assign and measure the peaks of I–V curves",
    load: async () => (await import("./analyze.ts")).analyzeCommand,
  },
  {
    name: "sizes",
    arguments: "<DIR...>",
    summary: "combine the curves of many dots: size dependence, model fits, optical pairing",
    load: async () => (await import("./sizes.ts")).sizesCommand,
  },
  {
    name: "fit",
    arguments: "<FILE...>",
    summary: "fit the double-barrier model to I–V curves",
    load: async () => (await import("./fit.ts")).fitCommand,
  },
  {
    name: "grid",
    arguments: "<INPUT>",
    summary: "maps of each assigned state across a dot from a grid of I–V sweeps",
    load: async () => (await import("./grid.ts")).gridCommand,
  },
  {
    name: "simulate",
    arguments: "",
    summary: "write the simulated I–V curve of a scenario as CSV",
    load: async () => (await import("./simulate.ts")).simulateCommand,
  },
]);

export type { CliCommand } from "./command.ts";
