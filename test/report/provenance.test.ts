// Provenance records and their place in an SVG figure. Expectations by construction; the SVG
// <metadata> element is from SVG 1.1 (W3C Recommendation, 2011), §21.2.
import { describe, expect, it } from "vitest";
import { JSDOM } from "jsdom";
import { DOTSPEC_VERSION, failedSummaryRow, makeProvenance, summaryColumns, svgWithProvenance, SUMMARY_COLUMNS } from "../../lib/index.ts";

describe("makeProvenance(command, input, options)", () => {
  it("carries the tool, its version, the command, the input and the options — no time stamp", () => {
    const p = makeProvenance("analyze", { name: "a.csv", bytes: 3, sha256: "0".repeat(64) }, { analyze: { eta: 0.8 } });
    expect(p).toEqual({ tool: "dotspec", version: DOTSPEC_VERSION, command: "analyze", input: { name: "a.csv", bytes: 3, sha256: "0".repeat(64) }, options: { analyze: { eta: 0.8 } } });
  });
});

describe("svgWithProvenance(svg, provenance)", () => {
  it("puts a <metadata> element first inside the root, its text the provenance JSON (escaped for XML)", () => {
    const p = makeProvenance("analyze", { name: "a<&>.csv", bytes: 1, sha256: "f".repeat(64) }, {});
    const svg = svgWithProvenance('<svg xmlns="http://www.w3.org/2000/svg" width="10"><g></g></svg>', p);
    const doc = new JSDOM(svg, { contentType: "image/svg+xml" }).window.document;
    expect(doc.documentElement.firstElementChild?.localName).toBe("metadata");
    expect(JSON.parse(doc.getElementById("dotspec-provenance")!.textContent!)).toEqual(p);
  });

  it("leaves text without an <svg> element as it is", () => {
    expect(svgWithProvenance("not a figure", makeProvenance("x", null, {}))).toBe("not a figure");
  });
});

describe("failedSummaryRow(source, reason) and summaryColumns(rows)", () => {
  it("a failed row has every column, empty quantities, status failed and the reason", () => {
    const row = failedSummaryRow("bad.csv", "line 3: 3 cells, expected 2");
    expect(Object.keys(row)).toEqual([...SUMMARY_COLUMNS]);
    expect(row.status).toBe("failed");
    expect(row.reason).toBe("line 3: 3 cells, expected 2");
    expect(row.gap_V).toBeNull();
  });

  it("the meta_ columns follow the fixed ones, in order of first appearance", () => {
    const a = { ...failedSummaryRow("a", "x"), meta_dot: "1" };
    const b = { ...failedSummaryRow("b", "x"), meta_radius_nm: "2", meta_dot: "2" };
    expect(summaryColumns([a, b])).toEqual([...SUMMARY_COLUMNS, "meta_dot", "meta_radius_nm"]);
  });
});

describe("tableWithProvenance(table, provenance, inputOf?)", () => {
  it("appends tool_version and options to every row, and input_bytes / input_sha256 for per-input tables", async () => {
    const { tableWithProvenance } = await import("../../lib/index.ts");
    const p = makeProvenance("sizes", null, { binNM: 0.25 });
    const t = tableWithProvenance({ columns: ["file"], rows: [{ file: "a.csv" }, { file: "b.csv" }] }, p, (row) =>
      row.file === "a.csv" ? { name: "a.csv", bytes: 3, sha256: "a".repeat(64) } : null,
    );
    expect(t.columns).toEqual(["file", "tool_version", "options", "input_bytes", "input_sha256"]);
    expect(t.rows[0]).toEqual({ file: "a.csv", tool_version: DOTSPEC_VERSION, options: '{"binNM":0.25}', input_bytes: 3, input_sha256: "a".repeat(64) });
    expect(t.rows[1].input_sha256).toBeNull();
    expect(tableWithProvenance({ columns: ["dot"], rows: [] }, p).columns).toEqual(["dot", "tool_version", "options"]);
  });
});
