/**
 * Reading one column header: its name, its unit as written, and the role of the column; and
 * putting a header row together (a row of units under the names, names that contain spaces).
 */
import { findUnit, type Quantity } from "./units.ts";

/** What a column holds. `"other"` columns (height, time, index, normalised conductance…) are ignored. */
export type ColumnRole = Quantity | "other";

/** One header cell, taken apart. */
export interface ColumnHeader {
  /** The header cell as written, trimmed and unquoted. */
  header: string;
  /** The header without its unit, for example `"Current fwd"` for `"Current fwd [pA]"`. */
  name: string;
  /** The unit text as written (`"pA"`), or null when the header carries none. Not yet validated. */
  unitText: string | null;
  /** The role read from the name. */
  role: ColumnRole;
  /** True for a bias column whose name mentions the tip (the project reads bias as sample bias). */
  tipBias: boolean;
}

const BRACKET = /[([{]([^()[\]{}]*)[)\]}]/g;

/**
 * Take a column header apart into name, unit and role.
 *
 * Parameters
 * ----------
 * text : string
 *     The header cell, for example `"bias (mV)"`, `"Current [pA]"`, `"bias_V"`, `"current_nA"`,
 *     `"Bias/V"`, `"dI/dV (nS)"`, `"z (nm)"`.
 *
 * Returns
 * -------
 * ColumnHeader
 *     Name, unit text (unvalidated) and role.
 *
 * Notes
 * -----
 * 1. Unit: the last bracketed group `(…)`, `[…]` or `{…}` that is an accepted unit, else the last
 *    bracketed group (an unknown unit, reported by the caller). Without brackets, a suffix after
 *    `_` or `/` counts as the unit only when it is a unit of the quantity the name implies
 *    (`bias_V`, `I/nA`), so `I_t` and `dI/dV` keep their names.
 * 2. Role, from the name in lower case, first rule that matches:
 *    - other: normalised conductance (`(dI/dV)/(I/V)`, `I/V`, names with `norm`, `log`, `dln`);
 *    - conductance: `dI/dV`, `didv`, `conductance`, `lock-in`, `lockin`, `LIA`, `LIX`, `G`, `G1`…;
 *    - current: `current`, `I`, `It`, `I1`, `Itunnel`, `tunnel current`, `I fwd`…;
 *    - bias: `bias`, `voltage`, `V`, `U`, `Vb`, `Vbias`, `Vs`, `Vsample`, `sample bias`, `V1`…;
 *    - anything else is other.
 *
 * Example
 * -------
 * ```ts
 * readColumnHeader("Current fwd [pA]");
 * // => {header: "Current fwd [pA]", name: "Current fwd", unitText: "pA", role: "current", tipBias: false}
 * readColumnHeader("bias_V").unitText;  // => "V"
 * ```
 */
export function readColumnHeader(text: string): ColumnHeader {
  let header = text.trim();
  if (header.length >= 2 && header[0] === '"' && header[header.length - 1] === '"') header = header.slice(1, -1).trim();

  let name = header;
  let unitText: string | null = null;
  if (!isNormalised(header)) {
    const groups = [...header.matchAll(BRACKET)];
    if (groups.length > 0) {
      let pick = groups[groups.length - 1];
      for (let i = groups.length - 1; i >= 0; i--) {
        if (findUnit(groups[i][1]) !== null) {
          pick = groups[i];
          break;
        }
      }
      const start = pick.index ?? 0;
      name = tidy(header.slice(0, start) + " " + header.slice(start + pick[0].length));
      unitText = pick[1].trim() === "" ? null : pick[1].trim();
    } else {
      const split = suffixUnit(header);
      if (split) [name, unitText] = split;
    }
  }
  const role = roleOf(name, header);
  const words = name.toLowerCase().split(/[^a-z0-9]+/);
  const tipBias = role === "bias" && (words.includes("tip") || ["vt", "vtip", "ut", "utip"].includes(words[0]));
  return { header, name, unitText, role, tipBias };
}

/**
 * True when a header row holds units only: every cell blank or a unit (bare or in brackets), at
 * least one unit. Such a row (`V,pA`, `[V]\t[pA]`) belongs to the row of names above it.
 *
 * Example
 * -------
 * ```ts
 * isUnitsRow(["V", "[pA]"]);  // => true
 * isUnitsRow(["Bias", "Current"]);  // => false
 * ```
 */
export function isUnitsRow(cells: readonly string[]): boolean {
  let units = 0;
  for (const cell of cells) {
    if (cell.trim() === "") continue;
    if (findUnit(stripBrackets(cell)) === null) return false;
    units++;
  }
  return units > 0;
}

/**
 * A cell trimmed, without one pair of brackets around the whole of it.
 *
 * Example
 * -------
 * ```ts
 * stripBrackets(" [pA] ");  // => "pA"
 * ```
 */
export function stripBrackets(cell: string): string {
  const t = cell.trim();
  return /^[([{].*[)\]}]$/.test(t) ? t.slice(1, -1).trim() : t;
}

/**
 * Split a space-separated header line whose names contain spaces into `n` cells: by double quotes,
 * else at tabs or runs of two or more spaces, else at single spaces with each `(unit)` token joined
 * to the name before it. When none of these gives `n` cells, the single-space tokens.
 *
 * Example
 * -------
 * ```ts
 * splitSpacedHeader("bias (mV) current (pA)", 2);  // => ["bias (mV)", "current (pA)"]
 * splitSpacedHeader("sample bias  tunnel current", 2);  // => ["sample bias", "tunnel current"]
 * ```
 */
export function splitSpacedHeader(line: string, n: number): string[] {
  const t = line.trim();
  if (t.indexOf('"') >= 0) {
    const quoted = (t.match(/"[^"]*"|[^\s"]+/g) ?? []).map((c) => c.replace(/^"|"$/g, ""));
    if (quoted.length === n) return quoted;
  }
  const wide = t.split(/\t|\s{2,}/);
  if (wide.length === n) return wide;
  const tokens = t.split(/\s+/);
  const joined: string[] = [];
  for (const tok of tokens) {
    if (joined.length > 0 && /^[([{]/.test(tok)) joined[joined.length - 1] += " " + tok;
    else joined.push(tok);
  }
  return joined.length === n ? joined : tokens;
}

function tidy(s: string): string {
  return s.replace(/\s+/g, " ").replace(/^[\s_:,-]+|[\s_:,-]+$/g, "");
}

/** `bias_V`, `current_nA`, `Bias/V`, `I/nA`, `G/nA/V`: a suffix that is a unit of the name's quantity. */
function suffixUnit(header: string): [string, string] | null {
  const us = header.lastIndexOf("_");
  if (us > 0) {
    const r = tryUnit(header.slice(0, us), header.slice(us + 1));
    if (r) return r;
  }
  for (let i = header.indexOf("/"); i > 0; i = header.indexOf("/", i + 1)) {
    const r = tryUnit(header.slice(0, i), header.slice(i + 1));
    if (r) return r;
  }
  return null;
}

function tryUnit(namePart: string, unitPart: string): [string, string] | null {
  const role = roleOf(namePart, namePart);
  if (role === "other" || unitPart.trim() === "") return null;
  return findUnit(unitPart, role) ? [tidy(namePart), unitPart.trim()] : null;
}

function isNormalised(text: string): boolean {
  const n = text.toLowerCase();
  return /norm|log|dln|(^|[^a-z])i\s*\/\s*v($|[^a-z])/.test(n);
}

function roleOf(name: string, header: string): ColumnRole {
  if (isNormalised(header)) return "other";
  const n = name.toLowerCase();
  const compact = n.replace(/[^a-z0-9]/g, "");
  const tokens = n.split(/[^a-z0-9]+/).filter(Boolean);
  const first = tokens[0] ?? "";
  if (
    compact.includes("didv") ||
    compact.includes("didu") ||
    tokens.includes("conductance") ||
    compact.includes("lockin") ||
    /^g\d*$/.test(first) ||
    first === "lia" ||
    first === "lix"
  ) {
    return "conductance";
  }
  if (tokens.includes("current") || compact.startsWith("current") || /^i(t|tunnel)?\d*$/.test(first)) return "current";
  if (
    tokens.includes("bias") ||
    tokens.includes("voltage") ||
    compact.startsWith("bias") ||
    /^[vu](b|bias|s|sample|t|tip)?\d*$/.test(first)
  ) {
    return "bias";
  }
  return "other";
}
