// curveFigure: the SVG of one analysed curve. Structure checked directly; the drawing as a
// snapshot with numbers rounded (the habit of Observable Plot's own tests).
import { describe, it, expect } from "vitest";
import { JSDOM } from "jsdom";
import { curveFigure, CURVE_FIGURE_DEFAULTS } from "../../lib/report/curveFigure.ts";
import { loadCurveFigure, multipletColor, MULTIPLET_COLORS, NO_MULTIPLET, SECOND_JUNCTION, DotspecError, analyzeCurve } from "../../lib/index.ts";
import { lowEtaDraw } from "../helpers/lowEtaDraw.ts";
import { simulatedAnalysis } from "./fixture.ts";
import { FILLING, chargingPeakV } from "../cli/harness.ts";
import { expectClose } from "../helpers/expectClose.ts";

const document = new JSDOM("").window.document;
const { curve, analysis } = simulatedAnalysis("dots/dot-filling.csv");
const svg = curveFigure(analysis, { document, curve });

/** Parses SVG markup as XML (image/svg+xml): jsdom throws on markup that is not well-formed. */
function parseXml(markup: string): Document {
  return new JSDOM(markup, { contentType: "image/svg+xml" }).window.document;
}

/** An attribute as inherited: from the element or its nearest ancestor that sets it. */
function inherited(el: Element, name: string): string | null {
  for (let e: Element | null = el; e; e = e.parentElement) if (e.hasAttribute(name)) return e.getAttribute(name);
  return null;
}

/** Numbers rounded to one decimal, so the snapshot does not hang on floating-point noise. */
function rounded(markup: string): string {
  return markup.replace(/-?\d+\.\d+(e-?\d+)?/g, (x) => {
    const r = Number(Number(x).toFixed(1));
    return String(Object.is(r, -0) ? 0 : r);
  });
}

describe("curveFigure(analysis, options)", () => {
  it("CURVE_FIGURE_DEFAULTS and MULTIPLET_COLORS are locked", () => {
    expect(CURVE_FIGURE_DEFAULTS).toMatchInlineSnapshot(`
      {
        "colors": {
          "background": "#ffffff",
          "gap": "#f3e3b5",
          "line": "#263238",
          "normalized": "#4a4a8c",
          "subtitle": "#5c5c60",
          "sweeps": "#90a4ae",
          "title": "#1d1d1f",
          "zero": "#c9c9c9",
        },
        "conductancePanelHeight": 290,
        "currentPanelHeight": 220,
        "dotRadius": 4.5,
        "energyTicks": 10,
        "fontFamily": "system-ui, -apple-system, 'Segoe UI', sans-serif",
        "headerHeight": 78,
        "legendRowHeight": 16,
        "marginLeft": 72,
        "marginRight": 24,
        "normalizedPanelHeight": 170,
        "pointsPerPixel": 2,
        "width": 760,
      }
    `);
    expect(MULTIPLET_COLORS).toMatchInlineSnapshot(`
      {
        "d": "#009E73",
        "f": "#CC79A7",
        "none": "#B3B3B3",
        "other": "#000000",
        "p": "#0072B2",
        "s": "#D55E00",
        "valence": [
          "#E69F00",
          "#56B4E9",
        ],
      }
    `);
  });

  it("is well-formed standalone SVG: XML root <svg> with the SVG namespace", () => {
    expect(svg.startsWith("<svg ")).toBe(true);
    const root = parseXml(svg).documentElement;
    expect(root.localName).toBe("svg");
    expect(root.namespaceURI).toBe("http://www.w3.org/2000/svg");
    expect(svg).toMatch(/^<svg [^>]*xmlns="http:\/\/www\.w3\.org\/2000\/svg"/);
  });

  it("the XML check rejects markup that is not well-formed (so the test above means something)", () => {
    expect(() => parseXml('<svg xmlns="http://www.w3.org/2000/svg"><g></svg>')).toThrow();
  });

  it("holds two panels (I–V above dI/dV) sharing the width, at their y offsets", () => {
    const root = parseXml(svg).documentElement;
    const panels = Array.from(root.children).filter((e) => e.localName === "svg");
    const D = CURVE_FIGURE_DEFAULTS;
    expect(panels.map((p) => [p.getAttribute("y"), p.getAttribute("width")])).toEqual([
      [String(D.headerHeight), String(D.width)],
      [String(D.headerHeight + D.currentPanelHeight), String(D.width)],
    ]);
    expect(root.getAttribute("height")).toBe(String(D.headerHeight + D.currentPanelHeight + D.conductancePanelHeight));
    expect(panels[0].textContent).toContain("current (pA)");
    expect(panels[1].textContent).toContain("dI/dV (nS)");
    expect(panels[1].textContent).toContain("sample bias (V)");
    // Plot's HTML stylesheet (height: auto) would resize a nested <svg>: it is left out.
    expect(root.getElementsByTagName("style")).toHaveLength(0);
  });

  it("wraps the legend into more rows on a narrow figure and moves the panels down by the rows added", () => {
    const D = CURVE_FIGURE_DEFAULTS;
    const root = parseXml(curveFigure(analysis, { document, width: 360 })).documentElement;
    const rows = new Set(Array.from(root.getElementsByTagName("g")[0].getElementsByTagName("rect")).map((r) => r.getAttribute("y"))).size;
    expect(rows).toBeGreaterThan(1);
    const header = D.headerHeight + (rows - 1) * D.legendRowHeight;
    const panels = Array.from(root.children).filter((e) => e.localName === "svg");
    expect(panels.map((p) => Number(p.getAttribute("y")))).toEqual([header, header + D.currentPanelHeight]);
    expect(Number(root.getAttribute("height"))).toBe(header + D.currentPanelHeight + D.conductancePanelHeight);
  });

  it("marks each peak with one circle, coloured by its multiplet (grey without one)", () => {
    // The fixture's dot (FILLING: ε_s = 0.5, ε_p = 0.8, ε_v = −0.6 eV, g = 2, 6, 2; Ec = 0.1 eV;
    // η = 0.8; bias −1.2…1.6 V). Closed form: the (n+1)-th carrier on level ε charges at
    // ±(|ε| + Ec(n + ½))/η. s: n = 0, 1; p: n = 2, 3, 4 (n = 5 lies beyond 1.6 V); the VB level:
    // n = 0, 1. The p level entered while s holds one carrier (n = 1, at 1.1875 V) is a charging
    // satellite, outside every multiplet.
    const expected = [
      { v: chargingPeakV(0.5, 0), label: "s", color: MULTIPLET_COLORS.s },
      { v: chargingPeakV(0.5, 1), label: "s", color: MULTIPLET_COLORS.s },
      ...[2, 3, 4].map((n) => ({ v: chargingPeakV(0.8, n), label: "p", color: MULTIPLET_COLORS.p })),
      { v: chargingPeakV(-0.6, 0), label: "v1", color: MULTIPLET_COLORS.valence[0] },
      { v: chargingPeakV(-0.6, 1), label: "v1", color: MULTIPLET_COLORS.valence[0] },
      { v: chargingPeakV(0.8, 1), label: "no multiplet", color: MULTIPLET_COLORS.none },
    ];
    // A quarter of Ec in bias: half the distance to the nearest other peak, so each circle
    // matches one position at most.
    const tolV = (0.25 * FILLING.chargingEnergyEV) / FILLING.eta;
    const circles = Array.from(parseXml(svg).getElementsByTagName("circle")).map((c) => {
      const title = c.getElementsByTagName("title")[0]?.textContent ?? "";
      const m = /^(.+): (-?\d+\.\d+) V ±/.exec(title);
      expect(m, `circle title ${JSON.stringify(title)}`).not.toBeNull();
      return { label: m![1], biasV: Number(m![2]), fill: inherited(c, "fill") };
    });
    expect(circles).toHaveLength(expected.length);
    for (const e of expected) {
      const hits = circles.filter((c) => Math.abs(c.biasV - e.v) < tolV);
      expect(hits, `one circle within ${tolV} V of ${e.v} V`).toHaveLength(1);
      expect([hits[0].label, hits[0].fill]).toEqual([e.label, e.color]);
    }
  });

  it("draws the individual sweeps faintly behind the mean when there are several", () => {
    const doc = parseXml(svg);
    const sweepPaths = Array.from(doc.getElementsByTagName("path")).filter((p) => inherited(p, "stroke") === CURVE_FIGURE_DEFAULTS.colors.sweeps);
    expect(sweepPaths).toHaveLength(curve.sweeps.length);
  });

  it("titles the figure with the source's base name (not its folders), the regime and η", () => {
    const title = parseXml(svg).documentElement.getElementsByTagName("title")[0].textContent;
    expect(title).toBe("dot-filling.csv  —  shell filling, η = 0.8");
    expect(analysis.source).toBe("dots/dot-filling.csv");
  });

  it("labels every axis with its unit, and puts an energy axis (eV) whose ticks sit at E/η on the bias axis", () => {
    const root = parseXml(svg).documentElement;
    const panels = Array.from(root.children).filter((e) => e.localName === "svg");
    const text = panels.map((p) => p.textContent ?? "").join(" ");
    for (const label of ["current (pA)", "dI/dV (nS)", "sample bias (V)", "energy after η = 0.8 (eV)"]) expect(text).toContain(label);
    // Energy ticks: a tick labelled E lies where the bias axis reads E/η (closed form: E = η·e·V).
    const ticks = Array.from(panels[0].querySelectorAll("g[aria-label='x-axis tick label'] text"));
    expect(ticks.length).toBeGreaterThan(3);
    const bottomTicks = Array.from(panels[1].querySelectorAll("g[aria-label='x-axis tick label'] text"));
    const xOf = (t: Element) => Number(/translate\(([-\d.]+)/.exec(t.getAttribute("transform") ?? "")?.[1]);
    // Bias ticks give the linear map px ↔ V.
    const [b0, b1] = [bottomTicks[0], bottomTicks[bottomTicks.length - 1]];
    const v0 = Number(b0.textContent!.replace("−", "-"));
    const v1 = Number(b1.textContent!.replace("−", "-"));
    const pxPerV = (xOf(b1) - xOf(b0)) / (v1 - v0);
    for (const t of ticks) {
      const e = Number(t.textContent!.replace("−", "-"));
      expectClose(xOf(t), xOf(b0) + (e / 0.8 - v0) * pxPerV, { atol: 0.6, what: `energy tick ${e} eV` });
    }
  });

  it("says on its root how bias maps to px: a peak's dot sits where the linear map puts its bias", () => {
    const root = parseXml(svg).documentElement;
    const [v0, v1] = root.getAttribute("data-bias-range-v")!.split(" ").map(Number);
    const [x0, x1] = root.getAttribute("data-plot-x-px")!.split(" ").map(Number);
    expect(Number(root.getAttribute("data-eta"))).toBe(0.8);
    const circles = Array.from(root.getElementsByTagName("circle"));
    const byTitle = new Map(circles.map((c) => [c.textContent, Number(c.getAttribute("cx"))]));
    for (const p of analysis.peaks) {
      const cx = [...byTitle].find(([t]) => t!.includes(`: ${p.biasV.toFixed(4)} V`))![1];
      // Linear scale (closed form): px = x0 + (V − v0)/(v1 − v0)·(x1 − x0)
      expectClose(cx, x0 + ((p.biasV - v0) / (v1 - v0)) * (x1 - x0), { atol: 0.01, what: `dot of the peak at ${p.biasV} V` });
    }
  });

  it("calls peaks in no multiplet by the one word of the text report, in the legend and the tooltips", () => {
    const forced = analyzeCurve(curve, { eta: 0.8, regime: "undetermined" });
    const markup = curveFigure(forced, { document });
    expect(NO_MULTIPLET).toBe("no multiplet");
    if (forced.peaks.length && forced.assignment.multiplets.length === 0) expect(markup).toContain(">no multiplet<");
    expect(markup).not.toMatch(/satellite/);
  });

  it("adds the normalised conductance as a third panel on request, with the bias axis moved to it", () => {
    const D = CURVE_FIGURE_DEFAULTS;
    const root = parseXml(curveFigure(analysis, { document, normalized: true })).documentElement;
    const panels = Array.from(root.children).filter((e) => e.localName === "svg");
    expect(panels).toHaveLength(3);
    expect(Number(root.getAttribute("height"))).toBe(D.headerHeight + D.currentPanelHeight + D.conductancePanelHeight + D.normalizedPanelHeight);
    expect(panels[2].textContent).toContain("sample bias (V)");
    expect(panels[1].textContent).not.toContain("sample bias (V)");
    expect(panels[2].textContent).toContain("(dI/dV)/(I/V)");
  });

  it("shades the zero-conductance region in both panels", () => {
    const fills = Array.from(parseXml(svg).getElementsByTagName("rect")).filter((r) => inherited(r, "fill") === CURVE_FIGURE_DEFAULTS.colors.gap);
    expect(analysis.gapEdgesV).not.toBeNull();
    // Two panel rectangles and the legend swatch.
    expect(fills.length).toBe(3);
  });

  it("escapes a source name with markup characters", () => {
    const hostile = simulatedAnalysis('a<b>&"c".csv');
    const markup = curveFigure(hostile.analysis, { document });
    expect(parseXml(markup).documentElement.getElementsByTagName("title")[0].textContent).toContain('a<b>&"c".csv');
  });

  it("matches the stored drawing (numbers rounded to 0.1)", async () => {
    await expect(rounded(svg)).toMatchFileSnapshot("./__snapshots__/curveFigure.svg");
  });

  it("throws report/no-document without a document outside a browser", () => {
    expect(() => curveFigure(analysis)).toThrow(DotspecError);
    expect(() => curveFigure(analysis)).toThrow(/document/);
  });
});

describe("loadCurveFigure()", () => {
  it("loads Plot and jsdom on demand and returns the same drawing", async () => {
    const draw = await loadCurveFigure();
    expect(rounded(draw(analysis, { curve }))).toBe(rounded(svg));
  });
});

describe("multipletColor(label)", () => {
  it("gives shells and valence groups their colours and grey to peaks without a multiplet", () => {
    expect(multipletColor("s")).toBe(MULTIPLET_COLORS.s);
    expect(multipletColor("p")).toBe(MULTIPLET_COLORS.p);
    expect(multipletColor("v1")).toBe(MULTIPLET_COLORS.valence[0]);
    expect(multipletColor("v5")).toBe(MULTIPLET_COLORS.valence[0]);
    expect(multipletColor(null)).toBe(MULTIPLET_COLORS.none);
    expect(multipletColor("x")).toBe(MULTIPLET_COLORS.other);
  });
});

describe("curveFigure: the VB ladder's resonances taken out of the current (low η)", () => {
  // Draw 123 of the low-η mix: the VB ladder's second-junction resonances are subtracted before
  // the CB peaks are found (analyzeCurve note 9), so they are no peaks of the list; the figure
  // still marks each, as a hollow circle on the measured dI/dV.
  const { analysis: low } = lowEtaDraw(123);
  const root = parseXml(curveFigure(low, { document })).documentElement;
  const hollow = Array.from(root.getElementsByTagName("circle")).filter((c) => /taken out of the current: /.test(c.textContent ?? ""));

  it("draws one hollow circle in the second-junction colour at each subtracted step inside the bias range", () => {
    const steps = low.subtractedResonances!.steps.filter((q) => q.biasV >= low.conductance.biasV[0] && q.biasV <= low.conductance.biasV.at(-1)!);
    expect(steps.length).toBeGreaterThan(0);
    expect(hollow).toHaveLength(steps.length);
    const [v0, v1] = root.getAttribute("data-bias-range-v")!.split(" ").map(Number);
    const [x0, x1] = root.getAttribute("data-plot-x-px")!.split(" ").map(Number);
    for (const q of steps) {
      const c = hollow.find((h) => h.textContent!.includes(`: ${q.biasV.toFixed(4)} V`))!;
      expect(c, `circle of the step at ${q.biasV} V`).toBeDefined();
      // Linear scale (closed form): px = x0 + (V − v0)/(v1 − v0)·(x1 − x0)
      expectClose(Number(c.getAttribute("cx")), x0 + ((q.biasV - v0) / (v1 - v0)) * (x1 - x0), { atol: 0.01, what: `circle of the step at ${q.biasV} V` });
      expect([inherited(c, "fill"), inherited(c, "stroke")]).toEqual([CURVE_FIGURE_DEFAULTS.colors.background, multipletColor(SECOND_JUNCTION)]);
    }
    // Named in the legend with a hollow swatch.
    const legend = root.getElementsByTagName("g")[0];
    const entry = Array.from(legend.getElementsByTagName("text")).findIndex((t) => t.textContent === `${SECOND_JUNCTION}, VB ladder's, taken out of the current`);
    expect(entry).toBeGreaterThanOrEqual(0);
    const swatch = legend.getElementsByTagName("rect")[entry];
    expect([swatch.getAttribute("fill"), swatch.getAttribute("stroke")]).toEqual([CURVE_FIGURE_DEFAULTS.colors.background, multipletColor(SECOND_JUNCTION)]);
  });

  it("titles the figure and its energy axis with η to four significant digits (the draw's η has fifteen)", () => {
    const eta = low.assignment.energies.eta;
    expect(String(eta).length).toBeGreaterThan(10);
    const shown = String(Number(eta.toPrecision(4)));
    expect(root.getElementsByTagName("title")[0].textContent).toContain(`η = ${shown}`);
    expect(root.textContent).toContain(`energy after η = ${shown} (eV)`);
    expect(root.textContent).not.toContain(String(eta));
  });

  it("draws none where nothing was taken out (η = 0.8: no resonance in the window)", () => {
    expect(analysis.subtractedResonances).toBeNull();
    expect(svg).not.toContain("taken out of the current");
  });
});
