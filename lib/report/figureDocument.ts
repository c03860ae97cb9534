/**
 * The DOM document the figures are drawn in: the page's own in a browser, a jsdom document in
 * Node, loaded on demand so that neither the public entry nor a browser bundle pulls jsdom in.
 */

/**
 * The document to draw figures in.
 *
 * Returns
 * -------
 * Promise<Document>
 *     `globalThis.document` in a browser; in Node a new jsdom document (jsdom imported on first
 *     use).
 *
 * Example
 * -------
 * ```ts
 * const doc = await figureDocument();
 * doc.createElementNS("http://www.w3.org/2000/svg", "svg").tagName;  // => "svg"
 * ```
 */
export async function figureDocument(): Promise<Document> {
  const browser = (globalThis as { document?: Document }).document;
  if (browser) return browser;
  // A variable specifier keeps browser bundlers from pulling jsdom into a page that never needs it.
  const specifier = "jsdom";
  const { JSDOM } = (await import(/* @vite-ignore */ specifier)) as typeof import("jsdom");
  return new JSDOM("").window.document;
}
