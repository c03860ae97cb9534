#!/usr/bin/env node
// The dotspec command. The library is written in TypeScript and run through tsx, which is
// resolved from this package, so the command works from any working directory.
import { register } from "tsx/esm/api";

register();
const { main } = await import("../lib/cli/main.ts");
process.exitCode = await main(process.argv.slice(2));
