// Every public export of the two entries (dist/index.d.ts for "dotspec", dist/core.d.ts for
// "dotspec/core"; the test run's global setup builds dist/) has a doc comment, which
// `npm run docs` turns into the API reference. Expected values: the project's documentation
// rule (by construction, no outside reference); the reader is checked on small declaration
// files written here, whose exports are known exactly. The doc-comment shape (DEVELOPERS.md, "Doc
// comments") is the project's own rule as well: every public function has Parameters (when it
// takes any), Returns (unless it returns void), an Example with a ```ts block, and none of the old
// @param/@returns/@example tags; the reader of signatures is checked on declarations written here.
import { describe, it, expect, afterAll } from "vitest";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { DIST_DIR, docShapeProblems, entryExports, exampleCode, functionParts, undocumented, type ApiExport } from "../../scripts/docsExports.ts";
import { apiPages } from "../../scripts/apiPages.ts";
import { readFileSync } from "node:fs";

const dirs: string[] = [];
afterAll(() => {
  for (const d of dirs) rmSync(d, { recursive: true, force: true });
});

describe("the public API's doc comments", () => {
  it.each(["index", "core"])("every export of dist/%s.d.ts has a doc comment (offenders listed)", (entry) => {
    const exports = entryExports(join(DIST_DIR, `${entry}.d.ts`), DIST_DIR);
    expect(exports.length).toBeGreaterThan(100);
    expect(undocumented(exports)).toEqual([]);
  });

  it.each(["index", "core"])("every function of dist/%s.d.ts has the house doc shape (offenders listed)", (entry) => {
    const functions = entryExports(join(DIST_DIR, `${entry}.d.ts`), DIST_DIR).filter((e) => e.kind === "function");
    expect(functions.length).toBeGreaterThan(100);
    const offenders = functions.map((e) => [`${e.name} (${e.file})`, docShapeProblems(e).join("; ")]).filter(([, p]) => p !== "").map(([n, p]) => `${n}: ${p}`);
    expect(offenders, `${offenders.length} public function(s) without the doc shape:\n  ${offenders.join("\n  ")}`).toEqual([]);
  });

  it("the committed reference (docs/api/*.md) is what npm run docs makes of the current declarations", () => {
    const { pages } = apiPages();
    for (const [name, text] of Object.entries(pages)) {
      const committed = readFileSync(join(DIST_DIR, "..", "docs", "api", name), "utf8");
      expect(committed === text, `docs/api/${name} is out of date: run npm run docs`).toBe(true);
    }
  });

  it("the entries export what the package promises (analyzeCurve in both, readCurveFile only from dotspec)", () => {
    const names = (entry: string) => entryExports(join(DIST_DIR, `${entry}.d.ts`), DIST_DIR).map((e) => e.name);
    expect(names("core")).toContain("analyzeCurve");
    expect(names("core")).not.toContain("readCurveFile");
    expect(names("index")).toEqual(expect.arrayContaining(["analyzeCurve", "readCurveFile", "writeTextFile"]));
  });
});

describe("entryExports / undocumented (the declaration reader)", () => {
  it("follows export lists, export *, export * as and imports, and lists the undocumented exports", () => {
    const dir = mkdtempSync(join(tmpdir(), "dotspec-apidocs-"));
    dirs.push(dir);
    writeFileSync(
      join(dir, "a.d.ts"),
      [
        "/** Documented f. */",
        "export declare function f(x: number): number;",
        "export declare function g(x: string): string;",
        "/** An options type. */",
        "export interface Opts {",
        "    /** Inner comment; not the type's own. */",
        "    a?: number;",
        "}",
        "export declare const K: {",
        "    /** A field. */",
        "    readonly a: 1;",
        "};",
      ].join("\n"),
    );
    writeFileSync(join(dir, "b.d.ts"), 'import { g as h } from "./a.js";\n/** Documented k; semicolons in "strings;" and {braces} do not split it. */\nexport declare const k: "x;{";\nexport { h };\n');
    writeFileSync(join(dir, "entry.d.ts"), 'export { f, type Opts, K as Renamed } from "./a.js";\nexport * from "./b.js";\nexport * as ns from "./a.js";\n');
    const exports = entryExports(join(dir, "entry.d.ts"), dir);
    expect(exports.map((e) => [e.name, e.kind])).toEqual([
      ["ns", "namespace"],
      ["f", "function"],
      ["Opts", "interface"],
      ["Renamed", "const"],
      ["k", "const"],
      ["h", "function"],
    ]);
    expect(exports.find((e) => e.name === "f")!.doc).toBe("Documented f.");
    expect(exports.find((e) => e.name === "Opts")!.signature).toContain("a?: number;");
    expect(undocumented(exports)).toEqual(["ns.g (a.d.ts)", "ns.K (a.d.ts)", "Renamed (a.d.ts)", "h (a.d.ts)"]);
  });
});

describe("docShapeProblems / functionParts / exampleCode (the shape check)", () => {
  const fn = (signature: string, doc: string): ApiExport => ({ name: "f", kind: "function", signature, doc, file: "f.d.ts" });
  const section = (title: string, body: string) => `${title}\n${"-".repeat(title.length)}\n${body}\n`;
  const example = section("Example", "```ts\nf(1); // => 1\n```");

  it("reads a declaration's parameters and return type, generics and object types included", () => {
    expect(functionParts("function f(x: number, o?: { a: (y: number) => void }): number;")).toEqual({ parameters: "x: number, o?: { a: (y: number) => void }", returns: "number" });
    expect(functionParts("function g<T extends { k: string }>(items: readonly T[]): Map<string, T>;")).toEqual({ parameters: "items: readonly T[]", returns: "Map<string, T>" });
    expect(functionParts("function h(): void;")).toEqual({ parameters: "", returns: "void" });
  });

  it("lists each missing section and the old tags; a complete comment passes", () => {
    const full = ["Summary.", "", section("Parameters", "x : number\n    A value."), section("Returns", "number\n    The value."), example].join("\n");
    expect(docShapeProblems(fn("function f(x: number): number;", full))).toEqual([]);
    expect(docShapeProblems(fn("function f(x: number): number;", "Summary.\n@param x a value\n@returns the value"))).toEqual([
      "no Parameters section",
      "no Returns section",
      "no Example section",
      "old @param/@returns/@example/@throws tags",
    ]);
    expect(docShapeProblems(fn("function f(x: number): number;", full.replace("```ts", "```")))).toEqual(["no ```ts block under Example"]);
  });

  it("asks no Parameters of a function without any, no Returns of void or Promise<void>, nothing of a non-function", () => {
    expect(docShapeProblems(fn("function f(): void;", `Summary.\n\n${example}`))).toEqual([]);
    expect(docShapeProblems(fn("function f(): Promise<void>;", `Summary.\n\n${example}`))).toEqual([]);
    expect(docShapeProblems(fn("function f(): Promise<number>;", `Summary.\n\n${example}`))).toEqual(["no Returns section"]);
    expect(docShapeProblems({ name: "K", kind: "const", signature: "const K: 1;", doc: "A constant.", file: "k.d.ts" })).toEqual([]);
  });

  it("takes the first ```ts block under Example", () => {
    expect(exampleCode(`Summary.\n\n${section("Notes", "```ts\nnot this\n```")}\n${example}`)).toBe("f(1); // => 1");
    expect(exampleCode("Summary.")).toBe("");
  });
});
