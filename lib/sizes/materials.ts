/**
 * Bulk parameters of a few semiconductors used by the size models, each with its source, and the
 * reading of a user's override file.
 */
import { DotspecError } from "../util/errors.ts";
import { parseJsonText } from "../io/parseJsonText.ts";

/** Bulk parameters of one semiconductor, as the size models use them. */
export interface Material {
  /** Name (a built-in key such as "CdSe", or the user's). */
  name: string;
  /** Bulk band gap at low temperature (≈ 4 K), eV. */
  bandGapEV: number;
  /** Conduction-band effective mass, in units of the free-electron mass mₑ. */
  electronMassE: number;
  /** Valence-band (heavy-hole) effective mass, in units of mₑ. */
  holeMassE: number;
  /** Static (low-frequency) relative dielectric constant ε. */
  dielectricConstant: number;
  /** Band non-parabolicity α in E(1 + αE) = ħ²k²/(2m*), 1/eV (same α for electrons and holes). */
  nonParabolicityPerEV: number;
  /** Confining step at the dot's surface for both carriers (finite-wall model), eV. */
  barrierEV: number;
  /** Effective mass outside the dot (the ligand shell), in units of mₑ. */
  barrierMassE: number;
  /** Where each value comes from, by field name. */
  sources: Readonly<Record<string, string>>;
}

const MADELUNG =
  "O. Madelung, Semiconductors: Data Handbook, 3rd ed. (Springer, 2004) — from memory, not re-read";
const KANE =
  "closed form α = 1/Eg of the two-band Kane model (E. O. Kane, J. Phys. Chem. Solids 1, 249 (1957)); measured α is often smaller";
const BARRIER =
  "project choice: 4 eV, about the electron affinity of these semiconductors (4–5 eV, from memory), i.e. an electron confined by the vacuum level, near which the LUMO of saturated alkyl ligands lies; the same step is used for holes (their real barrier is larger, so the hole level is if anything underestimated)";
const FREE_MASS = "project choice: the free-electron mass in the ligand shell (common practice, no source)";

function entry(
  name: string,
  bandGapEV: number, electronMassE: number, holeMassE: number, dielectricConstant: number,
  sources: Record<string, string>,
): Material {
  return Object.freeze({
    name, bandGapEV, electronMassE, holeMassE, dielectricConstant,
    nonParabolicityPerEV: 1 / bandGapEV,
    barrierEV: 4,
    barrierMassE: 1,
    sources: Object.freeze({ nonParabolicityPerEV: KANE, barrierEV: BARRIER, barrierMassE: FREE_MASS, ...sources }),
  });
}

/**
 * The built-in materials. Values differ between handbooks by several per cent (masses by more);
 * every one is marked with its source, and "from memory" where the source was not re-read. Users
 * with better numbers override them ({@link resolveMaterial}, {@link parseMaterialJson}).
 */
export const MATERIALS: Readonly<Record<string, Material>> = Object.freeze({
  InP: entry("InP", 1.421, 0.08, 0.6, 12.5, {
    bandGapEV: "Ioffe Institute, NSM Archive: Physical Properties of Semiconductors, InP (1.421 eV at 0 K) — from memory",
    electronMassE: "Ioffe Institute, NSM Archive, InP — from memory",
    holeMassE: "Ioffe Institute, NSM Archive, InP (heavy hole) — from memory",
    dielectricConstant: "Ioffe Institute, NSM Archive, InP (static, 12.5) — from memory",
  }),
  CdSe: entry("CdSe", 1.84, 0.13, 0.45, 9.5, {
    bandGapEV: `${MADELUNG} (wurtzite, 1.84 eV at 4 K)`,
    electronMassE: `${MADELUNG}`,
    holeMassE: `${MADELUNG} (heavy hole, a mean over directions)`,
    dielectricConstant: `${MADELUNG} (static, a value between ε⊥ ≈ 9.3 and ε∥ ≈ 10.2)`,
  }),
  PbS: entry("PbS", 0.286, 0.085, 0.085, 175, {
    bandGapEV: `${MADELUNG} (0.286 eV at 4 K)`,
    electronMassE: "I. Kang and F. W. Wise, J. Opt. Soc. Am. B 14, 1632 (1997) (a mean of the anisotropic masses) — from memory",
    holeMassE: "I. Kang and F. W. Wise, J. Opt. Soc. Am. B 14, 1632 (1997) (a mean of the anisotropic masses) — from memory",
    dielectricConstant: `${MADELUNG} (static, 175; the high-frequency value is about 17)`,
  }),
  CdTe: entry("CdTe", 1.606, 0.096, 0.4, 10.2, {
    bandGapEV: `${MADELUNG} (1.606 eV at 4 K)`,
    electronMassE: `${MADELUNG}`,
    holeMassE: `${MADELUNG} (heavy hole; published values range from 0.4 to 0.8)`,
    dielectricConstant: `${MADELUNG} (static)`,
  }),
  InAs: entry("InAs", 0.418, 0.023, 0.41, 15.15, {
    bandGapEV: "Ioffe Institute, NSM Archive: Physical Properties of Semiconductors, InAs (0.415–0.418 eV at 4 K) — from memory",
    electronMassE: "Ioffe Institute, NSM Archive, InAs — from memory",
    holeMassE: "Ioffe Institute, NSM Archive, InAs (heavy hole) — from memory",
    dielectricConstant: "Ioffe Institute, NSM Archive, InAs (static) — from memory",
  }),
});

/** The numeric fields a user may set, with their physical range [min, max] (inclusive unless noted). */
export const MATERIAL_RANGES = Object.freeze({
  bandGapEV: Object.freeze({ min: 0, max: 10, unit: "eV" }),
  electronMassE: Object.freeze({ min: 0, max: 10, unit: "mₑ", exclusiveMin: true }),
  holeMassE: Object.freeze({ min: 0, max: 10, unit: "mₑ", exclusiveMin: true }),
  dielectricConstant: Object.freeze({ min: 1, max: 1000, unit: "" }),
  nonParabolicityPerEV: Object.freeze({ min: 0, max: 100, unit: "1/eV" }),
  barrierEV: Object.freeze({ min: 0, max: 20, unit: "eV", exclusiveMin: true }),
  barrierMassE: Object.freeze({ min: 0, max: 10, unit: "mₑ", exclusiveMin: true }),
});

type NumericKey = keyof typeof MATERIAL_RANGES;
const NUMERIC_KEYS = Object.keys(MATERIAL_RANGES) as NumericKey[];

/** A material named by a built-in key, or a built-in (`base`, default none) with fields changed. */
export interface MaterialOverrides {
  /** Name; when it is a built-in key and `base` is absent, that material is the starting point. */
  name?: string;
  /** Built-in material to start from. Without `name` or `base`, every numeric field must be given. */
  base?: string;
  /** Fields replacing the base's (see {@link Material} for units). */
  bandGapEV?: number;
  electronMassE?: number;
  holeMassE?: number;
  dielectricConstant?: number;
  nonParabolicityPerEV?: number;
  barrierEV?: number;
  barrierMassE?: number;
}

function builtIn(name: string, where: string): Material {
  const key = Object.keys(MATERIALS).find((k) => k.toLowerCase() === name.toLowerCase());
  if (!key) {
    throw new DotspecError(
      "sizes/unknown-material",
      `${where}: unknown material ${JSON.stringify(name)}; built-in materials are ${Object.keys(MATERIALS).join(", ")} (or give every field: ${NUMERIC_KEYS.join(", ")})`,
    );
  }
  return MATERIALS[key];
}

function checkField(key: NumericKey, value: unknown, where: string): number {
  const r = MATERIAL_RANGES[key] as { min: number; max: number; unit: string; exclusiveMin?: boolean };
  const unit = r.unit ? ` ${r.unit}` : "";
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new DotspecError("sizes/material-value", `${where}: ${key} must be a finite number${unit ? ` (in${unit})` : ""}; got ${JSON.stringify(value)}`);
  }
  const low = r.exclusiveMin ? value <= r.min : value < r.min;
  if (low || value > r.max) {
    throw new DotspecError(
      "sizes/material-value",
      `${where}: ${key} must be ${r.exclusiveMin ? "greater than" : "at least"} ${r.min} and at most ${r.max}${unit}; got ${value}. Check the unit (masses in mₑ, energies in eV).`,
    );
  }
  return value;
}

/**
 * The material to use: a built-in by name, or a built-in with some fields replaced, or a full
 * set of fields.
 *
 * Parameters
 * ----------
 * nameOrOverrides : string | MaterialOverrides
 *     A built-in name ("CdSe") or {@link MaterialOverrides}.
 * where : , optional
 *     What to name in error messages (a file name). Default "material".
 *
 * Returns
 * -------
 * Material
 *     A frozen {@link Material}.
 *
 * Throws
 * ------
 * DotspecError
 *     `sizes/unknown-material`, `sizes/material-key` (unknown or missing key), `sizes/material-value`
 *     (not a number or out of range).
 *
 * Notes
 * -----
 * 1. A string is looked up among {@link MATERIALS} (case-insensitive).
 * 2. An object starts from `base` (or from `name` when that is a built-in key); without either,
 *    every numeric field must be present.
 * 3. Each given field is checked against {@link MATERIAL_RANGES}; unknown keys are refused.
 *    Replaced fields are sourced "user override".
 *
 * Example
 * -------
 * ```ts
 * resolveMaterial({ base: "CdSe", electronMassE: 0.12 }).electronMassE; // => 0.12
 * ```
 */
export function resolveMaterial(nameOrOverrides: string | MaterialOverrides, where = "material"): Material {
  if (typeof nameOrOverrides === "string") return builtIn(nameOrOverrides, where);
  if (nameOrOverrides === null || typeof nameOrOverrides !== "object" || Array.isArray(nameOrOverrides)) {
    throw new DotspecError("sizes/material-key", `${where}: a material must be a name or an object of fields; got ${JSON.stringify(nameOrOverrides)}`);
  }
  const allowed = ["name", "base", ...NUMERIC_KEYS];
  for (const key of Object.keys(nameOrOverrides)) {
    if (!allowed.includes(key)) {
      throw new DotspecError("sizes/material-key", `${where}: unknown key ${JSON.stringify(key)}; allowed keys are ${allowed.join(", ")}`);
    }
  }
  const o = nameOrOverrides as Record<string, unknown>;
  for (const key of ["name", "base"]) {
    if (o[key] !== undefined && typeof o[key] !== "string") {
      throw new DotspecError("sizes/material-key", `${where}: ${key} must be a string; got ${JSON.stringify(o[key])}`);
    }
  }
  const baseName = (o.base as string | undefined) ?? (typeof o.name === "string" && Object.keys(MATERIALS).some((k) => k.toLowerCase() === (o.name as string).toLowerCase()) ? (o.name as string) : undefined);
  const base = baseName !== undefined ? builtIn(baseName, where) : null;
  const values: Record<string, number> = {};
  const sources: Record<string, string> = { ...(base?.sources ?? {}) };
  for (const key of NUMERIC_KEYS) {
    if (o[key] !== undefined) {
      values[key] = checkField(key, o[key], where);
      sources[key] = `user override (${where})`;
    } else if (base) values[key] = base[key];
    else {
      throw new DotspecError(
        "sizes/material-key",
        `${where}: missing key ${JSON.stringify(key)}; give it, or start from a built-in with "base" (${Object.keys(MATERIALS).join(", ")})`,
      );
    }
  }
  const name = (o.name as string | undefined) ?? (base ? `${base.name} (modified)` : "custom");
  return Object.freeze({ name, ...(values as Omit<Material, "name" | "sources">), sources: Object.freeze(sources) });
}

/**
 * Reads a material from the text of a JSON override file: an object with the keys of
 * {@link MaterialOverrides} (for example `{"base": "CdSe", "electronMassE": 0.12}`).
 *
 * Parameters
 * ----------
 * text : string
 *     The file's text.
 * source : string
 *     The file's name, used in messages and in the sources record.
 *
 * Returns
 * -------
 * Material
 *     The resolved {@link Material}.
 *
 * Throws
 * ------
 * DotspecError
 *     `sizes/material-json` (not JSON, or not an object) and the errors of {@link resolveMaterial},
 *     each naming the file.
 *
 * Example
 * -------
 * ```ts
 * parseMaterialJson('{"base": "InP", "holeMassE": 0.45}', "inp.json").holeMassE; // => 0.45
 * ```
 */
export function parseMaterialJson(text: string, source: string): Material {
  let value: unknown;
  try {
    value = parseJsonText(text, source);
  } catch (err) {
    // One line naming the line and column (the engine's own message quotes the text, line breaks and all).
    throw new DotspecError("sizes/material-json", `${(err as Error).message}; expected an object such as {"base": "CdSe", "electronMassE": 0.12}`);
  }
  if (value === null || typeof value !== "object" || Array.isArray(value)) {
    throw new DotspecError("sizes/material-json", `${source}: expected a JSON object of material fields; got ${Array.isArray(value) ? "an array" : JSON.stringify(value)}`);
  }
  return resolveMaterial(value as MaterialOverrides, source);
}
