/**
 * The voltage-division factor η a file may state in its metadata lines (`# eta: 0.88`).
 */

/** Metadata keys read as η (case-insensitive). */
export const ETA_METADATA_KEYS = ["eta", "η", "voltage division", "voltage_division", "voltage-division"] as const;

/**
 * Reads η from a curve's metadata.
 *
 * Parameters
 * ----------
 * metadata : Record<string, string>
 *     Key → value pairs from the file's comment lines.
 *
 * Returns
 * -------
 * { eta: number; key: string } | null
 *     `{ eta, key }` when a known key holds a number in (0, 1]; null otherwise (also for a value
 *     that is not such a number: the caller then falls back to its default and says so).
 *
 * Example
 * -------
 * ```ts
 * etaFromMetadata({ eta: "0.88" }); // => { eta: 0.88, key: "eta" }
 * ```
 */
export function etaFromMetadata(metadata: Record<string, string>): { eta: number; key: string } | null {
  for (const [key, value] of Object.entries(metadata)) {
    if (!(ETA_METADATA_KEYS as readonly string[]).includes(key.trim().toLowerCase())) continue;
    const eta = Number(value.trim().replace(",", "."));
    if (Number.isFinite(eta) && eta > 0 && eta <= 1) return { eta, key };
  }
  return null;
}
