/**
 * Options shared by the commands that read curves (`analyze`, `fit`): η, and the units of files
 * whose header does not give them (headerless two-column files, or names without units).
 */
import { InvalidArgumentError, type Command } from "commander";
import { BIAS_UNITS, CONDUCTANCE_DEFAULTS, CURRENT_UNITS, etaForCurve, FIND_PEAKS_DEFAULTS, findUnit, type ReadCurveOptions } from "../index.ts";
import { numberOption } from "./optionValue.ts";

/** The options as commander hands them over. */
export interface CurveCliOptions {
  eta?: number;
  biasUnit?: string;
  currentUnit?: string;
  biasPolarity?: "sample" | "tip";
}

/** The parser of `--eta`: a number in (0, 1]. */
export const etaOption = numberOption({ min: 0, minExclusive: true, max: 1, accepted: "a number greater than 0 and at most 1 (the voltage-division factor η, e.g. 0.85)" });

/** A commander parser accepting the units of one quantity. */
export function unitOption(quantity: "bias" | "current", accepted: readonly string[]) {
  return (value: string): string => {
    if (!findUnit(value, quantity)) {
      throw new InvalidArgumentError(`${JSON.stringify(value)} is not a ${quantity} unit; accepted: ${accepted.join(", ")}`);
    }
    return value;
  };
}

/** The parser of `--bias-polarity`. */
function polarityOption(value: string): "sample" | "tip" {
  if (value !== "sample" && value !== "tip") throw new InvalidArgumentError(`${JSON.stringify(value)} is not a polarity; accepted: sample, tip`);
  return value;
}

/** The options that `analyze` and `sizes` share, as commander hands them over: the analysis settings ({@link addAnalysisOptions}) and the output. */
export interface AnalysisCliOptions extends CurveCliOptions {
  windowMv?: number | "auto";
  order?: number;
  minStepSigma?: number;
  useMeasured?: boolean;
  json?: boolean;
  out?: string;
  jobs?: number;
  force?: boolean;
}

/** Declares the analysis settings that `analyze` and `sizes` share: the Savitzky–Golay window and order, the peak significance, a measured dI/dV. */
export function addAnalysisOptions(command: Command): Command {
  return command
    .option(
      "--window-mv <mV>",
      `Savitzky–Golay window in mV of bias, or "auto" (default: auto, from the peak width and the noise)`,
      numberOption({ min: 0, minExclusive: true, word: "auto", accepted: 'a window in mV greater than 0 (e.g. 30), or "auto"' }),
    )
    .option(
      "--order <n>",
      `Savitzky–Golay polynomial order, 2 to 4 (default: ${CONDUCTANCE_DEFAULTS.order})`,
      numberOption({ min: 2, max: 4, integer: true, accepted: "a whole number from 2 to 4" }),
    )
    .option(
      "--min-step-sigma <n>",
      `least significance of the current step under a peak, in standard errors (default: ${FIND_PEAKS_DEFAULTS.minStepSigma})`,
      numberOption({ min: 0, accepted: "a number of standard errors, 0 or more (e.g. 5)" }),
    )
    .option("--use-measured", "use the file's measured dI/dV column (lock-in) instead of differentiating the current");
}

/** Declares how to read a file: `--bias-unit`, `--current-unit` and `--bias-polarity`. */
export function addUnitOptions(command: Command): Command {
  return command
    .option(
      "--bias-polarity <sample|tip>",
      "electrode the file's bias was applied to: sample (default) or tip (the sample bias is then minus the file's; so is the current)",
      polarityOption,
    )
    .option("--bias-unit <unit>", `unit of a bias column whose header gives none (${BIAS_UNITS.join(", ")}; default V, with a warning)`, unitOption("bias", BIAS_UNITS))
    .option("--current-unit <unit>", "unit of current columns whose header gives none (A, mA, µA, nA, pA, fA; default A, with a warning)", unitOption("current", CURRENT_UNITS));
}

/** The importer options the unit options stand for. */
export function readOptions(opts: CurveCliOptions): ReadCurveOptions {
  const read: ReadCurveOptions = {};
  if (opts.biasUnit !== undefined) read.biasUnit = opts.biasUnit;
  if (opts.currentUnit !== undefined) read.currentUnit = opts.currentUnit;
  if (opts.biasPolarity !== undefined) read.biasPolarity = opts.biasPolarity;
  return read;
}

/** The η of one curve (the library's rule, shared with the notebooks). */
export { etaForCurve };
