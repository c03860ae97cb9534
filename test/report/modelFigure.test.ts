// modelFigure: the measured curve against the model. Structure checked directly (panels, axis
// labels with units, legend); expected values are the project's own layout contract (by
// construction) and the closed-form E = η·V of the energy axis.
import { describe, expect, it } from "vitest";
import { JSDOM } from "jsdom";
import { modelFigure, MODEL_FIGURE_DEFAULTS } from "../../lib/report/modelFigure.ts";
import { fitCurve, loadModelFigure, simulateCurve, startingScenario } from "../../lib/index.ts";
import { simulatedAnalysis } from "./fixture.ts";

const document = new JSDOM("").window.document;
const { analysis } = simulatedAnalysis("runs/dot-model.csv");
const model = simulateCurve(startingScenario(analysis), { method: "fast" });
const fit = fitCurve(analysis);

function parseXml(markup: string): Document {
  return new JSDOM(markup, { contentType: "image/svg+xml" }).window.document;
}
const panelsOf = (markup: string) => Array.from(parseXml(markup).documentElement.children).filter((e) => e.localName === "svg");

describe("modelFigure(analysis, options)", () => {
  it("MODEL_FIGURE_DEFAULTS is locked", () => {
    expect(Object.isFrozen(MODEL_FIGURE_DEFAULTS)).toBe(true);
    expect(MODEL_FIGURE_DEFAULTS).toMatchObject({ width: 760, headerHeight: 62, currentPanelHeight: 240, conductancePanelHeight: 220, residualPanelHeight: 150 });
    expect(MODEL_FIGURE_DEFAULTS.colors).toMatchObject({ model: "#D55E00", fitted: "#0072B2" });
  });

  it("without a fit: two panels (I–V under an energy axis, dI/dV over the bias axis), every axis with its unit", () => {
    const svg = modelFigure(analysis, { document, model });
    const panels = panelsOf(svg);
    expect(panels).toHaveLength(2);
    expect(panels[0].textContent).toContain("current (pA)");
    expect(panels[0].textContent).toContain("energy after η = 0.8 (eV)");
    expect(panels[1].textContent).toContain("dI/dV (nS)");
    expect(panels[1].textContent).toContain("sample bias (V)");
    expect(svg).toContain("model (chosen parameters)");
    expect(svg).not.toContain("fitted model");
  });

  it("with a fit: a third panel of residuals in the current's unit, the legend naming the fit's reduced χ²", () => {
    const svg = modelFigure(analysis, { document, model, fit });
    const D = MODEL_FIGURE_DEFAULTS;
    const root = parseXml(svg).documentElement;
    const panels = panelsOf(svg);
    expect(panels).toHaveLength(3);
    expect(Number(root.getAttribute("height"))).toBe(D.headerHeight + D.currentPanelHeight + D.conductancePanelHeight + D.residualPanelHeight);
    expect(panels[2].textContent).toContain("residual, data − fitted model (pA)");
    expect(panels[2].textContent).toContain("sample bias (V)");
    expect(svg).toContain(`reduced χ² ${fit.reducedChiSquare.toPrecision(3)}`);
  });

  it("titles the figure with the source's base name", () => {
    expect(parseXml(modelFigure(analysis, { document })).querySelector("title")!.textContent).toBe("dot-model.csv  —  measured curve and model");
  });

  it("loadModelFigure() draws the same figure", async () => {
    const draw = await loadModelFigure();
    expect(panelsOf(draw(analysis, { model })).length).toBe(2);
  });

  it("throws report/no-document without a document outside a browser", () => {
    expect(() => modelFigure(analysis)).toThrow(/document/);
  });
});
