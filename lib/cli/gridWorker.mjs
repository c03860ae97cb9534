// Entry of a `dotspec grid` worker thread: registers tsx (TypeScript) in this thread, as
// bin/dotspec.js does for the main one, then runs the worker module.
import { register } from "tsx/esm/api";

register();
await import("./gridWorker.ts");
