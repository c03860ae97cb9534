// Entry of a `dotspec grid` worker thread when the CLI runs from its TypeScript sources (the
// tests, under vitest): registers tsx in this thread, then runs the worker module. The compiled
// CLI in dist/ starts dist/cli/gridWorker.js directly (see workerEntry).
import { register } from "tsx/esm/api";

register();
await import("./gridWorker.ts");
