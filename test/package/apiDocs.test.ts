// Every public export of the two entries (dist/index.d.ts for "dotspec", dist/core.d.ts for
// "dotspec/core"; the test run's global setup builds dist/) has a doc comment, which
// `npm run docs` turns into the API reference. Expected values: the project's documentation
// rule (by construction, no outside reference); the reader is checked on small declaration
// files written here, whose exports are known exactly.
import { describe, it, expect, afterAll } from "vitest";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { DIST_DIR, entryExports, undocumented } from "../../scripts/docsExports.ts";
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
