// The documented defaults of every public options type match the DEFAULTS objects the code uses:
// each "Default N" (or "Default: X_DEFAULTS.key (N)") in a field's doc comment is read from the
// source text and compared with the constant. Derived by construction: the docs and the code must
// say the same thing; the values themselves are locked, with their sources, in each module's test.
import { describe, it, expect } from "vitest";
import { documentedDefaults } from "./helpers/documentedDefaults.ts";
import { FIND_PEAKS_DEFAULTS } from "../lib/peaks/findPeaks.ts";
import { ANALYZE_DEFAULTS } from "../lib/pipeline/analyzeCurve.ts";
import { CONDUCTANCE_DEFAULTS } from "../lib/signal/conductance.ts";
import { PREPARE_CURVE_DEFAULTS } from "../lib/signal/prepareCurve.ts";
import { GAP_EDGES_DEFAULTS } from "../lib/assign/gapEdges.ts";
import { ASSIGN_DEFAULTS } from "../lib/assign/assignSpectrum.ts";
import { FIT_DEFAULTS } from "../lib/model/fit/fitCurve.ts";
import { SIMULATE_DEFAULTS } from "../lib/model/simulate.ts";
import { NORMALIZED_CONDUCTANCE_DEFAULTS } from "../lib/signal/normalizedConductance.ts";
import { SAVITZKY_GOLAY_DEFAULTS } from "../lib/signal/savitzkyGolay.ts";
import { PEAK_AREAS_DEFAULTS } from "../lib/peaks/peakAreas.ts";
import { EDGE_STEP_WIDTH_DEFAULTS } from "../lib/peaks/edgeStepWidth.ts";
import { SCENARIO_DEFAULTS } from "../lib/model/scenario.ts";
import { SYNTHETIC_DEFAULTS } from "../lib/model/syntheticSpectrum.ts";
import { PLAN_SIZE_CURVES_DEFAULTS } from "../lib/sizes/planSizeCurves.ts";
import { PARSE_NPY_GRID_BYTES_DEFAULTS } from "../lib/io/parseNpyGridBytes.ts";
import { PARSE_GRID_BYTES_DEFAULTS } from "../lib/io/parseGridBytes.ts";

const OBJECTS: Record<string, object> = {
  FIND_PEAKS_DEFAULTS,
  ANALYZE_DEFAULTS,
  CONDUCTANCE_DEFAULTS,
  PREPARE_CURVE_DEFAULTS,
  GAP_EDGES_DEFAULTS,
  ASSIGN_DEFAULTS,
  FIT_DEFAULTS,
  SIMULATE_DEFAULTS,
  NORMALIZED_CONDUCTANCE_DEFAULTS,
  SAVITZKY_GOLAY_DEFAULTS,
  PEAK_AREAS_DEFAULTS,
  EDGE_STEP_WIDTH_DEFAULTS,
  SCENARIO_DEFAULTS,
  SYNTHETIC_DEFAULTS,
  PLAN_SIZE_CURVES_DEFAULTS,
  PARSE_NPY_GRID_BYTES_DEFAULTS,
  PARSE_GRID_BYTES_DEFAULTS,
};

/** [source file, options interface, the DEFAULTS objects its fields default to, in lookup order]. */
const CASES: [string, string, string[]][] = [
  ["../lib/peaks/findPeaks.ts", "FindPeaksOptions", ["FIND_PEAKS_DEFAULTS"]],
  ["../lib/assign/assignSpectrum.ts", "AssignOptions", ["ASSIGN_DEFAULTS"]],
  ["../lib/pipeline/analyzeCurve.ts", "AnalyzeOptions", ["ANALYZE_DEFAULTS", "FIND_PEAKS_DEFAULTS", "CONDUCTANCE_DEFAULTS", "ASSIGN_DEFAULTS"]],
  ["../lib/signal/conductance.ts", "ConductanceOptions", ["CONDUCTANCE_DEFAULTS"]],
  ["../lib/signal/prepareCurve.ts", "PrepareCurveOptions", ["PREPARE_CURVE_DEFAULTS"]],
  ["../lib/assign/gapEdges.ts", "GapEdgesOptions", ["GAP_EDGES_DEFAULTS"]],
  ["../lib/model/fit/fitCurve.ts", "FitOptions", ["FIT_DEFAULTS"]],
  ["../lib/model/simulate.ts", "SimulateOptions", ["SIMULATE_DEFAULTS"]],
  ["../lib/signal/normalizedConductance.ts", "NormalizedConductanceOptions", ["NORMALIZED_CONDUCTANCE_DEFAULTS"]],
  ["../lib/signal/savitzkyGolay.ts", "SavitzkyGolayOptions", ["SAVITZKY_GOLAY_DEFAULTS"]],
  ["../lib/peaks/peakAreas.ts", "PeakAreasOptions", ["PEAK_AREAS_DEFAULTS"]],
  ["../lib/peaks/edgeStepWidth.ts", "EdgeStepWidthOptions", ["EDGE_STEP_WIDTH_DEFAULTS"]],
  ["../lib/model/scenario.ts", "Scenario", ["SCENARIO_DEFAULTS"]],
  ["../lib/model/scenario.ts", "NoiseSpec", ["SCENARIO_DEFAULTS"]],
  ["../lib/model/syntheticSpectrum.ts", "SyntheticRanges", ["SYNTHETIC_DEFAULTS"]],
  ["../lib/sizes/planSizeCurves.ts", "PlanSizeCurvesOptions", ["PLAN_SIZE_CURVES_DEFAULTS"]],
  ["../lib/io/parseNpyGridBytes.ts", "ParseNpyGridBytesOptions", ["PARSE_NPY_GRID_BYTES_DEFAULTS"]],
  ["../lib/io/parseGridBytes.ts", "ParseGridBytesOptions", ["PARSE_GRID_BYTES_DEFAULTS"]],
];

describe("documented defaults", () => {
  for (const [file, name, objects] of CASES) {
    it(`${name}: every "Default …" in its doc comments equals the DEFAULTS constant`, () => {
      const docs = documentedDefaults(new URL(file, import.meta.url), name);
      expect(docs.length, `${name} documents no default at all`).toBeGreaterThan(0);
      for (const d of docs) {
        if (d.constant) {
          const holder = OBJECTS[d.constant.object] as Record<string, unknown> | undefined;
          expect(holder, `${name}.${d.field} names ${d.constant.object}, which this test does not know`).toBeDefined();
          expect(d.constant.key in holder!, `${name}.${d.field}: ${d.constant.object} has no key ${d.constant.key}`).toBe(true);
          if (d.literal !== undefined) expect(holder![d.constant.key], `${name}.${d.field}: "${d.comment}"`).toEqual(d.literal);
          continue;
        }
        if (d.literal === undefined) continue;
        const holder = objects.map((o) => OBJECTS[o] as Record<string, unknown>).find((o) => d.field in o);
        expect(holder, `${name}.${d.field} documents "Default ${String(d.literal)}" but no DEFAULTS object holds ${d.field}: name the constant`).toBeDefined();
        expect(holder![d.field], `${name}.${d.field}: "${d.comment}"`).toEqual(d.literal);
      }
    });
  }

  it("every DEFAULTS object is frozen", () => {
    for (const [key, value] of Object.entries(OBJECTS)) expect(Object.isFrozen(value), key).toBe(true);
  });
});
