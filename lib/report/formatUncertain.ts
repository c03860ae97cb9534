/**
 * A value with its uncertainty as text, the way the reports and the notebooks show it.
 */

/** Options of {@link formatUncertain}. */
export interface FormatUncertainOptions {
  /** Significant digits of the uncertainty. Default 2. */
  digits?: number;
  /** Most decimals shown. Default 3. */
  maxDecimals?: number;
}

/** Defaults of {@link formatUncertain} (locked by a test). */
export const FORMAT_UNCERTAIN_DEFAULTS = Object.freeze({ digits: 2, maxDecimals: 3 });

/**
 * Formats `value ± sigma` with the uncertainty to a few significant digits and the value rounded
 * to the same decimal place.
 *
 * Parameters
 * ----------
 * value : number
 *     The value, in the unit it is to be shown in (e.g. mV).
 * sigma : number | null
 *     Its 1σ uncertainty in the same unit; null (or not a positive finite number): the value alone
 *     with one decimal.
 * options : FormatUncertainOptions, optional
 *     `digits` (default 2), `maxDecimals` (default 3).
 *
 * Returns
 * -------
 * string
 *     `"142.3 ± 1.8"`, or `"142.3"` without an uncertainty.
 *
 * Notes
 * -----
 * 1. Decimals d = digits − 1 − ⌊log₁₀ σ⌋, kept within 0…maxDecimals: common practice (no source).
 *
 * Example
 * -------
 * ```ts
 * formatUncertain(142.31, 1.84); // => "142.3 ± 1.8"
 * formatUncertain(3055.42, 13);  // => "3055 ± 13"
 * ```
 */
export function formatUncertain(value: number, sigma: number | null, options: FormatUncertainOptions = {}): string {
  const digits = options.digits ?? FORMAT_UNCERTAIN_DEFAULTS.digits;
  const maxDecimals = options.maxDecimals ?? FORMAT_UNCERTAIN_DEFAULTS.maxDecimals;
  if (sigma === null || !(sigma > 0) || !Number.isFinite(sigma)) return value.toFixed(1);
  const d = Math.min(maxDecimals, Math.max(0, digits - 1 - Math.floor(Math.log10(sigma))));
  return `${value.toFixed(d)} ± ${sigma.toFixed(d)}`;
}

/**
 * η as the reports show it: at most four significant digits (η is rarely known to better than
 * ±0.01; a value typed by hand shows as typed).
 *
 * Parameters
 * ----------
 * eta : number
 *     Voltage-division factor η.
 *
 * Returns
 * -------
 * string
 *     The shortest decimal form of η rounded to four significant digits.
 *
 * Example
 * -------
 * ```ts
 * formatEta(0.8);               // => "0.8"
 * formatEta(0.640419766586274); // => "0.6404"
 * ```
 */
export function formatEta(eta: number): string {
  return String(Number(eta.toPrecision(4)));
}
