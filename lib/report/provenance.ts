/**
 * Provenance of a record, table or figure: which tool and version made it, from which input
 * (name, size, SHA-256) and with which settings. Plain data; browser-safe.
 */
import { DOTSPEC_VERSION } from "../util/version.ts";

/** Where a result came from. */
export interface Provenance {
  /** Always "dotspec". */
  tool: "dotspec";
  /** The tool's version (package.json). */
  version: string;
  /** The command or function that made it, e.g. "analyze". */
  command: string;
  /** The input file: its name as given, its size in bytes and its SHA-256; null for a curve made in memory. */
  input: { name: string; bytes: number; sha256: string } | null;
  /**
   * The options as given (only those set; defaults are recorded in the result's `settings`):
   * enough to run the same analysis again (`dotspec analyze --replay`).
   */
  options: Record<string, unknown>;
}

/**
 * A provenance record.
 *
 * Parameters
 * ----------
 * command : string
 *     What made the result ("analyze", "sizes", …).
 * input : Provenance["input"]
 *     The input's name, size and SHA-256 (see `inputDigest`), or null.
 * options : Record<string, unknown>
 *     The options as given; keys in a fixed order for byte-identical output.
 *
 * Returns
 * -------
 * Provenance
 *     With the tool's version, {@link DOTSPEC_VERSION}. No time stamp, host or thread count, so
 *     that the same input and options give the same bytes.
 *
 * Example
 * -------
 * ```ts
 * makeProvenance("analyze", null, { analyze: { eta: 0.85 } });
 * // => { tool: "dotspec", version: "0.1.0", command: "analyze", input: null, options: { analyze: { eta: 0.85 } } }
 * ```
 */
export function makeProvenance(command: string, input: Provenance["input"], options: Record<string, unknown>): Provenance {
  return { tool: "dotspec", version: DOTSPEC_VERSION, command, input: input ? { name: input.name, bytes: input.bytes, sha256: input.sha256 } : null, options };
}

/** Text safe inside an XML element. */
function xmlText(s: string): string {
  return s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;");
}

/**
 * An SVG figure with its provenance: a `<metadata>` element, first inside the root `<svg>`,
 * holding the provenance as JSON.
 *
 * Parameters
 * ----------
 * svg : string
 *     The figure, starting with its `<svg …>` element.
 * provenance : Provenance
 *     The run's provenance ({@link makeProvenance}).
 *
 * Returns
 * -------
 * string
 *     The same figure with `<metadata id="dotspec-provenance">{…}</metadata>` after the opening
 *     tag (SVG 1.1 §21: metadata is not drawn); unchanged when no root element is found.
 *
 * Example
 * -------
 * ```ts
 * const p = makeProvenance({ command: "analyze" });
 * svgWithProvenance('<svg xmlns="http://www.w3.org/2000/svg"></svg>', p);
 * // => '<svg xmlns="http://www.w3.org/2000/svg"><metadata id="dotspec-provenance">{"tool":"dotspec","version":"0.1.0","command":{"command":"analyze"},"input":null}</metadata></svg>'
 * ```
 */
export function svgWithProvenance(svg: string, provenance: Provenance): string {
  const m = /<svg\b[^>]*>/.exec(svg);
  if (!m) return svg;
  const at = m.index + m[0].length;
  return `${svg.slice(0, at)}<metadata id="dotspec-provenance">${xmlText(JSON.stringify(provenance))}</metadata>${svg.slice(at)}`;
}
