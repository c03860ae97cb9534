/**
 * The file a worker thread of the CLI starts from: the compiled module itself in dist/, or, when
 * the CLI runs from its TypeScript sources (the tests), the `.mjs` shim beside it that registers
 * tsx first (a worker thread does not inherit the loader of its parent).
 */

/**
 * The URL of a worker's entry file.
 *
 * Parameters
 * ----------
 * name : string
 *     The worker module's name without extension, e.g. `"analyzeWorker"` (a module of lib/cli).
 * from : string
 *     `import.meta.url` of the calling module in lib/cli (or dist/cli).
 *
 * Returns
 * -------
 * URL
 *     `<name>.js` beside a compiled caller, `<name>.mjs` beside a TypeScript one.
 *
 * Example
 * -------
 * ```ts
 * workerEntry("analyzeWorker", "file:///pkg/dist/cli/runAnalyzeJobs.js").href; // => "file:///pkg/dist/cli/analyzeWorker.js"
 * ```
 */
export function workerEntry(name: string, from: string): URL {
  return new URL(`./${name}${from.endsWith(".ts") ? ".mjs" : ".js"}`, from);
}
