/**
 * Shared checks of the reader fuzz suites (test/robustness/*.fuzz.test.ts): a reader either
 * returns a result whose numbers are all finite, or throws a DotspecError whose message is one
 * line, names the source and, for errors about a row, names the line.
 */
import { expect } from "vitest";
import { isDotspecError } from "../../lib/util/errors.ts";

/** What the error of a reader must say. */
export interface ErrorRules {
  /** The message starts with `${source}: ` (null: the reader does not know a file name). */
  source: string | null;
  /** Codes whose message must name a line (`line N`). */
  lineCodes?: readonly string[];
}

/**
 * Runs `read`: "ok" after `check` on its result, or the DotspecError's code after checking its
 * message. Anything else thrown fails the property.
 */
export function outcomeOf<T>(read: () => T, rules: ErrorRules, check: (result: T) => void = (r) => expectFiniteNumbers(r, "result")): string {
  let result: T;
  try {
    result = read();
  } catch (e) {
    if (!isDotspecError(e)) throw e;
    expect(e.message, e.message.slice(0, 200)).not.toMatch(/[\r\n\u2028\u2029]/); // one line
    if (rules.source !== null && !e.message.startsWith(`${rules.source}: `)) expect.fail(`message does not name ${rules.source}: ${e.message.slice(0, 200)}`);
    if (rules.lineCodes?.includes(e.code) && !/line \d+/.test(e.message)) expect.fail(`${e.code} does not name the line: ${e.message.slice(0, 200)}`);
    expect(e.message.length, "a message a person can read").toBeLessThan(2000);
    return e.code;
  }
  check(result);
  return "ok";
}

/** Every number anywhere in a plain value (arrays, typed arrays, objects) is finite. */
export function expectFiniteNumbers(value: unknown, path: string): void {
  if (typeof value === "number") {
    if (!Number.isFinite(value)) expect.fail(`${path} is ${value}`);
  } else if (ArrayBuffer.isView(value) && !(value instanceof DataView)) {
    const a = value as unknown as ArrayLike<number>;
    for (let i = 0; i < a.length; i++) if (!Number.isFinite(a[i])) expect.fail(`${path}[${i}] is ${a[i]}`);
  } else if (Array.isArray(value)) value.forEach((v, i) => expectFiniteNumbers(v, `${path}[${i}]`));
  else if (value instanceof Map) for (const [k, v] of value) expectFiniteNumbers(v, `${path}.${String(k)}`);
  else if (value !== null && typeof value === "object") for (const [k, v] of Object.entries(value)) expectFiniteNumbers(v, `${path}.${k}`);
}

/** UTF-16 bytes of a text with its byte-order mark. */
export function utf16Bytes(text: string, bigEndian: boolean): Uint8Array {
  const out = new Uint8Array(2 + 2 * text.length);
  out.set(bigEndian ? [0xfe, 0xff] : [0xff, 0xfe]);
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    out[2 + 2 * i + (bigEndian ? 0 : 1)] = c >> 8;
    out[2 + 2 * i + (bigEndian ? 1 : 0)] = c & 0xff;
  }
  return out;
}

/** UTF-8 bytes of a text. */
export const utf8Bytes = (text: string): Uint8Array => new TextEncoder().encode(text);

/** Bytes of several parts joined. */
export function joinBytes(...parts: Uint8Array[]): Uint8Array {
  const out = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
  let at = 0;
  for (const p of parts) {
    out.set(p, at);
    at += p.length;
  }
  return out;
}
