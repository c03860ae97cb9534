// A small deterministic analysis for the report tests: a simulated dot in shell filling with
// seeded noise (the same scenario as the CLI tests, test/cli/harness.ts), two sweeps.
import { analyzeCurve, simulateCurve, type Curve, type CurveAnalysis } from "../../lib/index.ts";
import { FILLING } from "../cli/harness.ts";

export function simulatedCurve(source = "dot-filling.csv", stepV = 0.004): Curve {
  const sweeps = [7, 8].map((seed) => simulateCurve({ ...FILLING, bias: { ...FILLING.bias, stepV }, noise: { relative: 0.003, seed } }, { method: "fast", conductance: false }));
  const biasV = sweeps[0].biasV;
  const currentA = biasV.map((_, i) => (sweeps[0].currentA[i] + sweeps[1].currentA[i]) / 2);
  return { biasV, currentA, sweeps: sweeps.map((s) => s.currentA), didvS: null, meta: { source, metadata: {} } };
}

export function simulatedAnalysis(source?: string): { curve: Curve; analysis: CurveAnalysis } {
  const curve = simulatedCurve(source);
  return { curve, analysis: analyzeCurve(curve, { eta: FILLING.eta }) };
}
