/**
 * Library option names in messages, turned into the command line's: a message printed by the CLI
 * says `--current-unit`, the option the user typed, not `currentUnit`.
 */

/** Library option name → CLI option, for names the CLI offers. Frozen; locked by a test. */
export const CLI_OPTION_NAMES = Object.freeze({
  biasUnit: "--bias-unit",
  currentUnit: "--current-unit",
  biasPolarity: "--bias-polarity",
  windowMV: "--window-mv",
  minStepSigma: "--min-step-sigma",
  useMeasured: "--use-measured",
  binNM: "--bin-nm",
} as const);

/** Phrases naming library options of which the CLI offers only some (or none). */
const PHRASES: readonly [RegExp, string][] = [
  [/ or pass the option biasColumn \(header or index from 0\)/g, ""],
  [/; if it is not the bias, pass biasColumn and currentColumns/g, "; if it is not the bias, give the columns a header"],
  [/\bbiasUnit \/ currentUnit \/ conductanceUnit\b/g, "--bias-unit / --current-unit"],
  [/(?<![.\w-])eta must\b/g, "--eta must"],
  [/(?<![.\w-])order must\b/g, "--order must"],
];

/**
 * A message with the library's option names replaced by the CLI's.
 *
 * Parameters
 * ----------
 * message : string
 *     A message from the library (an error's reason or a warning).
 *
 * Returns
 * -------
 * string
 *     The message with each whole-word name of {@link CLI_OPTION_NAMES} replaced, and
 *     `eta must` / `order must` (the start of a rule) read as `--eta must` / `--order must`.
 *
 * Example
 * -------
 * ```ts
 * cliOptionNames("option currentUnit: \"pA2\" is not a current unit");
 * // => 'option --current-unit: "pA2" is not a current unit'
 * ```
 */
export function cliOptionNames(message: string): string {
  let out = message;
  for (const [pattern, replacement] of PHRASES) out = out.replace(pattern, replacement);
  for (const [name, flag] of Object.entries(CLI_OPTION_NAMES)) out = out.replace(new RegExp(`(?<![-.\\w])${name}\\b`, "g"), flag);
  return out;
}
