#!/usr/bin/env node
// Runs a TypeScript entry point of this package with tsx, resolved from this package
// (not from the caller's working directory): `node bin/run-ts.mjs path/to/file.ts args...`.
import { register } from "tsx/esm/api";
import { pathToFileURL } from "node:url";
import { resolve } from "node:path";

register();
const [entry, ...rest] = process.argv.slice(2);
if (!entry) {
  console.error("usage: node bin/run-ts.mjs FILE.ts [args...]");
  process.exit(2);
}
process.argv = [process.argv[0], resolve(entry), ...rest];
await import(pathToFileURL(resolve(entry)).href);
