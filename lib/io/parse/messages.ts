/**
 * Small helpers that put file content into error and warning messages.
 */
import type { Delimiter } from "../cells.ts";

/**
 * A text quoted for a message, cut to 60 characters.
 *
 * Parameters
 * ----------
 * s : string
 *     Any text (a line, a cell, a header).
 *
 * Returns
 * -------
 * string
 *     `s` as a JSON string literal; texts longer than 60 characters keep their first 57 and end
 *     in `...`.
 *
 * Example
 * -------
 * ```ts
 * quote("bias (V)");  // => "\"bias (V)\""
 * ```
 */
export function quote(s: string): string {
  const t = s.length > 60 ? s.slice(0, 57) + "..." : s;
  return JSON.stringify(t);
}

/**
 * The delimiter in words, for messages.
 *
 * Parameters
 * ----------
 * d : Delimiter
 *
 * Returns
 * -------
 * string
 *     `"tab"`, `"comma"`, `"semicolon"` or `"whitespace"`.
 *
 * Example
 * -------
 * ```ts
 * delimiterName("\t");  // => "tab"
 * ```
 */
export function delimiterName(d: Delimiter): string {
  return d === "\t" ? "tab" : d === "," ? "comma" : d === ";" ? "semicolon" : "whitespace";
}
