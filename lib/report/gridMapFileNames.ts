/**
 * The file names of the grid map figures: what `dotspec grid --out` calls `maps/<name>.svg` and
 * what the grid notebook offers for download, so both name a map the same way.
 */

/**
 * A safe, distinct file name (without extension) for each map label.
 *
 * Parameters
 * ----------
 * labels : readonly string[]
 *     The map labels in order ("s", "p1", "p (multiplet)", "at 0.700 V", …).
 *
 * Returns
 * -------
 * string[]
 *     One name per label: runs of characters other than letters, digits, ".", "+" and "-" become
 *     "_", leading and trailing "_" are dropped ("map" if nothing is left), and a name already
 *     used gets "_" appended until it is new.
 *
 * Example
 * -------
 * ```ts
 * gridMapFileNames(["s", "p (multiplet)", "at 0.700 V", "s"]); // => ["s", "p_multiplet", "at_0.700_V", "s_"]
 * ```
 */
export function gridMapFileNames(labels: readonly string[]): string[] {
  const used = new Set<string>();
  return labels.map((label) => {
    let name = label.replace(/[^A-Za-z0-9.+-]+/g, "_").replace(/^_+|_+$/g, "") || "map";
    while (used.has(name)) name += "_";
    used.add(name);
    return name;
  });
}
