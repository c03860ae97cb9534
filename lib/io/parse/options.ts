/**
 * The options of `parseCurveText`: their type, their defaults, and their check at the boundary.
 */
import { DotspecError } from "../../util/errors.ts";
import { checkInteger, checkKnownKeys, checkOneOf } from "../../util/check.ts";
import type { Delimiter } from "../cells.ts";
import { ACCEPTED_UNITS, parseUnit, type Quantity, type UnitInfo } from "../units.ts";

/** A column chosen by its header (name with or without unit, any letter case) or its index from 0. */
export type ColumnRef = string | number;

/** Options of {@link parseCurveText}. Every field is optional; defaults are in {@link PARSE_DEFAULTS}. */
export interface ParseOptions {
  /** Label stored as `curve.meta.source` and put in front of every error message. Default `"(text)"`. */
  source?: string;
  /**
   * Cell separator: `","`, `";"`, `"\t"`, `"whitespace"` (runs of spaces/tabs), or `"auto"` to detect
   * it from the data lines. Default `"auto"`. A decimal comma (`1,25`) is detected in every case
   * (with `","` only in quoted cells, `"1,25"`).
   */
  delimiter?: "auto" | Delimiter;
  /**
   * Unit of the bias column when its header has none, or when the file has no header: `"V"`, `"mV"`,
   * `"µV"`… Default null: the header's unit, else V with a warning. A unit in the header wins.
   */
  biasUnit?: string | null;
  /**
   * Unit of the current columns when their header has none (or no header): `"A"`, `"mA"`, `"µA"`,
   * `"nA"`, `"pA"`, `"fA"`. Default null: the header's unit, else A with a warning.
   */
  currentUnit?: string | null;
  /**
   * Unit of measured conductance (dI/dV) columns when their header has none: `"S"`, `"mS"`, `"µS"`,
   * `"nS"`, `"pS"` or the same as `A/V`. Default null: the header's unit, else S with a warning.
   */
  conductanceUnit?: string | null;
  /**
   * The bias column, by header or by index from 0, when the names do not say it. Default null:
   * found from the names (`bias`, `voltage`, `V`, `U`, `sample bias`…), or column 0 without header.
   */
  biasColumn?: ColumnRef | null;
  /**
   * The current columns (several = repeated sweeps), by header or index from 0. Default null: found
   * from the names (`current`, `I`, `It`…), or every column after the first without header.
   */
  currentColumns?: readonly ColumnRef[] | null;
  /** Fewest distinct bias points a curve may have after cleaning, in samples. Default 5. */
  minPoints?: number;
  /**
   * Which electrode the file's bias was applied to: `"sample"` (the project's convention) or
   * `"tip"` (sample grounded; the sample bias is then minus the file's, and so is the current).
   * Default `"sample"`.
   */
  biasPolarity?: "sample" | "tip";
}

/** Defaults of {@link ParseOptions}. */
export const PARSE_DEFAULTS = Object.freeze({
  source: "(text)",
  delimiter: "auto" as "auto" | Delimiter,
  biasUnit: null as string | null,
  currentUnit: null as string | null,
  conductanceUnit: null as string | null,
  biasColumn: null as ColumnRef | null,
  currentColumns: null as readonly ColumnRef[] | null,
  minPoints: 5,
  biasPolarity: "sample" as "sample" | "tip",
});


/** {@link ParseOptions} checked, with the defaults filled in and the unit options parsed. */
export type ResolvedOptions = ReturnType<typeof resolveParseOptions>;

/**
 * Check the options of `parseCurveText` and complete them with {@link PARSE_DEFAULTS}.
 *
 * Parameters
 * ----------
 * options : ParseOptions
 *     As given by the caller; `undefined` fields take their default.
 *
 * Returns
 * -------
 * ResolvedOptions
 *     Every field of {@link PARSE_DEFAULTS}, plus `units`: the unit options parsed per quantity
 *     (`bias`, `current`, `conductance`; null where not given).
 *
 * Throws
 * ------
 * DotspecError
 *     `options/not-object`, `options/unknown-key` (from `checkKnownKeys`), `options/not-string`
 *     (source, or a unit option that is not text), the codes of `checkOneOf` (delimiter) and
 *     `checkInteger` (minPoints ≥ 2), `io/unknown-unit` (a unit option that is not a unit of
 *     its quantity), `options/not-column` (a column option that is neither a non-empty header
 *     nor an index from 0).
 *
 * Notes
 * -----
 * 1. Unknown keys are rejected by name; `undefined` values keep the default.
 * 2. The unit options are parsed once here (`parseUnit`), so the stages read `units`.
 *
 * Example
 * -------
 * ```ts
 * const o = resolveParseOptions({ currentUnit: "pA" });
 * o.units.current!.scale;  // => 1e-12
 * o.minPoints;             // => 5
 * ```
 */
export function resolveParseOptions(options: ParseOptions) {
  if (options === null || typeof options !== "object") {
    throw new DotspecError("options/not-object", `parseCurveText options must be an object; got ${options === null ? "null" : typeof options}`);
  }
  checkKnownKeys("parseCurveText options", options, Object.keys(PARSE_DEFAULTS));
  const o = { ...PARSE_DEFAULTS };
  for (const [k, v] of Object.entries(options)) if (v !== undefined) (o as Record<string, unknown>)[k] = v;
  if (typeof o.source !== "string") {
    throw new DotspecError("options/not-string", `source must be a string (a label for the curve); got ${typeof o.source}`);
  }
  checkOneOf("delimiter", o.delimiter, ["auto", ",", ";", "\t", "whitespace"] as const);
  checkInteger("minPoints", o.minPoints, 2);
  checkOneOf("biasPolarity", o.biasPolarity, ["sample", "tip"] as const);
  const unit = (name: string, value: unknown, q: Quantity): UnitInfo | null => {
    if (value === null) return null;
    if (typeof value !== "string") {
      throw new DotspecError("options/not-string", `${name} must be a unit such as ${ACCEPTED_UNITS[q].slice(0, 3).join(", ")}; got ${typeof value}`);
    }
    return parseUnit(value, q, `option ${name}`);
  };
  const units: Record<Quantity, UnitInfo | null> = {
    bias: unit("biasUnit", o.biasUnit, "bias"),
    current: unit("currentUnit", o.currentUnit, "current"),
    conductance: unit("conductanceUnit", o.conductanceUnit, "conductance"),
  };
  const checkRef = (name: string, ref: unknown) => {
    if (typeof ref === "string" ? ref.trim() === "" : !(typeof ref === "number" && Number.isInteger(ref) && ref >= 0)) {
      throw new DotspecError("options/not-column", `${name} must name a column by its header or by an index from 0; got ${JSON.stringify(ref)}`);
    }
  };
  if (o.biasColumn !== null) checkRef("biasColumn", o.biasColumn);
  if (o.currentColumns !== null) {
    if (!Array.isArray(o.currentColumns) || o.currentColumns.length === 0) {
      throw new DotspecError("options/not-column", `currentColumns must be a non-empty list of headers or indices from 0; got ${JSON.stringify(o.currentColumns)}`);
    }
    for (const ref of o.currentColumns) checkRef("currentColumns", ref);
  }
  return { ...o, units };
}
