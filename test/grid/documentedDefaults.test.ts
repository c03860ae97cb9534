// The documented defaults of the grid options types match the DEFAULTS objects the code uses
// (each "Default N" or "Default: X_DEFAULTS.key (N)" read from the source text): the docs and the
// code must say the same thing; the values themselves are locked in each module's test.
import { describe, expect, it } from "vitest";
import { documentedDefaults } from "../helpers/documentedDefaults.ts";
import { ANALYZE_GRID_DEFAULTS } from "../../lib/grid/analyzeGrid.ts";
import { GRID_MAP_DEFAULTS } from "../../lib/grid/planGridMaps.ts";
import { GRID_NOISE_DEFAULTS } from "../../lib/grid/gridNoise.ts";
import { READ_NPY_DEFAULTS } from "../../lib/io/readNpyGrid.ts";
import { GRID_MAP_FIGURE_DEFAULTS } from "../../lib/report/gridMapFigure.ts";

const OBJECTS: Record<string, Record<string, unknown>> = { ANALYZE_GRID_DEFAULTS, GRID_MAP_DEFAULTS, GRID_NOISE_DEFAULTS, READ_NPY_DEFAULTS, GRID_MAP_FIGURE_DEFAULTS };
const CASES: [string, string, string][] = [
  ["../../lib/grid/analyzeGrid.ts", "AnalyzeGridOptions", "ANALYZE_GRID_DEFAULTS"],
  ["../../lib/grid/planGridMaps.ts", "PlanGridMapsOptions", "GRID_MAP_DEFAULTS"],
  ["../../lib/grid/gridNoise.ts", "GridCurrentNoiseOptions", "GRID_NOISE_DEFAULTS"],
  ["../../lib/io/readNpyGrid.ts", "ReadNpyGridOptions", "READ_NPY_DEFAULTS"],
  ["../../lib/report/gridMapFigure.ts", "GridMapFigureOptions", "GRID_MAP_FIGURE_DEFAULTS"],
];

describe("documented defaults of the grid options", () => {
  for (const [file, name, object] of CASES) {
    it(`${name}: every "Default …" equals ${object}`, () => {
      const docs = documentedDefaults(new URL(file, import.meta.url), name);
      for (const d of docs) {
        const holder = OBJECTS[d.constant?.object ?? object];
        const key = d.constant?.key ?? d.field;
        if (d.literal === undefined || !(key in holder)) continue;
        expect(holder[key], `${name}.${d.field}: "${d.comment}"`).toEqual(d.literal);
      }
    });
  }
});
