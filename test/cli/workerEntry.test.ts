// workerEntry(name, from): which file a worker thread starts from. Expected values are derived
// from the layout by construction (dist/cli/<name>.js beside the compiled CLI, the tsx shim
// lib/cli/<name>.mjs beside the sources), and checked against the files that exist.
import { describe, it, expect } from "vitest";
import { existsSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { workerEntry } from "../../lib/cli/workerEntry.ts";

describe("workerEntry(name, from)", () => {
  it("is the compiled .js beside a compiled caller", () => {
    expect(workerEntry("analyzeWorker", "file:///pkg/dist/cli/runAnalyzeJobs.js").href).toBe("file:///pkg/dist/cli/analyzeWorker.js");
  });

  it("is the .mjs shim beside a TypeScript caller, and both shims exist", () => {
    for (const name of ["analyzeWorker", "gridWorker"]) {
      const url = workerEntry(name, new URL("../../lib/cli/runAnalyzeJobs.ts", import.meta.url).href);
      expect(url.pathname.endsWith(`/lib/cli/${name}.mjs`)).toBe(true);
      expect(existsSync(fileURLToPath(url)), name).toBe(true);
    }
  });

  it("names worker modules the build compiles (dist/cli/<name>.js exists after the test run's build)", () => {
    for (const name of ["analyzeWorker", "gridWorker"]) {
      expect(existsSync(fileURLToPath(workerEntry(name, new URL("../../dist/cli/main.js", import.meta.url).href))), name).toBe(true);
    }
  });
});
