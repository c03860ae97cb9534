/**
 * Dependencies loaded on first use where the platform allows it. mathjs (about half a second to
 * import) and ml-matrix with the Levenberg–Marquardt solver (about 50 ms) serve only the size
 * formulas and the fits, yet a static import would load them with every command, including a
 * plain `dotspec analyze`. The functions that use them stay synchronous.
 */

/** A synchronous `require`, as Node's `module.createRequire` returns it. */
type RequireFn = (id: string) => unknown;

interface NodeProcess {
  /** Node ≥ 20.16: built-in modules without a static import (which a browser bundle could not load). */
  getBuiltinModule?: (id: "node:module") => { createRequire(from: string): RequireFn };
  /** `require_module` is true where `require` loads ES modules (Node ≥ 20.19, ≥ 22.12). */
  features?: { require_module?: boolean };
}

const nodeProcess = (globalThis as { process?: NodeProcess }).process;
const requireHere: RequireFn | null =
  typeof nodeProcess?.getBuiltinModule === "function" ? nodeProcess.getBuiltinModule("node:module").createRequire(import.meta.url) : null;

/**
 * A getter of a dependency that loads it on its first call where that can be done synchronously,
 * and otherwise now.
 *
 * Parameters
 * ----------
 * specifier : string
 *     The package name, e.g. `"ml-matrix"`.
 * format : "commonjs" | "module"
 *     What `require(specifier)` loads: a CommonJS build, or an ES module (which needs Node's
 *     `require(esm)`).
 * load : () => Promise<T>
 *     `() => import("<specifier>")` written out with the literal name, so bundlers see it.
 *
 * Returns
 * -------
 * Promise<() => T>
 *     Resolves at once; the getter returns the module namespace, the same object on every call.
 *     Await it at the top level of the module that uses the dependency.
 *
 * Notes
 * -----
 * 1. In Node ≥ 20.16 (`process.getBuiltinModule`), a CommonJS dependency is loaded with
 *    `require` on the getter's first call; an ES-module dependency too where `require` loads ES
 *    modules (`process.features.require_module`, Node ≥ 20.19).
 * 2. Anywhere else (a browser bundle, an older Node), `load()` runs now, as a static import
 *    would, and the getter returns its result; nothing waits at the call.
 * 3. The only state is that cache, filled once (the same value on every call).
 *
 * Example
 * -------
 * ```ts
 * const mathjs = await lazyModule<typeof import("mathjs")>("mathjs", "commonjs", () => import("mathjs"));
 * mathjs().evaluate("1 + 2"); // => 3 (mathjs is loaded here, not at start-up)
 * ```
 */
export async function lazyModule<T>(specifier: string, format: "commonjs" | "module", load: () => Promise<T>): Promise<() => T> {
  if (canRequire(format)) return lazyModuleNow<T>(specifier, format);
  const loaded = await load();
  return () => loaded;
}

/** Whether `require` loads a dependency of this format synchronously here. */
const canRequire = (format: "commonjs" | "module") => requireHere !== null && (format === "commonjs" || nodeProcess?.features?.require_module === true);

/**
 * The getter `lazyModule` would give, made at once: for the command's CommonJS bundle, where a
 * module cannot wait at its top level. The build (scripts/build.mjs) puts it in place of
 * `await lazyModule(…)` in that bundle only; the library's own modules keep `lazyModule`.
 *
 * Parameters
 * ----------
 * specifier : string
 *     The package name, e.g. `"ml-matrix"`.
 * format : "commonjs" | "module"
 *     What `require(specifier)` loads (see `lazyModule`).
 *
 * Returns
 * -------
 * () => T
 *     Loads the dependency with `require` on its first call; the same object on every call.
 *
 * Notes
 * -----
 * Throws where `require` cannot load the dependency synchronously (no `process.getBuiltinModule`,
 * or an ES module without `require(esm)`); bin/dotspec.js runs the bundle only where both hold.
 *
 * Example
 * -------
 * ```ts
 * const mathjs = lazyModuleNow<typeof import("mathjs")>("mathjs", "commonjs");
 * mathjs().evaluate("1 + 2"); // => 3
 * ```
 */
export function lazyModuleNow<T>(specifier: string, format: "commonjs" | "module"): () => T {
  const require = requireHere;
  if (require === null || !canRequire(format)) {
    throw new Error(`lazyModuleNow: ${specifier} cannot be loaded synchronously here (needs Node's require${format === "module" ? " of ES modules, Node ≥ 20.19" : ""})`);
  }
  let loaded: T | undefined;
  return () => (loaded ??= require(specifier) as T);
}
