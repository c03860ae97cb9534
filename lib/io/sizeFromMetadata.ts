/**
 * The dot and size a curve file states in its own metadata lines (`# dot: …`, `# radius_nm: …`).
 */

/** Metadata keys read by {@link sizeFromMetadata} (compared in lower case). */
export const SIZE_METADATA_KEYS = Object.freeze({
  dot: Object.freeze(["dot", "dot_id"]),
  radius: Object.freeze(["radius_nm", "radius (nm)"]),
  diameter: Object.freeze(["diameter_nm", "diameter (nm)"]),
});

/** What a curve's metadata says about its dot. */
export interface MetadataSize {
  /** The dot id, or null when the metadata names none. */
  dot: string | null;
  /** Radius, nm, or null when missing or not usable (see `problem`). */
  radiusNM: number | null;
  /** The metadata key the size came from, or null. */
  key: string | null;
  /** Why a stated size cannot be used (not a number, ≤ 0), or null. */
  problem: string | null;
}

/**
 * Reads the dot id and radius from a curve's metadata.
 *
 * Parameters
 * ----------
 * metadata : Record<string, string>
 *     `curve.meta.metadata` (keys as written; compared in lower case).
 *
 * Returns
 * -------
 * MetadataSize
 *     `radius_nm` is taken as is, `diameter_nm` halved; a value that is not a number greater
 *     than 0 gives `radiusNM: null` and a `problem` in words. No size at all: `radiusNM: null`,
 *     `problem: null`.
 *
 * Example
 * -------
 * ```ts
 * sizeFromMetadata({ dot: "QD-7-A01", diameter_nm: "3.2" });
 * // => { dot: "QD-7-A01", radiusNM: 1.6, key: "diameter_nm", problem: null }
 * ```
 */
export function sizeFromMetadata(metadata: Record<string, string>): MetadataSize {
  const lower = new Map<string, [string, string]>();
  for (const [k, v] of Object.entries(metadata)) lower.set(k.trim().toLowerCase(), [k, v.trim()]);
  const find = (keys: readonly string[]) => keys.map((k) => lower.get(k)).find((e) => e !== undefined) ?? null;
  const dotEntry = find(SIZE_METADATA_KEYS.dot);
  const dot = dotEntry && dotEntry[1] !== "" ? dotEntry[1] : null;
  const r = find(SIZE_METADATA_KEYS.radius);
  const d = find(SIZE_METADATA_KEYS.diameter);
  const entry = r ?? d;
  if (!entry) return { dot, radiusNM: null, key: null, problem: null };
  const [key, text] = entry;
  const v = Number(text);
  if (text === "" || !Number.isFinite(v) || !(v > 0)) {
    return { dot, radiusNM: null, key, problem: `the metadata line "${key}: ${text}" is not a size greater than 0 nm` };
  }
  return { dot, radiusNM: r ? v : v / 2, key, problem: null };
}
