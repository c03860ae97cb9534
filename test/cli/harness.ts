// Shared helpers of the CLI tests: run `main` in-process with captured output, make temp folders,
// and write simulated curves whose peak positions are known in closed form.
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { main, type CliStream } from "../../lib/cli/main.ts";
import { formatCurveCsv, simulateCurve, writeTextFile } from "../../lib/index.ts";
import { EXAMPLE_SCENARIO } from "../fixtures/exampleScenario.ts";

export interface Captured extends CliStream {
  text: string;
}

export function stream(isTTY = false): Captured {
  const s: Captured = {
    text: "",
    isTTY,
    columns: 100,
    write(chunk: string) {
      s.text += chunk;
      return true;
    },
  };
  return s;
}

export interface RunResult {
  code: number;
  stdout: string;
  stderr: string;
}

/** Runs `dotspec ...argv` in this process. */
export async function run(argv: string[], options: { stdoutTTY?: boolean; stderrTTY?: boolean; env?: Record<string, string> } = {}): Promise<RunResult> {
  const stdout = stream(options.stdoutTTY);
  const stderr = stream(options.stderrTTY);
  const code = await main(argv, { stdout, stderr, env: options.env ?? {} });
  return { code, stdout: stdout.text, stderr: stderr.text };
}

const made: string[] = [];

/** A fresh temporary folder, removed by {@link removeTempDirs}. */
export function tempDir(prefix = "dotspec-cli-"): string {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  made.push(dir);
  return dir;
}

export function removeTempDirs(): void {
  for (const dir of made.splice(0)) rmSync(dir, { recursive: true, force: true });
}

/**
 * A dot in shell filling (Γtip/Γsub = 10): CB s (g = 2) at 0.5 eV and p (g = 6) at 0.8 eV, one
 * VB level (g = 2) at −0.6 eV, Ec = 0.1 eV, η = 0.8. The charging peak of the (n+1)-th carrier
 * on level ε lies at |V| = (|ε| + Ec·(n + ½))/η (closed form of orthodox theory: Beenakker, Phys. Rev. B 44, 1646 (1991)).
 */
export const FILLING = Object.freeze({
  ...EXAMPLE_SCENARIO,
  vb: [EXAMPLE_SCENARIO.vb[0]],
  bias: { fromV: -1.2, toV: 1.6, stepV: 0.002 },
});

/** The same dot in shell tunnelling (Γtip/Γsub = 0.01): one peak per level at (|ε| + Ec/2)/η (closed form). */
export const TUNNELING = Object.freeze({ ...FILLING, tipRatePerS: 1e7, substrateRatePerS: 1e9 });

/** Closed-form peak position (V) of the (n+1)-th carrier on a level of energy ε (eV): ±(|ε| + Ec(n + ½))/η. */
export function chargingPeakV(energyEV: number, n: number, chargingEnergyEV = FILLING.chargingEnergyEV, eta = FILLING.eta): number {
  return (Math.sign(energyEV) * (Math.abs(energyEV) + chargingEnergyEV * (n + 0.5))) / eta;
}

/** Writes the simulated curve of `scenario` as CSV (the format `dotspec simulate` writes). */
export function writeCurve(path: string, scenario: object, method: "exact" | "fast" = "fast"): string {
  const sim = simulateCurve(scenario, { method, conductance: false });
  writeTextFile(path, formatCurveCsv(sim));
  return path;
}
