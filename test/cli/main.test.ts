// main(argv, io): help, version, and the registry of sub-commands.
// Expected values are derived from the inputs by construction: this is the project's own interface, with no outside reference value to name.
import { describe, it, expect } from "vitest";
import { readFileSync } from "node:fs";
import { EXIT } from "../../lib/cli/main.ts";
import { COMMANDS } from "../../lib/cli/commands/index.ts";
import { Command } from "commander";
import { makeContext } from "../../lib/cli/context.ts";
import { run, stream } from "./harness.ts";

describe("main(argv, io)", () => {
  it("EXIT codes are 0 success, 1 some file failed, 2 usage error (the CLI specification)", () => {
    expect(EXIT).toEqual({ ok: 0, failed: 1, usage: 2 });
  });

  it("--version prints the version of package.json", async () => {
    const { version } = JSON.parse(readFileSync(new URL("../../package.json", import.meta.url), "utf8"));
    const r = await run(["--version"]);
    expect(r).toEqual({ code: 0, stdout: `${version}\n`, stderr: "" });
  });

  it("--help lists the registered commands on stdout, exit 0", async () => {
    const r = await run(["--help"]);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/^Usage: dotspec /);
    for (const c of COMMANDS) expect(r.stdout).toMatch(new RegExp(`\\n  ${c.name} `));
  });

  it("--help lists each command as its module declares it (name, [options], arguments), without loading the module", async () => {
    const r = await run(["--help"]);
    for (const entry of COMMANDS) {
      const program = new Command("dotspec");
      (await entry.load()).register(program, makeContext({ stdout: stream(), stderr: stream() }));
      const term = program.createHelp().subcommandTerm(program.commands[0]);
      expect(r.stdout, entry.name).toMatch(new RegExp(`\\n  ${term.replace(/[.[\]]/g, "\\$&")}  `));
    }
  });

  it("the registry holds analyze, sizes, fit, grid and simulate, in the order --help lists them", () => {
    expect(COMMANDS.map((c) => c.name)).toEqual(["analyze", "sizes", "fit", "grid", "simulate"]);
  });

  it("analyze --help documents the options and says they are analysis settings, not instrument settings", async () => {
    const r = await run(["analyze", "--help"]);
    expect(r.code).toBe(0);
    for (const option of ["--eta", "--window-mv", "--order", "--min-step-sigma", "--use-measured", "--json", "--out"]) expect(r.stdout).toContain(option);
    expect(r.stdout.replace(/\s+/g, " ")).toContain("analysis settings (how a recorded curve is processed), not instrument settings");
    expect(r.stdout.replace(/\s+/g, " ")).toContain("checked against the instrument's own limits");
  });

  it("simulate --help documents --config, --out, --dIdV and --method", async () => {
    const r = await run(["simulate", "--help"]);
    expect(r.code).toBe(0);
    for (const option of ["--config", "--out", "--dIdV", "--method"]) expect(r.stdout).toContain(option);
  });

  it("a command's help shown on a usage error goes to stderr, not stdout", async () => {
    const r = await run(["analyze", "--eta"]);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe("");
    expect(r.stderr).toMatch(/--eta.*argument missing/);
  });
});
