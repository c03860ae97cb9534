// The browser-safe entry lib/core.ts: nothing it imports, directly or through other modules,
// may load a Node built-in or jsdom at import time (a browser bundle cannot). Expected values are
// the project's own contract (by construction): the import graph is read from the source files.
import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { dirname, resolve } from "node:path";
import * as core from "../lib/core.ts";
import * as entry from "../lib/index.ts";

/** Static import/export specifiers of a TypeScript module (type-only imports excluded). */
function staticSpecifiers(file: string): string[] {
  const text = readFileSync(file, "utf8");
  const out: string[] = [];
  for (const m of text.matchAll(/^\s*(?:import|export)\s+(type\s+)?[^;]*?from\s+"([^"]+)"/gms)) if (!m[1]) out.push(m[2]);
  for (const m of text.matchAll(/^\s*import\s+"([^"]+)"/gm)) out.push(m[1]);
  return out;
}

function importGraph(start: string): { files: Set<string>; external: Set<string> } {
  const files = new Set<string>();
  const external = new Set<string>();
  const stack = [resolve(start)];
  while (stack.length) {
    const file = stack.pop()!;
    if (files.has(file)) continue;
    files.add(file);
    for (const s of staticSpecifiers(file)) {
      if (s.startsWith(".")) stack.push(resolve(dirname(file), s));
      else external.add(s);
    }
  }
  return { files, external };
}

describe("lib/core.ts", () => {
  it("imports no Node built-in and no jsdom, directly or indirectly", () => {
    const { files, external } = importGraph("lib/core.ts");
    expect(files.size).toBeGreaterThan(20);
    const node = [...external].filter((s) => s.startsWith("node:") || s === "jsdom" || s === "fs" || s === "path");
    expect(node).toEqual([]);
  });

  it("lib/index.ts does reach node:fs (so the check above can fail)", () => {
    expect([...importGraph("lib/index.ts").external]).toContain("node:fs");
  });

  it("exports the parsers, the pipeline, the model, the fit, the reports and the figure loader", () => {
    for (const name of ["parseCurveText", "parseCurveBytes", "formatCsv", "formatCurveCsv", "etaFromMetadata", "analyzeCurve", "simulateCurve", "parseScenario", "fitCurve", "analysisToJson", "formatAnalysisText", "summaryRow", "fitToJson", "loadCurveFigure", "normalizedConductance"]) {
      expect(typeof (core as Record<string, unknown>)[name], name).toBe("function");
    }
    for (const name of ["readCurveFile", "listCurveFiles", "readJsonFile", "writeTextFile"]) {
      expect(name in core, name).toBe(false);
      expect(typeof (entry as Record<string, unknown>)[name], name).toBe("function");
    }
  });

  it("exports the grid readers of bytes and the grid map figure loader (the grid notebook needs them); the file readers stay in lib/index.ts", () => {
    for (const name of ["parseGridBytes", "parseNpyGridBytes", "parseJsonText", "parseGridTable", "analyzeGrid", "gridAnalysisSteps", "runPixelPass", "combinePixelPass", "gridToJson", "gridProfileRows", "gridMapFileNames", "loadGridMapFigure"]) {
      expect(typeof (core as Record<string, unknown>)[name], name).toBe("function");
    }
    for (const name of ["readGridFile", "readNpyGrid"]) {
      expect(name in core, name).toBe(false);
      expect(typeof (entry as Record<string, unknown>)[name], name).toBe("function");
    }
  });

  it("lib/index.ts re-exports every export of lib/core.ts, the same objects", () => {
    for (const [name, value] of Object.entries(core)) expect((entry as Record<string, unknown>)[name], name).toBe(value);
  });
});
