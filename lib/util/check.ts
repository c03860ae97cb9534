/**
 * Small shared checkers for validating options at the library boundary. Each throws a
 * {@link DotspecError} naming the parameter, the rule and the value received.
 */
import { DotspecError } from "./errors.ts";

function describe(value: unknown): string {
  if (typeof value === "string") return JSON.stringify(value);
  if (typeof value === "number" || typeof value === "boolean" || value == null) return String(value);
  try {
    return JSON.stringify(value).slice(0, 80);
  } catch {
    return Object.prototype.toString.call(value);
  }
}

/** A finite number. */
export function checkFinite(name: string, value: unknown): number {
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new DotspecError("options/not-finite", `${name} must be a finite number; got ${describe(value)}`);
  }
  return value;
}

/** A finite number > 0. */
export function checkPositive(name: string, value: unknown): number {
  const v = checkFinite(name, value);
  if (!(v > 0)) throw new DotspecError("options/not-positive", `${name} must be greater than 0; got ${v}`);
  return v;
}

/** A finite number ≥ 0. */
export function checkNonNegative(name: string, value: unknown): number {
  const v = checkFinite(name, value);
  if (!(v >= 0)) throw new DotspecError("options/negative", `${name} must be 0 or more; got ${v}`);
  return v;
}

/** A finite number in [min, max]. */
export function checkRange(name: string, value: unknown, min: number, max: number): number {
  const v = checkFinite(name, value);
  if (v < min || v > max) {
    throw new DotspecError("options/out-of-range", `${name} must be between ${min} and ${max}; got ${v}`);
  }
  return v;
}

/** An integer in [min, max]. */
export function checkInteger(name: string, value: unknown, min = -Infinity, max = Infinity): number {
  const v = checkFinite(name, value);
  if (!Number.isInteger(v) || v < min || v > max) {
    const bounds = Number.isFinite(max) ? ` between ${min} and ${max}` : Number.isFinite(min) ? ` of at least ${min}` : "";
    throw new DotspecError("options/not-integer", `${name} must be an integer${bounds}; got ${v}`);
  }
  return v;
}

/** One of a fixed set of strings. */
export function checkOneOf<T extends string>(name: string, value: unknown, allowed: readonly T[]): T {
  if (typeof value !== "string" || !allowed.includes(value as T)) {
    throw new DotspecError(
      "options/not-allowed",
      `${name} must be one of ${allowed.map((a) => JSON.stringify(a)).join(", ")}; got ${describe(value)}`,
    );
  }
  return value as T;
}

/** Rejects keys of `obj` not in `allowed` (catches typos in option objects and scenario files). */
export function checkKnownKeys(where: string, obj: object, allowed: readonly string[]): void {
  for (const key of Object.keys(obj)) {
    if (!allowed.includes(key)) {
      throw new DotspecError(
        "options/unknown-key",
        `${where}: unknown key ${JSON.stringify(key)}; allowed keys are ${allowed.join(", ")}`,
      );
    }
  }
}

/**
 * The voltage-division factor η: the fraction of the bias across the tip–dot junction,
 * η = C2/(C1 + C2), so a number in (0, 1]. One rule for every function that takes η.
 */
export function checkEta(name: string, value: unknown): number {
  const v = checkFinite(name, value);
  if (!(v > 0 && v <= 1)) {
    throw new DotspecError(
      "options/out-of-range",
      `${name} must be greater than 0 and at most 1 (the voltage-division factor η = C2/(C1 + C2)); got ${v}`,
    );
  }
  return v;
}
