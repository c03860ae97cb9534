// Stage 3 of the importer on its own: which line names the columns.
// Expected values derived by construction: the header cells and line numbers written in each input.
import { describe, expect, it } from "vitest";
import type { Delimiter } from "../../../lib/io/cells.ts";
import { findDataRows } from "../../../lib/io/parse/dataRows.ts";
import { findHeader } from "../../../lib/io/parse/header.ts";
import { splitLines } from "../../../lib/io/parse/lines.ts";
import { expectError } from "../../helpers/errors.ts";

function headerOf(text: string, delimiter: Delimiter = ",") {
  const file = splitLines(text, "(text)");
  const table = findDataRows(file, { delimiter, decimalComma: false }, "(text)");
  const warnings: string[] = [];
  return { ...findHeader(file, delimiter, table, "(text)", warnings), warnings, metadata: Object.fromEntries(file.metadata) };
}

describe("findHeader(file, delimiter, table, src, warnings)", () => {
  it("takes the line above the data, joining a row of units to the names above it", () => {
    expect(headerOf("bias,current\n0,1\n1,2\n")).toMatchObject({ cells: ["bias", "current"], line: 1 });
    expect(headerOf("Bias,Current\nV,pA\n0,1\n1,2\n")).toMatchObject({ cells: ["Bias (V)", "Current (pA)"], line: 1 });
  });

  it("reads the lines above the header as a preamble: metadata and one warning", () => {
    const h = headerOf("Instrument: demo\nSetpoint = 1 nA\nbias,current\n0,1\n1,2\n");
    expect(h).toMatchObject({ cells: ["bias", "current"], line: 3, metadata: { Instrument: "demo", Setpoint: "1 nA" } });
    expect(h.warnings).toEqual(["lines 1–2 above the header are not data; read for key: value metadata and otherwise skipped"]);
  });

  it("uses a comment line just above the data only when it names a bias and a current column", () => {
    expect(headerOf("# bias (V) current (pA)\n0 1\n1 2\n", "whitespace")).toMatchObject({ cells: ["bias (V)", "current (pA)"], line: 1 });
    expect(headerOf("# run 7, cold\n0,1\n1,2\n")).toMatchObject({ cells: null, line: null });
  });

  it("throws io/ragged-row for a header with another number of cells than the data", () => {
    expectError(() => headerOf("bias,current,T\n0,1\n1,2\n"), "io/ragged-row", "line 1 (the header) has 3 cells", "have 2");
  });
});
