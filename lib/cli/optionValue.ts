/**
 * Parsers of option values for commander: each checks the rule and, when it fails, says what is
 * accepted, so `dotspec analyze --eta 1.5` answers with the option, the value and the range.
 */
import { InvalidArgumentError } from "commander";

/** The rule of a numeric option. */
export interface NumberRule {
  /** Smallest accepted value (see `minExclusive`). Default: none. */
  min?: number;
  /** The minimum itself is not accepted. Default false. */
  minExclusive?: boolean;
  /** Largest accepted value. Default: none. */
  max?: number;
  /** Whole numbers only. Default false. */
  integer?: boolean;
  /** Also accept this word (e.g. "auto") and return it unchanged. */
  word?: string;
  /** What is accepted, in words, e.g. "a number greater than 0 and at most 1 (η, e.g. 0.85)". */
  accepted: string;
}

/**
 * A commander argument parser for a numeric option.
 *
 * Parameters
 * ----------
 * rule : NumberRule
 *     Bounds, integer-ness, an optional word, and the accepted range in words.
 *
 * Returns
 * -------
 * (raw: string) => number | string
 *     Returns the number (or the word); throws commander's InvalidArgumentError with
 *     "expected <accepted>" otherwise, which commander prints with the option and the value.
 *
 * Example
 * -------
 * ```ts
 * numberOption({ min: 0, minExclusive: true, max: 1, accepted: "a number in (0, 1]" })("0.85"); // => 0.85
 * ```
 */
export function numberOption(rule: NumberRule): (raw: string) => number | string {
  return (raw: string) => {
    if (rule.word !== undefined && raw === rule.word) return raw;
    const v = raw.trim() === "" ? NaN : Number(raw);
    const ok =
      Number.isFinite(v) &&
      (!rule.integer || Number.isInteger(v)) &&
      (rule.min === undefined || (rule.minExclusive ? v > rule.min : v >= rule.min)) &&
      (rule.max === undefined || v <= rule.max);
    if (!ok) throw new InvalidArgumentError(`expected ${rule.accepted}.`);
    return v;
  };
}
