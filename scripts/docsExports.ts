/**
 * The public exports of a package entry, read from the compiled declarations (dist/*.d.ts, which
 * keep the doc comments): each export's name, kind, declaration text and doc comment. Used by
 * `npm run docs` (scripts/docs.ts, the API reference) and by the check that every public export
 * is documented (test/package/apiDocs.test.ts).
 *
 * A small reader of declaration files, not a TypeScript parser: it splits a file into top-level
 * statements (skipping strings and comments, balancing brackets), keeps the doc comment in front
 * of each, and follows `export … from` and `import … from` to the module that declares a name.
 */
import { readFileSync } from "node:fs";
import { dirname, join, relative, resolve } from "node:path";
import { fileURLToPath } from "node:url";

/** One public export of an entry. */
export interface ApiExport {
  /** The name a user imports. */
  name: string;
  /** function, const, class, interface, type, enum or namespace. */
  kind: string;
  /** The declaration as the .d.ts gives it (all overloads of a function), without `export declare`. */
  signature: string;
  /** The doc comment's text (without the comment markers), "" when there is none. */
  doc: string;
  /** The declaration file, relative to the dist folder (e.g. `pipeline/analyzeCurve.d.ts`). */
  file: string;
  /** For a namespace (`export * as constants`): its members. */
  members?: ApiExport[];
}

interface Statement {
  text: string;
  doc: string;
}

/** One top-level statement found by {@link topLevelSpans}: [start, end) in the source, and the doc comment right before it. */
export interface StatementSpan {
  start: number;
  end: number;
  /** The last `/** … *\/` comment between the previous statement and this one, "" when none. */
  doc: string;
}

/**
 * The top-level statements of TypeScript source: strings and comments skipped, brackets
 * balanced; a statement ends at a `;` outside brackets, or at a top-level `}` where
 * `endsAtBrace(source, start, at)` says so (`at` is the brace's index). Shared by the declaration
 * reader here and the doc examples' runner (scripts/docExamples.ts).
 */
export function topLevelSpans(source: string, endsAtBrace: (source: string, start: number, at: number) => boolean): StatementSpan[] {
  const out: StatementSpan[] = [];
  let depth = 0;
  let start = -1;
  let doc = "";
  let pendingDoc = "";
  let i = 0;
  const end = (at: number) => {
    out.push({ start, end: at, doc });
    start = -1;
    doc = "";
  };
  while (i < source.length) {
    const c = source[i];
    const next = source[i + 1];
    if (c === "/" && next === "*") {
      const close = source.indexOf("*/", i + 2);
      const stop = close < 0 ? source.length : close + 2;
      if (depth === 0 && start < 0 && source[i + 2] === "*") pendingDoc = source.slice(i, stop);
      i = stop;
      continue;
    }
    if (c === "/" && next === "/") {
      const nl = source.indexOf("\n", i);
      i = nl < 0 ? source.length : nl + 1;
      continue;
    }
    if (/\s/.test(c)) {
      i++;
      continue;
    }
    if (start < 0) {
      start = i;
      doc = pendingDoc;
      pendingDoc = "";
    }
    if (c === '"' || c === "'" || c === "`") {
      let j = i + 1;
      while (j < source.length && source[j] !== c) j += source[j] === "\\" ? 2 : 1;
      i = j + 1;
      continue;
    }
    if (c === "{" || c === "(" || c === "[") depth++;
    else if (c === "}" || c === ")" || c === "]") {
      depth--;
      if (depth === 0 && c === "}" && endsAtBrace(source, start, i)) end(i + 1);
    } else if (c === ";" && depth === 0) end(i + 1);
    i++;
  }
  if (start >= 0) end(source.length);
  return out;
}

/** Top-level statements of a declaration file, each with the doc comment right before it. */
function statements(source: string): Statement[] {
  // interface, class, enum and namespace bodies end their statement without a semicolon.
  const bodyEnds = (src: string, start: number, at: number) => /^(export\s+)?(declare\s+)?(interface|class|abstract\s+class|enum|namespace|module)\b/.test(src.slice(start, at));
  return topLevelSpans(source, bodyEnds).map(({ start, end, doc }) => ({ text: source.slice(start, end).trim(), doc }));
}

/** The text of a doc comment without its markers and leading asterisks. */
export function commentText(comment: string): string {
  return comment
    .replace(/^\/\*\*/, "")
    .replace(/\*\/$/, "")
    .split("\n")
    .map((line) => line.replace(/^\s*\* ?/, ""))
    .join("\n")
    .trim();
}

const DECLARATION = /^(?:export\s+)?(?:declare\s+)?(function|const|let|var|class|abstract\s+class|interface|type|enum|namespace)\s+([A-Za-z_$][\w$]*)/;

interface Module {
  /** Declarations by name (all statements, exported or not). */
  declared: Map<string, Statement[]>;
  /** Names exported by this module → where they come from. */
  exported: Map<string, { from: string | null; name: string; typeOnly: boolean }>;
  /** `export * from` targets. */
  star: string[];
  /** `export * as NS from` → target. */
  namespaces: Map<string, string>;
  /** Imported names → [module, original name]. */
  imported: Map<string, [string, string]>;
}

const modules = new Map<string, Module>();

/** Parses the names of `{ a, type b, c as d }` into [exported name, original name]. */
function namedList(list: string): [string, string][] {
  return list
    .split(",")
    .map((part) => part.trim().replace(/^type\s+/, ""))
    .filter(Boolean)
    .map((part) => {
      const m = /^([\w$]+)(?:\s+as\s+([\w$]+))?$/.exec(part);
      if (!m) throw new Error(`docs: cannot read the export list item ${JSON.stringify(part)}`);
      return [m[2] ?? m[1], m[1]];
    });
}

function readModule(file: string): Module {
  const cached = modules.get(file);
  if (cached) return cached;
  const mod: Module = { declared: new Map(), exported: new Map(), star: [], namespaces: new Map(), imported: new Map() };
  modules.set(file, mod);
  const target = (spec: string) => resolve(dirname(file), spec.replace(/\.js$/, ".d.ts"));
  for (const st of statements(readFileSync(file, "utf8"))) {
    let m: RegExpExecArray | null;
    if ((m = /^export\s+\*\s+as\s+([\w$]+)\s+from\s+["']([^"']+)["']/.exec(st.text))) mod.namespaces.set(m[1], target(m[2]));
    else if ((m = /^export\s+\*\s+from\s+["']([^"']+)["']/.exec(st.text))) mod.star.push(target(m[1]));
    else if ((m = /^export\s+(type\s+)?\{([^}]*)\}\s*(?:from\s+["']([^"']+)["'])?/.exec(st.text))) {
      for (const [exportedName, original] of namedList(m[2])) mod.exported.set(exportedName, { from: m[3] ? target(m[3]) : null, name: original, typeOnly: Boolean(m[1]) });
    } else if ((m = /^import\s+(?:type\s+)?\{([^}]*)\}\s*from\s+["']([^"']+)["']/.exec(st.text))) {
      if (m[2].startsWith(".")) for (const [local, original] of namedList(m[1])) mod.imported.set(local, [target(m[2]), original]);
    } else if ((m = DECLARATION.exec(st.text))) {
      const list = mod.declared.get(m[2]) ?? [];
      list.push(st);
      mod.declared.set(m[2], list);
      if (/^export\s/.test(st.text)) mod.exported.set(m[2], { from: null, name: m[2], typeOnly: false });
    }
  }
  return mod;
}

/** Finds the declaration of `name` as exported by (or declared in) `file`. */
function resolveExport(file: string, name: string, distDir: string, seen = new Set<string>()): Omit<ApiExport, "name"> | null {
  const key = `${file}#${name}`;
  if (seen.has(key)) return null;
  seen.add(key);
  const mod = readModule(file);
  const ns = mod.namespaces.get(name);
  if (ns) return { kind: "namespace", signature: `namespace ${name}`, doc: "", file: relative(distDir, ns), members: entryExports(ns, distDir) };
  const exp = mod.exported.get(name);
  if (exp?.from) return resolveExport(exp.from, exp.name, distDir, seen);
  const local = exp ? exp.name : name;
  const decls = mod.declared.get(local);
  if (decls) {
    const kind = DECLARATION.exec(decls[0].text)![1].replace(/^abstract\s+/, "");
    const signature = decls.map((d) => d.text.replace(/^export\s+/, "").replace(/^declare\s+/, "")).join("\n");
    const doc = decls.map((d) => commentText(d.doc)).find((d) => d.length > 0) ?? "";
    return { kind, signature, doc, file: relative(distDir, file) };
  }
  const imp = mod.imported.get(local);
  if (imp) return resolveExport(imp[0], imp[1], distDir, seen);
  if (!exp) for (const star of mod.star) {
    const found = resolveExport(star, name, distDir, seen);
    if (found) return found;
  }
  return null;
}

/** Every name a module exports, in order: its own list, then those of `export *` targets. */
function exportedNames(file: string, seen = new Set<string>()): string[] {
  if (seen.has(file)) return [];
  seen.add(file);
  const mod = readModule(file);
  const names = [...mod.namespaces.keys(), ...mod.exported.keys()];
  for (const star of mod.star) for (const n of exportedNames(star, seen)) if (!names.includes(n)) names.push(n);
  return names;
}

/**
 * The public exports of one entry's declaration file.
 *
 * Parameters
 * ----------
 * entryFile : string
 *     The entry's .d.ts, e.g. `dist/index.d.ts`.
 * distDir : string
 *     The dist folder (paths in the result are relative to it).
 *
 * Returns
 * -------
 * ApiExport[]
 *     One per exported name, in the entry's order; a namespace lists its members.
 *
 * Throws
 * ------
 * Error
 *     When an exported name cannot be traced to its declaration.
 */
export function entryExports(entryFile: string, distDir: string): ApiExport[] {
  const file = resolve(entryFile);
  return exportedNames(file).map((name) => {
    const found = resolveExport(file, name, resolve(distDir));
    if (!found) throw new Error(`docs: cannot find the declaration of ${name} exported by ${entryFile}`);
    return { name, ...found };
  });
}

/** The public exports without a doc comment (a namespace counts its members), as `name (file)`. */
export function undocumented(exports: readonly ApiExport[]): string[] {
  const out: string[] = [];
  for (const e of exports) {
    if (e.members) out.push(...undocumented(e.members).map((m) => `${e.name}.${m}`));
    else if (e.doc.length === 0) out.push(`${e.name} (${e.file})`);
  }
  return out;
}

/** The dist folder of this repository. */
export const DIST_DIR = join(dirname(fileURLToPath(import.meta.url)), "..", "dist");

/** The parameter list and return type of one function declaration (`function f<T>(a: A): R;`). */
export function functionParts(declaration: string): { parameters: string; returns: string } | null {
  const m = /^function\s+[\w$]+\s*/.exec(declaration);
  if (!m) return null;
  let i = m[0].length;
  if (declaration[i] === "<") {
    for (let depth = 0; i < declaration.length; i++) {
      if (declaration[i] === "<") depth++;
      else if (declaration[i] === ">" && declaration[i - 1] !== "=" && --depth === 0) break;
    }
    i++;
  }
  if (declaration[i] !== "(") return null;
  const open = i;
  for (let depth = 0; i < declaration.length; i++) {
    const c = declaration[i];
    if (c === "(" || c === "{" || c === "[") depth++;
    else if ((c === ")" || c === "}" || c === "]") && --depth === 0) break;
  }
  const rest = /^\)\s*:\s*([\s\S]*?);?\s*$/.exec(declaration.slice(i));
  return { parameters: declaration.slice(open + 1, i).trim(), returns: rest ? rest[1].trim() : "" };
}

/** The old tag style that the house shape replaces. */
const OLD_TAGS = /(^|\s)@(param|returns?|example|throws)\b/;

/**
 * What a public function's doc comment lacks of the house shape (DEVELOPERS.md, "Doc comments"):
 * a "Parameters" section when a declaration takes parameters, "Returns" unless every overload
 * returns void or Promise<void>, "Example" always, and none of the old `@param`/`@returns`/
 * `@example`/`@throws` tags. Other kinds of export have no required sections.
 *
 * Parameters
 * ----------
 * e : ApiExport
 *     One export, as {@link entryExports} gives it.
 *
 * Returns
 * -------
 * string[]
 *     The problems (e.g. `no Returns section`); empty when the comment has the shape.
 */
export function docShapeProblems(e: ApiExport): string[] {
  if (e.kind !== "function") return [];
  const overloads = e.signature.split("\n").filter((line) => /^function\s/.test(line)).map(functionParts);
  const parts = overloads.filter((p): p is { parameters: string; returns: string } => p !== null);
  const problems: string[] = [];
  const has = (title: string) => new RegExp(`(^|\\n)${title}\\n-{3,}\\n`).test(e.doc);
  if (parts.some((p) => p.parameters.length > 0) && !has("Parameters")) problems.push("no Parameters section");
  if (parts.some((p) => !/^(void|Promise<void>)$/.test(p.returns)) && !has("Returns")) problems.push("no Returns section");
  if (!has("Examples?")) problems.push("no Example section");
  else if (!/(^|\n)Examples?\n-{3,}\n[\s\S]*```ts\n/.test(e.doc)) problems.push("no ```ts block under Example");
  if (OLD_TAGS.test(e.doc)) problems.push("old @param/@returns/@example/@throws tags");
  return problems;
}

/**
 * The code of a doc comment's first ```ts block under "Example" (or "Examples"), "" when none.
 *
 * Parameters
 * ----------
 * doc : string
 *     A doc comment's text ({@link ApiExport}.doc).
 *
 * Returns
 * -------
 * string
 *     The code between the fences, without them.
 */
export function exampleCode(doc: string): string {
  const m = /(?:^|\n)Examples?\n-{3,}\n[\s\S]*?```ts\n([\s\S]*?)\n```/.exec(doc);
  return m ? m[1] : "";
}
