/**
 * The registry of dotspec sub-commands, in the order `dotspec --help` lists them.
 * A new command is one module exporting a CliCommand, added here.
 */
import type { CliCommand } from "./command.ts";
import { analyzeCommand } from "./analyze.ts";
import { simulateCommand } from "./simulate.ts";
import { fitCommand } from "./fit.ts";
import { sizesCommand } from "./sizes.ts";
import { gridCommand } from "./grid.ts";

export const COMMANDS: readonly CliCommand[] = Object.freeze([analyzeCommand, sizesCommand, fitCommand, gridCommand, simulateCommand]);

export type { CliCommand } from "./command.ts";
