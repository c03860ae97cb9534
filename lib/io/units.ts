/**
 * The units dotspec accepts for bias, current and conductance columns, with their SI scale.
 *
 * A unit is written as an SI prefix and a symbol: `mV`, `pA`, `nS`. Micro may be written with the
 * micro sign (U+00B5), the Greek letter mu (U+03BC) or a plain `u`. A conductance may also be
 * written as a current per volt (`nA/V`). Units are matched exactly first; a match that differs
 * only in letter case (`mv`, `PA`) is accepted when it is unambiguous within the quantity, and
 * flagged so that the importer can warn about it.
 */
import { DotspecError } from "../util/errors.ts";

/** The physical quantity a column holds. */
export type Quantity = "bias" | "current" | "conductance";

/** A recognised unit. */
export interface UnitInfo {
  /** The unit as dotspec spells it, for example `"pA"` or `"uA"` (the accepted spelling matched). */
  unit: string;
  /** What the unit measures. */
  quantity: Quantity;
  /** SI value of one unit: volts, amperes or siemens per unit (`1e-12` for pA). */
  scale: number;
  /** The power of ten of `scale` (`-12` for pA); {@link toSI} divides by 10^−exponent, which is exact. */
  exponent: number;
  /** True when the text matched only after ignoring letter case (for example `mv` read as `mV`). */
  caseFolded: boolean;
}

const PREFIXES: readonly [string, number][] = [
  ["", 0],
  ["m", -3],
  ["µ", -6], // U+00B5 MICRO SIGN
  ["μ", -6], // U+03BC GREEK SMALL LETTER MU
  ["u", -6],
  ["n", -9],
  ["p", -12],
  ["f", -15],
];

/** Scale per exponent, written as literals so they are the nearest doubles to the decimal values. */
const SCALE: Record<number, number> = { 0: 1, [-3]: 1e-3, [-6]: 1e-6, [-9]: 1e-9, [-12]: 1e-12, [-15]: 1e-15 };

function build(quantity: Quantity, symbol: string, exponents: readonly number[]): [string, Omit<UnitInfo, "caseFolded">][] {
  return PREFIXES.filter(([, e]) => exponents.includes(e)).map(([p, e]) => [
    p + symbol,
    { unit: p + symbol, quantity, scale: SCALE[e], exponent: e },
  ]);
}

const TABLE = new Map<string, Omit<UnitInfo, "caseFolded">>([
  ...build("bias", "V", [0, -3, -6]),
  ...build("current", "A", [0, -3, -6, -9, -12, -15]),
  ...build("conductance", "S", [0, -3, -6, -9, -12]),
  ...build("conductance", "A/V", [0, -3, -6, -9, -12]),
]);

function unitsOf(quantity: Quantity): readonly string[] {
  return Object.freeze([...TABLE.values()].filter((u) => u.quantity === quantity).map((u) => u.unit));
}

/** Accepted bias units: V, mV, µV (also μV, uV). */
export const BIAS_UNITS: readonly string[] = unitsOf("bias");
/** Accepted current units: A, mA, µA (also μA, uA), nA, pA, fA. */
export const CURRENT_UNITS: readonly string[] = unitsOf("current");
/** Accepted conductance units: S, mS, µS (also μS, uS), nS, pS and the same as A/V, mA/V, µA/V, nA/V, pA/V. */
export const CONDUCTANCE_UNITS: readonly string[] = unitsOf("conductance");

/** The accepted units of each quantity, for messages and docs. */
export const ACCEPTED_UNITS: Readonly<Record<Quantity, readonly string[]>> = Object.freeze({
  bias: BIAS_UNITS,
  current: CURRENT_UNITS,
  conductance: CONDUCTANCE_UNITS,
});

/** The SI unit of each quantity. */
export const SI_UNIT: Readonly<Record<Quantity, string>> = Object.freeze({ bias: "V", current: "A", conductance: "S" });

/** Case-folded lookup: lower-case text → the units it could mean, per quantity. */
const FOLDED = new Map<string, Omit<UnitInfo, "caseFolded">[]>();
for (const info of TABLE.values()) {
  const key = info.unit.toLowerCase();
  const list = FOLDED.get(key) ?? [];
  list.push(info);
  FOLDED.set(key, list);
}

function clean(text: string): string {
  let t = text.trim();
  // A micro sign written as UTF-8 and read back as Latin-1 shows up as "Âµ".
  if (t.startsWith("Âµ")) t = t.slice(1);
  return t.replace(/\s+/g, "");
}

/**
 * Look a unit up without throwing.
 *
 * Parameters
 * ----------
 * text : string
 *     The unit as written, for example `"pA"`, `"uS"`, `"nA/V"`. Surrounding spaces are ignored.
 * quantity : Quantity, optional
 *     Restrict the search to the units of one quantity. Default: any quantity.
 *
 * Returns
 * -------
 * UnitInfo | null
 *     The unit, or null when the text is not an accepted unit (or is ambiguous once letter case is
 *     ignored).
 *
 * Example
 * -------
 * ```ts
 * findUnit("pA");  // => {unit: "pA", quantity: "current", scale: 1e-12, exponent: -12, caseFolded: false}
 * findUnit("mv", "bias")?.unit;  // => "mV" (caseFolded: true)
 * findUnit("kV");  // => null
 * ```
 */
export function findUnit(text: string, quantity?: Quantity): UnitInfo | null {
  const t = clean(text);
  const exact = TABLE.get(t);
  if (exact && (quantity === undefined || exact.quantity === quantity)) return { ...exact, caseFolded: false };
  const folded = (FOLDED.get(t.toLowerCase()) ?? []).filter((u) => quantity === undefined || u.quantity === quantity);
  // Two spellings of the same unit (µA, μA) count as one meaning.
  const meanings = new Set(folded.map((u) => `${u.quantity}:${u.exponent}:${u.unit.endsWith("/V")}`));
  if (folded.length > 0 && meanings.size === 1) return { ...folded[0], caseFolded: true };
  return null;
}

/**
 * Look a unit up, throwing a clear error when it is not accepted.
 *
 * Parameters
 * ----------
 * text : string
 *     The unit as written, for example `"mV"`, `"µA"`, `"nS"`.
 * quantity : Quantity, optional
 *     The quantity the unit must measure. Default: any quantity.
 * where : string, optional
 *     What the unit belongs to, named in the error (for example `column "Bias (kV)"` or
 *     `option biasUnit`). Default `"unit"`.
 *
 * Returns
 * -------
 * UnitInfo
 *     The unit with its SI scale.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/unknown-unit` when the text is not an accepted unit (of that quantity); the message lists the accepted units.
 *
 * Example
 * -------
 * ```ts
 * parseUnit("nA").scale;  // => 1e-9
 * parseUnit("kV", "bias");  // throws: unit "kV" is not a bias unit; use one of V, mV, µV, μV, uV
 * ```
 */
export function parseUnit(text: string, quantity?: Quantity, where = "unit"): UnitInfo {
  const found = findUnit(text, quantity);
  if (found) return found;
  const other = quantity === undefined ? null : findUnit(text);
  const quantities: Quantity[] = quantity ? [quantity] : ["bias", "current", "conductance"];
  const list = quantities.map((q) => `${q}: ${ACCEPTED_UNITS[q].join(", ")}`).join("; ");
  const what = quantity ? `a ${quantity} unit` : "an accepted unit";
  const hint = other ? ` (it is a ${other.quantity} unit)` : "";
  throw new DotspecError(
    "io/unknown-unit",
    `${where}: ${JSON.stringify(text)} is not ${what}${hint}; use one of ${list}`,
  );
}

/**
 * Convert a value to SI: volts, amperes or siemens.
 *
 * Divides by the exact power of ten 10^−exponent rather than multiplying by the inexact scale:
 * one correctly rounded operation, so that `1.25` mV becomes exactly the double nearest to 0.00125.
 *
 * Parameters
 * ----------
 * value : number
 *     The value in the unit.
 * unit : Pick<UnitInfo, "exponent">
 *     The unit (its power of ten), e.g. from {@link parseUnit}.
 *
 * Returns
 * -------
 * number
 *     The value in V, A or S.
 *
 * Example
 * -------
 * ```ts
 * toSI(1.25, parseUnit("mV"));  // => 0.00125
 * ```
 */
export function toSI(value: number, unit: Pick<UnitInfo, "exponent">): number {
  switch (unit.exponent) {
    case 0:
      return value;
    case -3:
      return value / 1e3;
    case -6:
      return value / 1e6;
    case -9:
      return value / 1e9;
    case -12:
      return value / 1e12;
    case -15:
      return value / 1e15;
    default:
      return value * 10 ** unit.exponent;
  }
}

