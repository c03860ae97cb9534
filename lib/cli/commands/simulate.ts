/**
 * `dotspec simulate --config SCENARIO.json --out CURVE.csv`: a simulated I–V (and dI/dV) curve of
 * a dot described by a scenario file, written as CSV that `dotspec analyze` reads.
 */
import { resolve } from "node:path";
import { Option, type Command } from "commander";
import { DOTSPEC_VERSION, formatCurveCsv, inputDigest, isDotspecError, parseScenario, simulateCurve, SIMULATE_DEFAULTS, writeTextFile } from "../../index.ts";
import { EXIT, UsageError, type CliContext } from "../context.ts";
import { readJsonFile } from "../../index.ts";
import type { CliCommand } from "./command.ts";

/** Options of `dotspec simulate` as commander hands them over. */
export interface SimulateCliOptions {
  config: string;
  out: string;
  dIdV?: boolean;
  method: "exact" | "fast";
}

const HELP_AFTER = `
The scenario is a JSON object: the dot's levels (cb, vb: [{energyEV, degeneracy}]), chargingEnergyEV,
eta, tipRatePerS, substrateRatePerS, temperatureK, bias {fromV, toV, stepV}, and optionally
broadeningEV, relaxationRatePerS, lockInVrms, noise {relative, seed}, description.
The same seed gives the same noise; noise comes from the seed only (default seed 1).

The CSV starts with "# key: value" metadata lines that dotspec analyze reads back: eta (so the
analysis of the curve uses the scenario's η), description, the noise and its seed, and where it
came from (dotspec version, method, the scenario file's name and SHA-256).

Exit status: 0 written, 1 the scenario file could not be read or the CSV not written,
2 usage error (including an invalid scenario: the message names the key).

Example:
  dotspec simulate --config dot.json --out dot.csv --dIdV
`;

export const simulateCommand: CliCommand = {
  name: "simulate",
  register(program: Command, ctx: CliContext) {
    program
      .command("simulate")
      .description("Simulate the I–V curve (and dI/dV) of a quantum dot in a double-barrier tunnel junction, from a scenario file.")
      .requiredOption("--config <SCENARIO.json>", "the scenario: levels, charging energy, η, rates, temperature, bias sweep, noise")
      .requiredOption("--out <CURVE.csv>", "the CSV file to write (header: bias (V),current (A)[,dI/dV (S)])")
      .option("--dIdV", "also write the dI/dV column (S)")
      .addOption(
        new Option("--method <method>", 'exact: thermal master equation (reference); fast: broadened zero-temperature steps')
          .choices(["exact", "fast"])
          .default(SIMULATE_DEFAULTS.method),
      )
      .addHelpText("after", HELP_AFTER)
      .action(async (opts: SimulateCliOptions) => {
        ctx.exitCode = runSimulate(opts, ctx);
      });
  },
};

function sig(x: number): string {
  return Number(x.toPrecision(3)).toString();
}

/**
 * The metadata lines of a simulated curve: η (read back by `analyze`), the description, the
 * noise and its seed, and the provenance (version, method, scenario file and its SHA-256).
 */
function simulationMetadata(input: unknown, scenario: ReturnType<typeof parseScenario>, opts: SimulateCliOptions): Record<string, string | number> {
  const meta: Record<string, string | number> = { eta: scenario.eta };
  const description = (input as { description?: unknown }).description;
  if (typeof description === "string" && description.trim() !== "") meta.description = description;
  meta.simulated = `dotspec ${DOTSPEC_VERSION} simulate, ${opts.method} method`;
  if (scenario.noise && scenario.noise.relative > 0) {
    meta.noise_relative = scenario.noise.relative;
    meta.noise_seed = scenario.noise.seed ?? 1;
  } else meta.noise_relative = 0;
  const digest = inputDigest(opts.config);
  meta.scenario = digest.name;
  meta.scenario_sha256 = digest.sha256;
  return meta;
}

/**
 * Runs `dotspec simulate`.
 *
 * Returns
 * -------
 * number
 *     0 written; 1 the scenario file unreadable or the CSV not written; 2 invalid JSON or scenario.
 *
 * Throws
 * ------
 * UsageError
 *     When --out is the scenario file itself.
 */
export function runSimulate(opts: SimulateCliOptions, ctx: CliContext): number {
  if (resolve(opts.out) === resolve(opts.config)) {
    throw new UsageError(`--out ${opts.out} is the scenario file; give another name for the CSV`);
  }
  let input: unknown;
  try {
    input = readJsonFile(opts.config);
  } catch (err) {
    if (!isDotspecError(err)) throw err;
    ctx.error(err.message);
    return err.code === "io/invalid-json" ? EXIT.usage : EXIT.failed;
  }
  let scenario;
  try {
    scenario = parseScenario(input);
  } catch (err) {
    if (!isDotspecError(err)) throw err;
    ctx.error(`${opts.config}: invalid scenario: ${err.message}`);
    return EXIT.usage;
  }
  let sim;
  try {
    sim = simulateCurve(scenario, { method: opts.method, conductance: opts.dIdV === true });
  } catch (err) {
    // A scenario too fine to simulate (scenario/too-fine) is refused before anything is allocated.
    if (!isDotspecError(err)) throw err;
    ctx.error(`${opts.config}: ${err.message}`);
    return EXIT.usage;
  }
  const metadata = simulationMetadata(input, scenario, opts);
  try {
    writeTextFile(opts.out, formatCurveCsv({ biasV: sim.biasV, currentA: sim.currentA, didvS: opts.dIdV ? sim.didvS : null }, { metadata }));
  } catch (err) {
    if (!isDotspecError(err)) throw err;
    ctx.error(err.message);
    return EXIT.failed;
  }
  const r = sim.record;
  const n = sim.biasV.length;
  const noise = r.noiseCurrentA > 0
    ? `noise σ = ${sig(r.noiseCurrentA)} A (${sig(100 * scenario.noise!.relative)} % of full scale, seed ${scenario.noise!.seed})`
    : "no noise";
  ctx.error(`wrote ${opts.out}: ${n} points from ${sig(sim.biasV[0])} V to ${sig(sim.biasV[n - 1])} V, ${r.method} method, ${noise}`);
  return EXIT.ok;
}
