// CSV cells that a spreadsheet would run as a formula are escaped with a leading single quote.
// Source of the rule: OWASP Foundation, "CSV Injection",
// https://owasp.org/www-community/attacks/CSV_Injection ("prepend each cell field with a single
// quote" when it begins with =, +, -, @, tab (0x09) or carriage return (0x0D)).
import { describe, it, expect, afterAll } from "vitest";
import { csvParse } from "d3-dsv";
import { readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { escapeFormulaCell, formatCsv, formatCurveCsv, simulateCurve } from "../../lib/index.ts";
import { FILLING, removeTempDirs, run, tempDir } from "../cli/harness.ts";

afterAll(removeTempDirs);

describe("escapeFormulaCell(value) (OWASP CSV Injection)", () => {
  it.each([
    ["=1+2", "'=1+2"],
    ['=HYPERLINK("http://x","y")', `'=HYPERLINK("http://x","y")`],
    ["+SUM(A1)", "'+SUM(A1)"],
    ["-2+3+cmd|' /C calc'!A0", "'-2+3+cmd|' /C calc'!A0"],
    ["@SUM(1)", "'@SUM(1)"],
    ["\t=1", "'\t=1"],
    ["\r=1", "'\r=1"],
  ])("text %j starts like a formula → %j", (cell, escaped) => {
    expect(escapeFormulaCell(cell)).toBe(escaped);
  });

  it.each([["dot-07"], ["InP 2=3"], [""], ["-0.5"], ["+1e-3"], ["-.25"]])("text %j is left alone (not a formula start, or a plain number)", (cell) => {
    expect(escapeFormulaCell(cell)).toBe(cell);
  });

  it("numbers, null and booleans are not text and are never escaped (a negative gap stays a number)", () => {
    expect(escapeFormulaCell(-0.25)).toBe(-0.25);
    expect(escapeFormulaCell(null)).toBe(null);
    expect(escapeFormulaCell(true)).toBe(true);
    expect(formatCsv([{ a: -0.25, b: "=x" }])).toBe("a,b\n-0.25,'=x\n");
  });
});

describe("summary.csv of a file whose metadata and name hold formulas", () => {
  it("the meta_ cells and the source cell are escaped; numbers are not", async () => {
    const dir = tempDir("dotspec-inject-");
    const file = join(dir, "=cmd.csv");
    const sim = simulateCurve(FILLING, { method: "fast", conductance: false });
    writeFileSync(file, formatCurveCsv(sim, { metadata: { dot: "=HYPERLINK(\"http://example.invalid\")", note: "@SUM(1)", eta: 0.8 } }));
    const out = join(tempDir("dotspec-out-"), "r");
    const r = await run(["analyze", file, "--out", out]);
    expect(r.code).toBe(0);
    const [row] = csvParse(readFileSync(join(out, "summary.csv"), "utf8"));
    expect(row.meta_dot).toBe(`'=HYPERLINK("http://example.invalid")`);
    expect(row.meta_note).toBe("'@SUM(1)");
    expect(row.meta_eta).toBe("0.8");
    expect(row.source).toBe(file); // a path starts with "/" here: not a formula start
    expect(Number(row.gap_V)).toBeGreaterThan(0);
  });
});
