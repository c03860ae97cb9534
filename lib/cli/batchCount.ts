/**
 * The one line that ends a batch on stderr: how many inputs were done, how many failed, and the
 * warnings.
 */

/**
 * The closing line of a batch: `dotspec: 5 done, 1 failed, 3 warnings (in 2 files)`.
 *
 * Example
 * -------
 * ```ts
 * batchCount(5, 1, 3, 2); // => "dotspec: 5 done, 1 failed, 3 warnings (in 2 files)\n"
 * ```
 */
export function batchCount(done: number, failed: number, warnings: number, warnedFiles: number): string {
  const w = `${warnings} warning${warnings === 1 ? "" : "s"}`;
  const where = warnings ? ` (in ${warnedFiles} file${warnedFiles === 1 ? "" : "s"})` : "";
  return `dotspec: ${done} done, ${failed} failed, ${w}${where}\n`;
}
