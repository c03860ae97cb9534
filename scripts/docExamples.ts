/**
 * The Example blocks of the public functions' doc comments, run as ES modules against the built
 * library (dist/): what test/package/docExamples.test.ts checks, and a tool for writing examples:
 *
 *   npm run build && node bin/run-ts.mjs scripts/docExamples.ts [name…]
 *
 * prints, for each public function (or those named), whether its example ran and the value of
 * every statement marked with an output comment, beside the output the comment states.
 *
 * How an example is read (DEVELOPERS.md, "Doc comments"):
 * 1. The code is the first ```ts block under "Example" in the compiled declaration's comment.
 * 2. It is split into top-level statements (strings, comments and brackets skipped or balanced;
 *    a statement ends at a `;` outside brackets or at the `}` that closes a top-level block).
 * 3. The first `// => …` comment after a statement (on its line or the lines below, before the
 *    next statement) states that statement's output: the value of an expression statement, of
 *    the one name a `const`/`let` declares, or of the argument of `console.log(…)`. A
 *    `// throws …` comment says the statement throws: it is run inside a function and must throw.
 * 4. Type annotations are removed (esbuild), the public names the code uses are imported from
 *    dist/index.js, and the module is imported by a runner in a child Node process whose working
 *    directory is the repository root (so `sample-curves/…` paths work) and whose os.tmpdir() is
 *    a scratch folder removed after the run.
 */
import { execFileSync } from "node:child_process";
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { dirname, join } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import { transformSync } from "esbuild";
import { DIST_DIR, entryExports, exampleCode, topLevelSpans, type ApiExport } from "./docsExports.ts";

const ROOT = join(dirname(fileURLToPath(import.meta.url)), "..");

/** One top-level statement of an example, with the output comment that follows it. */
export interface ExampleStatement {
  /** The statement's source text. */
  text: string;
  /** The text after `// =>` (trimmed), or "throws" for a `// throws` comment; null when none. */
  output: string | null;
}

/**
 * The top-level statements of an example's code and their output comments.
 *
 * Parameters
 * ----------
 * code : string
 *     The example's TypeScript code.
 *
 * Returns
 * -------
 * ExampleStatement[]
 *     In order of the source.
 */
export function exampleStatements(code: string): ExampleStatement[] {
  // A block statement (for, if, function, …) ends at its closing brace unless more follows on its line.
  const blockEnds = (src: string, start: number, at: number) => /^[\t ]*(\n|$)/.test(src.slice(at + 1)) && !/^(const|let|var)\s|^[\w$.]+\s*=|^\(|^\[/.test(src.slice(start, at));
  const spans = topLevelSpans(code, blockEnds).map(({ start, end }) => [start, end] as const);
  return spans.map(([from, to], k) => {
    const gap = code.slice(to, k + 1 < spans.length ? spans[k + 1][0] : code.length);
    const m = /\/\/\s*(=>|throws\b)[ \t]*([^\n]*)/.exec(gap);
    const output = m ? (m[1] === "=>" ? m[2].trim() : "throws") : null;
    return { text: code.slice(from, to), output };
  });
}

/** Names an example declares or imports itself at top level (not imported from the library for it). */
function ownNames(statements: readonly ExampleStatement[]): Set<string> {
  const names = new Set<string>();
  for (const { text } of statements) {
    let m: RegExpExecArray | null;
    if ((m = /^(?:async\s+)?(?:function\*?|class)\s+([\w$]+)/.exec(text))) names.add(m[1]);
    else if ((m = /^(?:const|let|var)\s+([\s\S]*?)(?:=|$)/.exec(text))) for (const n of m[1].match(/[A-Za-z_$][\w$]*/g) ?? []) names.add(n);
    else if ((m = /^import\s+([\s\S]*?)\s+from\s/.exec(text))) for (const n of m[1].match(/[A-Za-z_$][\w$]*/g) ?? []) names.add(n);
  }
  return names;
}

/** The statement rewritten so that the harness records its output (index k). */
function instrument(s: ExampleStatement, k: number): string {
  const text = s.text.replace(/;\s*$/, "");
  if (s.output === null) return s.text;
  if (s.output === "throws") return `await __throws(${k}, async () => { ${text}; });`;
  const log = /^console\.log\(([\s\S]*)\)$/.exec(text);
  if (log) return `__out(${k}, ${log[1]});`;
  const decl = /^(?:const|let|var)\s+([A-Za-z_$][\w$]*)\s*(?::[^=]+)?=/.exec(text);
  if (decl) return `${text};\n__out(${k}, ${decl[1]});`;
  if (/^(?:const|let|var|import|export|function|class|if|for|while|do|switch|try|return|throw)\b|^\{/.test(text)) return `${text};\n__noValue(${k});`;
  return `__out(${k}, (${text}));`;
}

/** What one example gave. */
export interface ExampleResult {
  /** The function's name. */
  name: string;
  /** The example's code, as the doc comment gives it. */
  code: string;
  /** The error it threw (message and first stack lines), or null when it ran to its end. */
  error: string | null;
  /** Each output comment, with what the statement gave. */
  outputs: {
    statement: string;
    printed: string;
    /** "number", "string", …, "threw" (for `// throws` that threw), "no-throw", "no-value". */
    kind: string;
    /** The value when it is a number. */
    value: number | null;
    /** The value as a short text. */
    shown: string;
  }[];
}

const HARNESS = `
const show = (v) => {
  if (typeof v === "number" || typeof v === "bigint" || typeof v === "boolean" || v == null) return String(v);
  if (typeof v === "string") return JSON.stringify(v);
  if (ArrayBuffer.isView(v)) v = Array.from(v);
  try { const s = JSON.stringify(v); return s === undefined ? String(v) : s.length > 300 ? s.slice(0, 300) + "…" : s; } catch { return String(v); }
};
const record = (k, kind, v) => globalThis.__results.at(-1).outputs.push({ k, kind, value: typeof v === "number" ? v : null, shown: show(v) });
export function __out(k, ...values) { const v = values.length === 1 ? values[0] : values; record(k, typeof v === "object" && v !== null && !ArrayBuffer.isView(v) && Array.isArray(v) ? "array" : v === null ? "null" : typeof v, v); }
export function __noValue(k) { record(k, "no-value", undefined); }
export async function __throws(k, f) {
  try { await f(); } catch (e) { record(k, "threw", (e && e.code ? e.code + ": " : "") + (e && e.message)); return; }
  record(k, "no-throw", undefined);
}
`;

const RUNNER = `
import { writeFileSync } from "node:fs";
globalThis.__results = [];
for (const [name, file] of JSON.parse(process.argv[2])) {
  globalThis.__results.push({ name, error: null, outputs: [] });
  try { await import(file); }
  catch (e) { globalThis.__results.at(-1).error = String(e && e.stack ? e.stack.split("\\n").slice(0, 4).join("\\n") : e); }
}
writeFileSync(process.argv[3], JSON.stringify(globalThis.__results));
`;

/**
 * Runs the examples of the given public functions against dist/ (which must be built).
 *
 * Parameters
 * ----------
 * functions : ApiExport[]
 *     Public functions whose doc comments carry an example ({@link exampleCode}); others are skipped.
 *
 * Returns
 * -------
 * ExampleResult[]
 *     One per function with an example, in the given order.
 */
export function runExamples(functions: readonly ApiExport[]): ExampleResult[] {
  const dir = mkdtempSync(join(tmpdir(), "dotspec-examples-"));
  try {
    const index = entryExports(join(DIST_DIR, "index.d.ts"), DIST_DIR);
    const values = index.filter((e) => !["interface", "type"].includes(e.kind)).map((e) => e.name);
    writeFileSync(join(dir, "harness.mjs"), HARNESS);
    writeFileSync(join(dir, "runner.mjs"), RUNNER);
    const jobs: [string, string][] = [];
    const parsed = new Map<string, { code: string; statements: ExampleStatement[] }>();
    for (const [n, f] of functions.entries()) {
      const code = exampleCode(f.doc);
      if (!code) continue;
      const statements = exampleStatements(code);
      const own = ownNames(statements);
      const used = values.filter((v) => !own.has(v) && new RegExp(`(^|[^\\w$.]|\\.\\.\\.)${v.replace(/\$/g, "\\$")}\\b`).test(code));
      const body = statements.map((s, k) => instrument(s, k)).join("\n");
      const js = transformSync(body, { loader: "ts", format: "esm", target: "es2022" }).code;
      const file = join(dir, `example-${n}-${f.name}.mjs`);
      const dist = pathToFileURL(join(DIST_DIR, "index.js")).href;
      writeFileSync(file, `import { __out, __throws, __noValue } from "./harness.mjs";\n${used.length ? `import { ${used.join(", ")} } from ${JSON.stringify(dist)};\n` : ""}${js}`);
      jobs.push([f.name, pathToFileURL(file).href]);
      parsed.set(f.name, { code, statements });
    }
    const out = join(dir, "results.json");
    const scratch = join(dir, "scratch");
    mkdirSync(scratch);
    execFileSync(process.execPath, [join(dir, "runner.mjs"), JSON.stringify(jobs), out], {
      cwd: ROOT,
      // Scratch files of the examples (os.tmpdir()) land in this run's folder, removed below.
      env: { ...process.env, TMPDIR: scratch, TMP: scratch, TEMP: scratch },
      stdio: ["ignore", "ignore", "inherit"],
      timeout: 300_000,
    });
    const raw = JSON.parse(readFileSync(out, "utf8")) as {
      name: string;
      error: string | null;
      outputs: { k: number; kind: string; value: number | null; shown: string }[];
    }[];
    return raw.map((r) => {
      const { code, statements } = parsed.get(r.name)!;
      return {
        name: r.name,
        code,
        error: r.error,
        outputs: r.outputs.map((o) => ({ statement: statements[o.k].text, printed: statements[o.k].output!, kind: o.kind, value: o.value, shown: o.shown })),
      };
    });
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/**
 * The number an output comment states, with the tolerance its digits imply, or null when the
 * output is not a plain number.
 *
 * A plain number is the whole comment, or its first word when a space and more text follow
 * (`15 (30 mV at 2 mV per step)`, `0.48 eV`), optionally after "≈" or "~": digits with an
 * optional sign (- or −), decimal point and exponent. The tolerance is half a unit of the last
 * printed digit (1.23 → ±0.005; 1.5e-9 → ±0.05e-9; 15 → ±0.5). Anything else (strings in
 * quotes, true/false/null, arrays, objects, words, numbers followed by a comma or another
 * character) is not a plain number.
 *
 * Parameters
 * ----------
 * printed : string
 *     The text after `// =>`.
 *
 * Returns
 * -------
 * { value: number; tolerance: number } | null
 *     The stated number and half a unit of its last digit.
 */
export function statedNumber(printed: string): { value: number; tolerance: number } | null {
  const m = /^(?:[≈~]\s*)?([-−]?)(\d+)(?:\.(\d+))?(?:e([-+−]?\d+))?(?:\s|$)/.exec(printed);
  if (!m) return null;
  const decimals = (m[3] ?? "").length;
  const exponent = m[4] ? Number(m[4].replace("−", "-")) : 0;
  const value = Number(`${m[1] ? "-" : ""}${m[2]}.${m[3] ?? "0"}e${exponent}`);
  const places = decimals - exponent;
  return { value, tolerance: places >= 0 ? 0.5 / 10 ** places : 0.5 * 10 ** -places };
}

/** Whether a stated number matches the value to its printed digits (a relative 1e-12 for the rounding of the tolerance itself). */
export function matchesStated(actual: number, stated: { value: number; tolerance: number }): boolean {
  return Math.abs(actual - stated.value) <= stated.tolerance * (1 + 1e-12) + 1e-12 * Math.abs(stated.value);
}

/** The public functions of both entries (each once), in the index entry's order. */
export function publicFunctions(): ApiExport[] {
  const seen = new Set<string>();
  const out: ApiExport[] = [];
  for (const entry of ["index", "core"]) {
    for (const e of entryExports(join(DIST_DIR, `${entry}.d.ts`), DIST_DIR)) {
      if (e.kind === "function" && !seen.has(e.name)) {
        seen.add(e.name);
        out.push(e);
      }
    }
  }
  return out;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const wanted = process.argv.slice(2);
  const fns = publicFunctions().filter((f) => wanted.length === 0 || wanted.includes(f.name));
  for (const r of runExamples(fns)) {
    console.log(`${r.error ? "FAIL" : "ok  "} ${r.name}${r.error ? `\n     ${r.error.replace(/\n/g, "\n     ")}` : ""}`);
    for (const o of r.outputs) {
      const stated = statedNumber(o.printed);
      const flag = stated ? (o.value !== null && matchesStated(o.value, stated) ? "=" : "≠") : " ";
      console.log(`     ${flag} ${o.statement.split("\n")[0].slice(0, 70)}\n         stated: ${o.printed}\n         gave:   ${o.kind} ${o.shown}`);
    }
  }
  const missing = fns.filter((f) => !exampleCode(f.doc)).map((f) => f.name);
  if (missing.length) console.log(`no example: ${missing.join(", ")}`);
}
