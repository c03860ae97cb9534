/**
 * The JSON sidecar of a grid stored as NPY: the axes and the current unit.
 */
import type { GridAxis } from "../grid/gridCube.ts";
import { DotspecError } from "../util/errors.ts";
import { parseUnit, type UnitInfo } from "./units.ts";

/** What a grid sidecar says. */
export interface GridSidecar {
  xNM: GridAxis;
  yNM: GridAxis;
  biasV: GridAxis;
  /** The current unit (A, mA, µA, nA, pA, fA). */
  currentUnit: UnitInfo;
}

const KEYS = ["xNM", "yNM", "biasV", "currentUnit", "description"];

/**
 * Validates a grid sidecar: `{ "xNM": [x0, dx, nx], "yNM": [y0, dy, ny], "biasV": [v0, dv, nbias],
 * "currentUnit": "A" }` (positions in nm, bias in V, steps > 0, counts ≥ 1; `description` is allowed
 * and ignored).
 *
 * Parameters
 * ----------
 * value : unknown
 *     The parsed JSON.
 * source : string, optional
 *     The sidecar's file name, for messages. Default "sidecar".
 *
 * Returns
 * -------
 * GridSidecar
 *
 * Throws
 * ------
 * DotspecError
 *     `io/bad-sidecar` naming the key and the rule (missing key, unknown key, not three numbers,
 *     step ≤ 0, count not a positive integer); `io/unknown-unit` for a unit that is not a current unit.
 *
 * Example
 * -------
 * ```ts
 * parseGridSidecar({ xNM: [0, 0.5, 16], yNM: [0, 0.5, 16], biasV: [-1, 0.005, 401], currentUnit: "pA" }).currentUnit.scale;
 * // => 1e-12
 * ```
 */
export function parseGridSidecar(value: unknown, source = "sidecar"): GridSidecar {
  const fail = (msg: string) => new DotspecError("io/bad-sidecar", `${source}: ${msg}`);
  if (typeof value !== "object" || value === null || Array.isArray(value)) throw fail("must be a JSON object {xNM, yNM, biasV, currentUnit}");
  const o = value as Record<string, unknown>;
  for (const k of Object.keys(o)) if (!KEYS.includes(k)) throw fail(`unknown key ${JSON.stringify(k)}; allowed keys are ${KEYS.join(", ")}`);
  const axis = (key: "xNM" | "yNM" | "biasV", unit: string): GridAxis => {
    const a = o[key];
    if (a === undefined) throw fail(`${key} is missing; give [start, step, count] in ${unit}`);
    if (!Array.isArray(a) || a.length !== 3 || !a.every((x) => typeof x === "number" && Number.isFinite(x))) {
      throw fail(`${key} must be three numbers [start, step, count] in ${unit}; got ${JSON.stringify(a)}`);
    }
    const [start, step, count] = a as number[];
    if (!(step > 0)) throw fail(`${key} step must be greater than 0; got ${step}${key === "biasV" ? " (store the sweep with the bias ascending)" : ""}`);
    if (!(Number.isInteger(count) && count >= 1)) throw fail(`${key} count must be a positive integer; got ${count}`);
    return { start, step, count };
  };
  const xNM = axis("xNM", "nm");
  const yNM = axis("yNM", "nm");
  const biasV = axis("biasV", "V");
  if (typeof o.currentUnit !== "string") throw fail(`currentUnit must be a string such as "A" or "pA"; got ${JSON.stringify(o.currentUnit)}`);
  const currentUnit = parseUnit(o.currentUnit, "current", `${source}: currentUnit`);
  return { xNM, yNM, biasV, currentUnit };
}
