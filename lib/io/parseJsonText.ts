/**
 * JSON text read the way a person can act on its errors: the line and column of the first
 * mistake, in one line, instead of the engine's message (which quotes the text, line breaks and
 * all). Pure, so the notebooks read a scenario or a sidecar the same way.
 */
import { DotspecError } from "../util/errors.ts";

/**
 * Parses JSON text.
 *
 * Parameters
 * ----------
 * text : string
 *     The file's text (a leading byte-order mark is ignored).
 * source : string
 *     The file's name, put in front of the error message.
 *
 * Returns
 * -------
 * unknown
 *     The parsed value (validate it before use).
 *
 * Throws
 * ------
 * DotspecError
 *     `io/invalid-json`: `SOURCE: not valid JSON: line L, column C: REASON`, one line.
 *
 * Notes
 * -----
 * 1. `JSON.parse` reads the text.
 * 2. When it fails, {@link jsonErrorAt} walks the text with the JSON grammar (ECMA-404) to the
 *    first character that cannot continue a valid text; its line and column (from 1) and what was
 *    found there make the message.
 *
 * References
 * ----------
 * ECMA International, ECMA-404 *The JSON Data Interchange Syntax*, 2nd ed. (2017).
 *
 * Example
 * -------
 * ```ts
 * parseJsonText('{"a": 1,\n "b": x}', "s.json");
 * // throws io/invalid-json: s.json: not valid JSON: line 2, column 7: unexpected "x" where a value should be
 * ```
 */
export function parseJsonText(text: string, source: string): unknown {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  try {
    return JSON.parse(body);
  } catch {
    const { at, reason } = jsonErrorAt(body);
    let line = 1;
    let lineStart = 0;
    for (let i = 0; i < at && i < body.length; i++) {
      if (body.charCodeAt(i) === 10) {
        line++;
        lineStart = i + 1;
      }
    }
    throw new DotspecError("io/invalid-json", `${source}: not valid JSON: line ${line}, column ${at - lineStart + 1}: ${reason}`);
  }
}

const NUMBER = /-?(?:0|[1-9][0-9]*)(?:\.[0-9]+)?(?:[eE][+-]?[0-9]+)?/y;
const ESCAPE = /\\(?:["\\/bfnrt]|u[0-9a-fA-F]{4})/y;

/** What a character is, for a message: `"x"`, or `U+0000` for a control character. */
function shown(c: string): string {
  const code = c.charCodeAt(0);
  return code < 0x20 || code === 0x7f || code === 0x2028 || code === 0x2029 ? `U+${code.toString(16).toUpperCase().padStart(4, "0")}` : JSON.stringify(c);
}

/**
 * Where a JSON text first goes wrong: the index of the first character that cannot continue a
 * valid text, and what is wrong there. Iterative (any depth of nesting). For a valid text it
 * returns the text's length with the reason "no error".
 *
 * Example
 * -------
 * ```ts
 * jsonErrorAt("[1, 2"); // => { at: 5, reason: "the text ends inside an array (missing \"]\")" }
 * ```
 */
export function jsonErrorAt(t: string): { at: number; reason: string } {
  let i = 0;
  const n = t.length;
  const stack: ("object" | "array")[] = [];
  const ws = () => {
    while (i < n && (t[i] === " " || t[i] === "\t" || t[i] === "\n" || t[i] === "\r")) i++;
  };
  const endInside = () =>
    stack.length === 0
      ? "the text ends where a value should be"
      : `the text ends inside an ${stack[stack.length - 1]} (missing "${stack[stack.length - 1] === "object" ? "}" : "]"}")`;
  /** Reads a string at i (t[i] is '"'); null when it is whole. */
  const string = (): { at: number; reason: string } | null => {
    i++;
    while (i < n) {
      const c = t[i];
      if (c === '"') {
        i++;
        return null;
      }
      if (c === "\\") {
        ESCAPE.lastIndex = i;
        if (!ESCAPE.test(t)) return { at: i, reason: 'a backslash that starts no escape (\\", \\\\, \\/, \\b, \\f, \\n, \\r, \\t, \\uXXXX)' };
        i = ESCAPE.lastIndex;
        continue;
      }
      if (c.charCodeAt(0) < 0x20) return { at: i, reason: `a control character ${shown(c)} inside a string (write it as an escape)` };
      i++;
    }
    return { at: n, reason: "a string is not closed (missing '\"')" };
  };
  let expect: "value" | "key" = "value";
  for (;;) {
    ws();
    if (expect === "key") {
      if (i >= n) return { at: n, reason: endInside() };
      if (t[i] !== '"') return { at: i, reason: `unexpected ${shown(t[i])} where a key in double quotes should be` };
      const bad = string();
      if (bad) return bad;
      ws();
      if (i >= n) return { at: n, reason: endInside() };
      if (t[i] !== ":") return { at: i, reason: `unexpected ${shown(t[i])} where ":" should follow the key` };
      i++;
      expect = "value";
      continue;
    }
    // A value.
    if (i >= n) return { at: n, reason: endInside() };
    const c = t[i];
    if (c === "{" || c === "[") {
      i++;
      ws();
      if (t[i] === (c === "{" ? "}" : "]")) i++;
      else {
        stack.push(c === "{" ? "object" : "array");
        expect = c === "{" ? "key" : "value";
        continue;
      }
    } else if (c === '"') {
      const bad = string();
      if (bad) return bad;
    } else if (t.startsWith("true", i)) i += 4;
    else if (t.startsWith("false", i)) i += 5;
    else if (t.startsWith("null", i)) i += 4;
    else {
      NUMBER.lastIndex = i;
      if (!NUMBER.test(t)) return { at: i, reason: `unexpected ${shown(c)} where a value should be` };
      i = NUMBER.lastIndex;
    }
    // After a value: close containers, or a comma.
    for (;;) {
      ws();
      if (stack.length === 0) {
        return i < n ? { at: i, reason: `unexpected ${shown(t[i])} after the JSON value (one value per file)` } : { at: n, reason: "no error" };
      }
      if (i >= n) return { at: n, reason: endInside() };
      const top = stack[stack.length - 1];
      if (t[i] === ",") {
        i++;
        expect = top === "object" ? "key" : "value";
        break;
      }
      if (t[i] === (top === "object" ? "}" : "]")) {
        i++;
        stack.pop();
        continue;
      }
      return { at: i, reason: `unexpected ${shown(t[i])} in an ${top}, where "," or "${top === "object" ? "}" : "]"}" should be` };
    }
  }
}
