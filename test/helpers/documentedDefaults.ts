/**
 * Reads the defaults that an options interface documents, from the source text: for each field of
 * `interface NAME { … }`, the value written after "Default" in its doc comment (a number, a quoted
 * string, true/false, or a list of numbers `[a, b]`), and the DEFAULTS constant it names, if any (`Default: X_DEFAULTS.key (3)`).
 * Fields whose default is described in words ("measured from the curve") have no literal and are
 * left out. Used by the lock tests so that a doc comment and its DEFAULTS object cannot drift.
 */
import { readFileSync } from "node:fs";
import { expect } from "vitest";

export interface DocumentedDefault {
  field: string;
  /** The literal after "Default", or undefined when only words follow. */
  literal: number | string | boolean | number[] | undefined;
  /** `X_DEFAULTS.key` named in the comment, if any. */
  constant: { object: string; key: string } | null;
  /** The whole comment, for failure messages. */
  comment: string;
}

export function documentedDefaults(sourceUrl: URL, interfaceName: string): DocumentedDefault[] {
  const text = readFileSync(sourceUrl, "utf8");
  const start = text.search(new RegExp(`export interface ${interfaceName}\\b[^{]*\\{`));
  if (start < 0) throw new Error(`interface ${interfaceName} not found in ${sourceUrl.pathname}`);
  let depth = 0;
  let end = start;
  for (let i = text.indexOf("{", start); i < text.length; i++) {
    if (text[i] === "{") depth++;
    else if (text[i] === "}" && --depth === 0) {
      end = i;
      break;
    }
  }
  const body = text.slice(text.indexOf("{", start) + 1, end);
  const out: DocumentedDefault[] = [];
  const field = /\/\*\*([\s\S]*?)\*\/\s*(?:readonly\s+)?(\w+)\??\s*:/g;
  for (let m = field.exec(body); m; m = field.exec(body)) {
    const comment = m[1].replace(/^\s*\*\s?/gm, " ").replace(/\s+/g, " ").trim();
    const after = /\bDefault[s]?\b:?\s*(.*)$/.exec(comment);
    if (!after) continue;
    const rest = after[1];
    const constMatch = /\b([A-Z][A-Z_]*_DEFAULTS)\.(\w+)/.exec(rest);
    let literal: DocumentedDefault["literal"];
    const lit = /^(?:[A-Z][A-Z_]*_DEFAULTS\.\w+\s*\()?\s*(-?\d+(?:\.\d+)?(?:e-?\d+)?|"[^"]*"|true|false|\[\s*-?\d[\d.e\s,-]*\])(?!\w|\.\d)/.exec(rest);
    if (lit) {
      const t = lit[1];
      literal = t.startsWith('"') ? t.slice(1, -1) : t === "true" ? true : t === "false" ? false : t.startsWith("[") ? (JSON.parse(t) as number[]) : Number(t);
    }
    out.push({ field: m[2], literal, constant: constMatch ? { object: constMatch[1], key: constMatch[2] } : null, comment });
  }
  return out;
}

/**
 * Asserts that `defaults` is frozen, that every literal default documented on `interfaceName`'s
 * fields equals the same key of `defaults`, and that the documented fields cover all its keys.
 */
export function expectDocumentedDefaults(sourceUrl: URL, interfaceName: string, defaults: Readonly<Record<string, unknown>>): void {
  expect(Object.isFrozen(defaults)).toBe(true);
  const documented = documentedDefaults(sourceUrl, interfaceName);
  for (const d of documented) expect(d.literal, d.comment).toEqual(defaults[d.field]);
  expect(documented.map((d) => d.field).sort()).toEqual(Object.keys(defaults).sort());
}
