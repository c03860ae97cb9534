/**
 * The shape of a dotspec sub-command module. To add a command (for example `fit`), write a module
 * exporting a {@link CliCommand} and list it in `lib/cli/commands/index.ts`.
 */
import type { Command } from "commander";
import type { CliContext } from "../context.ts";

export interface CliCommand {
  /** The word on the command line: `dotspec <name> …`. */
  name: string;
  /**
   * Declares the command on `program`. Create it with `program.command(name)` so it inherits the
   * output routing and error handling of {@link main}; the action sets `ctx.exitCode` (0, 1 or 2,
   * see EXIT) and never calls `process.exit`.
   */
  register(program: Command, ctx: CliContext): void;
  /**
   * Rewrites the command line (the words after `dotspec`) before it is parsed, where commander
   * alone would misread it; absent: parsed as given.
   */
  prepareArgs?(argv: readonly string[]): string[];
}
