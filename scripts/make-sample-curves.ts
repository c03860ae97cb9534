/**
 * Makes the demo curves in sample-curves/ from the scenario files in sample-curves/scenarios/.
 *
 *   npm run samples
 *
 * Every curve is invented: simulated with the project's orthodox-theory model for a made-up
 * batch of InP dots on gold at 4.5 K (the numbers are plausible, not measured). Each scenario
 * file holds the model scenario (the same keys as `dotspec simulate --config`), the number of
 * sweeps (each with its own noise seed) and the file layout to write, so the demo exercises the
 * importer's layouts: comma CSV, tab-separated with fwd/bwd columns in mV/pA, whitespace with
 * metadata lines, semicolons with decimal commas and a lock-in column, and a headerless file.
 */
import { readdirSync, readFileSync } from "node:fs";
import { join, dirname } from "node:path";
import { fileURLToPath } from "node:url";
import { simulateCurve, writeTextFile, parseScenario } from "../lib/index.ts";

type Layout = "csv" | "tsv-mv-pa" | "whitespace" | "semicolon-decimal-comma" | "headerless";

interface SampleSpec {
  file: string;
  layout: Layout;
  sweeps: number;
  metadata: Record<string, string>;
  scenario: unknown;
}

const root = join(dirname(fileURLToPath(import.meta.url)), "..", "sample-curves");
const g = (v: number, digits = 8) => Number(v.toPrecision(digits)).toString();

function format(spec: SampleSpec, biasV: Float64Array, sweeps: Float64Array[], didvS: Float64Array | null): string {
  const meta = Object.entries(spec.metadata);
  const lines: string[] = [];
  const n = biasV.length;
  switch (spec.layout) {
    case "csv": {
      for (const [k, v] of meta) lines.push(`# ${k}: ${v}`);
      lines.push(["bias (V)", ...sweeps.map((_, k) => `current sweep ${k + 1} (nA)`)].join(","));
      for (let i = 0; i < n; i++) lines.push([g(biasV[i]), ...sweeps.map((s) => g(s[i] * 1e9))].join(","));
      break;
    }
    case "tsv-mv-pa": {
      for (const [k, v] of meta) lines.push(`# ${k} = ${v}`);
      const names = sweeps.length === 2 ? ["Current fwd [pA]", "Current bwd [pA]"] : sweeps.map((_, k) => `Current ${k + 1} [pA]`);
      lines.push(["Bias [mV]", ...names].join("\t"));
      for (let i = 0; i < n; i++) lines.push([g(biasV[i] * 1e3), ...sweeps.map((s) => g(s[i] * 1e12))].join("\t"));
      break;
    }
    case "whitespace": {
      for (const [k, v] of meta) lines.push(`# ${k}: ${v}`);
      lines.push(["bias_V", ...sweeps.map((_, k) => `current${k + 1}_nA`)].join("   "));
      for (let i = 0; i < n; i++) lines.push([g(biasV[i]).padStart(12), ...sweeps.map((s) => g(s[i] * 1e9).padStart(16))].join(" "));
      break;
    }
    case "semicolon-decimal-comma": {
      const dc = (s: string) => s.replace(".", ",");
      for (const [k, v] of meta) lines.push(`# ${k}: ${v}`);
      lines.push(["Bias (mV)", ...sweeps.map((_, k) => `Current ${k + 1} (pA)`), ...(didvS ? ["dI/dV (nS)"] : [])].join(";"));
      for (let i = 0; i < n; i++) {
        lines.push([dc(g(biasV[i] * 1e3)), ...sweeps.map((s) => dc(g(s[i] * 1e12))), ...(didvS ? [dc(g(didvS[i] * 1e9))] : [])].join(";"));
      }
      break;
    }
    case "headerless": {
      for (let i = 0; i < n; i++) lines.push(`${g(biasV[i])} ${g(sweeps[0][i], 10)}`);
      break;
    }
  }
  return lines.join("\n") + "\n";
}

const files = readdirSync(join(root, "scenarios")).filter((f) => f.endsWith(".json")).sort();
for (const name of files) {
  const spec = JSON.parse(readFileSync(join(root, "scenarios", name), "utf8")) as SampleSpec;
  const base = parseScenario(spec.scenario);
  const sweeps: Float64Array[] = [];
  let didvS: Float64Array | null = null;
  for (let k = 0; k < spec.sweeps; k++) {
    const seed = (base.noise?.seed ?? 1) + 1000 * k;
    const sim = simulateCurve({ ...base, noise: base.noise ? { ...base.noise, seed } : null });
    sweeps.push(sim.currentA);
    if (k === 0 && spec.layout === "semicolon-decimal-comma") didvS = sim.didvS;
    if (k === 0) var biasV = sim.biasV;
  }
  writeTextFile(join(root, spec.file), format(spec, biasV!, sweeps, didvS));
  console.log(`${spec.file}: ${biasV!.length} points × ${spec.sweeps} sweep(s), layout ${spec.layout}`);
}
