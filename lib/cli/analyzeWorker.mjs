// Entry of a `dotspec analyze` worker thread when the CLI runs from its TypeScript sources (the
// tests, under vitest): registers tsx in this thread, then runs the worker module. The compiled
// CLI in dist/ starts dist/cli/analyzeWorker.js directly (see workerEntry).
import { register } from "tsx/esm/api";

register();
await import("./analyzeWorker.ts");
