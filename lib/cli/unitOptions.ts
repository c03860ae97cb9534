/**
 * `--bias-unit` and `--current-unit`: the units of files whose header does not say (headerless
 * two-column files, or names without units), shared by the commands that read curves.
 */
import { InvalidArgumentError } from "commander";
import { findUnit, type ReadCurveOptions } from "../index.ts";

/** The options as commander hands them over. */
export interface UnitCliOptions {
  biasUnit?: string;
  currentUnit?: string;
}

/** A commander parser accepting the units of one quantity. */
export function unitOption(quantity: "bias" | "current", accepted: readonly string[]) {
  return (value: string): string => {
    if (!findUnit(value, quantity)) {
      throw new InvalidArgumentError(`${JSON.stringify(value)} is not a ${quantity} unit; accepted: ${accepted.join(", ")}`);
    }
    return value;
  };
}

/** The importer options they stand for. */
export function readOptions(opts: UnitCliOptions): ReadCurveOptions {
  const read: ReadCurveOptions = {};
  if (opts.biasUnit !== undefined) read.biasUnit = opts.biasUnit;
  if (opts.currentUnit !== undefined) read.currentUnit = opts.currentUnit;
  return read;
}
