// sizeSeriesToJson / formatSizeSeriesText / sizeSeriesTables: the records of a size series.
// The JSON shape is the project's own interface (the fields issue 7 asks for); values are
// checked against the series they come from (derived by construction).
import { describe, it, expect } from "vitest";
import { sizeSeriesToJson, SIZE_SERIES_JSON_VERSION } from "../../lib/report/sizeSeriesJson.ts";
import { formatSizeSeriesText, FORMAT_SIZES_TEXT_DEFAULTS } from "../../lib/report/formatSizeSeriesText.ts";
import { sizeSeriesTables, SIZE_TABLE_FILES } from "../../lib/report/sizeSeriesTables.ts";
import { formatCsv } from "../../lib/io/formatCsv.ts";
import { SERIES, SERIES_CURVES } from "./sizeSeriesFixture.ts";

const json = sizeSeriesToJson(SERIES);

describe("sizeSeriesToJson(series)", () => {
  it("has the documented top-level and per-dot fields", () => {
    expect(SIZE_SERIES_JSON_VERSION).toBe(1);
    expect(Object.keys(json)).toEqual(["version", "material", "dots", "unassigned", "bins", "fits", "optical", "settings", "warnings"]);
    expect(Object.keys(json.dots[0])).toEqual([
      "dot", "radiusNM", "curves", "files", "regime", "regimeVotes", "gapV", "chargingEnergyV", "singleParticleGapV", "levelSpacingSPV",
      "valenceSpacingsV", "energies", "uncertainties", "counts", "sd", "flags", "warnings",
    ]);
    for (const fit of json.fits) expect(Object.keys(fit)).toEqual(expect.arrayContaining(["quantity", "model", "params", "stderr", "reducedChiSquare"]));
    expect(json.unassigned.map((u) => u.file)).toEqual(["lone.csv"]);
    expect(json.optical).toHaveLength(1);
  });
  it("carries the series' means and standard errors, in V and in eV", () => {
    const d = SERIES.dots.find((x) => x.dot === "D2")!;
    const j = json.dots.find((x) => x.dot === "D2")!;
    expect(j.gapV).toBe(d.bias.gapV!.mean);
    expect(j.uncertainties.gapV).toBe(d.bias.gapV!.standardError);
    expect(j.energies.gapEV).toBe(d.energies.gapEV!.mean);
    expect(j.energies.uncertainties.gapEV).toBe(d.energies.gapEV!.standardError);
    expect(j.counts.gapV).toBe(2);
    expect(j.flags.map((f) => [f.file, f.quantity])).toContainEqual(["d2-3.csv", "gap"]);
  });
  it("survives a JSON round trip unchanged (plain data)", () => {
    expect(JSON.parse(JSON.stringify(json))).toEqual(json);
  });
});

describe("formatSizeSeriesText(series, options)", () => {
  const text = formatSizeSeriesText(json);
  it("FORMAT_SIZES_TEXT_DEFAULTS is locked", () => {
    expect(FORMAT_SIZES_TEXT_DEFAULTS).toEqual({ decimals: 3 });
  });
  it("lists every dot, the flagged and unassigned curves, bins, fits and the pairing", () => {
    for (const d of ["D1", "D2", "D3", "D4"]) expect(text).toMatch(new RegExp(`^  ${d} `, "m"));
    expect(text).toContain("Flagged curves:");
    expect(text).toContain("d2-3.csv");
    expect(text).toContain("lone.csv (dot D9): no radius_nm or diameter_nm metadata line");
    expect(text).toContain("Size bins of 0.25 nm");
    expect(text).toContain("chargingEnergyEV · charging-sphere: dielectricConstantEff = ");
    expect(text).toContain("Optical pairing");
    expect(text.endsWith("\n")).toBe(true);
  });
});

describe("sizeSeriesTables(series, curves)", () => {
  const t = sizeSeriesTables(json, SERIES_CURVES);
  it("SIZE_TABLE_FILES is locked", () => {
    expect(SIZE_TABLE_FILES).toEqual({ curves: "sizes-curves.csv", dots: "sizes-dots.csv", bins: "sizes-bins.csv", fits: "sizes-fits.csv" });
  });
  it("one row per curve (with its status), dot, bin and fit", () => {
    expect(t.curves.rows).toHaveLength(SERIES_CURVES.length);
    const status = Object.fromEntries(t.curves.rows.map((r) => [r.file, r.status]));
    expect(status["d1-1.csv"]).toBe("used");
    expect(String(status["d2-3.csv"])).toMatch(/^flagged: gap \(left out\)/);
    expect(status["lone.csv"]).toBe("unassigned: no radius_nm or diameter_nm metadata line");
    expect(t.dots.rows.map((r) => r.dot)).toEqual(["D1", "D2", "D3", "D4"]);
    expect(t.bins.rows).toHaveLength(json.bins.length);
    expect(t.fits.rows).toHaveLength(json.fits.length);
    for (const key of ["curves", "dots", "bins", "fits"] as const) {
      const csv = formatCsv(t[key].rows, t[key].columns);
      expect(csv.split("\n")[0]).toBe(t[key].columns.join(","));
    }
  });
});
