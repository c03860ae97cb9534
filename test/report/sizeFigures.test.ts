// sizeFigures: the SVG figures of a size series. Structure checked directly; the drawing as a
// snapshot with numbers rounded to 0.1 (derived from our own output, as for the curve figure:
// inspect a difference before updating it with `npx vitest run test/report -u`).
import { describe, it, expect } from "vitest";
import { JSDOM } from "jsdom";
import { sizeFigures, SIZE_FIGURE_DEFAULTS } from "../../lib/report/sizeFigures.ts";
import { loadSizeFigures, SIZE_FIGURE_FILES } from "../../lib/report/loadSizeFigures.ts";
import { sizeSeries } from "../../lib/sizes/sizeSeries.ts";
import { expectError } from "../helpers/errors.ts";
import { SERIES, SERIES_CURVES } from "./sizeSeriesFixture.ts";

const document = new JSDOM("").window.document;
const figures = sizeFigures(SERIES, { document });

function parseXml(markup: string): Document {
  return new JSDOM(markup, { contentType: "image/svg+xml" }).window.document;
}

function rounded(markup: string): string {
  return markup.replace(/-?\d+\.\d+(e-?\d+)?/g, (x) => {
    const r = Number(Number(x).toFixed(1));
    return String(Object.is(r, -0) ? 0 : r);
  });
}

describe("sizeFigures(series, options)", () => {
  it("SIZE_FIGURE_DEFAULTS and SIZE_FIGURE_FILES are locked", () => {
    expect(SIZE_FIGURE_FILES).toEqual({
      gap: "sizes-gap.svg",
      chargingEnergy: "sizes-charging-energy.svg",
      levelSpacing: "sizes-level-spacing.svg",
      valence: "sizes-valence.svg",
      optical: "sizes-optical.svg",
    });
    expect({ ...SIZE_FIGURE_DEFAULTS, colors: undefined }).toEqual({
      width: 720,
      height: 440,
      headerHeight: 64,
      legendRowHeight: 16,
      marginLeft: 64,
      marginRight: 24,
      curvePoints: 80,
      curveMargin: 0.08,
      dotRadius: 4,
      fontFamily: "system-ui, -apple-system, 'Segoe UI', sans-serif",
      colors: undefined,
    });
  });

  it("draws five well-formed standalone SVG documents with a title", () => {
    expect(Object.keys(figures).sort()).toEqual(["chargingEnergy", "gap", "levelSpacing", "optical", "valence"]);
    for (const svg of Object.values(figures)) {
      const doc = parseXml(svg!);
      const root = doc.documentElement;
      expect(root.tagName).toBe("svg");
      expect(root.getAttribute("xmlns")).toBe("http://www.w3.org/2000/svg");
      expect(doc.querySelector("title")?.textContent).toBeTruthy();
    }
  });

  it("marks one point per dot that has the quantity, with an error bar each", () => {
    // Ec: the four dots (the flagged curve of D2 is left out of the mean, not the dot).
    const doc = parseXml(figures.chargingEnergy!);
    const titles = Array.from(doc.querySelectorAll("circle title, path title")).map((t) => t.textContent ?? "");
    expect(titles.filter((t) => /^D\d: R = /.test(t))).toHaveLength(4);
  });

  it("leaves out the optical figure without optical data, and says so where a quantity is missing", () => {
    const plain = sizeFigures(sizeSeries(SERIES_CURVES.slice(0, 2)), { document });
    expect(plain.optical).toBeUndefined();
    expect(plain.gap).toContain("single-particle gap");
  });

  it("snapshot of the charging-energy figure, numbers rounded", () => {
    expect(rounded(figures.chargingEnergy!)).toMatchSnapshot();
  });

  it("needs a document outside a browser; loadSizeFigures supplies one", async () => {
    expectError(() => sizeFigures(SERIES), "report/no-document");
    const draw = await loadSizeFigures();
    expect(draw(SERIES).gap).toContain("<svg");
  });
});
