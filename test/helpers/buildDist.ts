// vitest global setup: compiles lib/ into dist/ before the tests, so the tests that run the real
// command (`node bin/dotspec.js`, which loads dist/) and the packaging test see the sources as
// they are now, also when vitest runs without `npm test` (for example `vitest run test/cli`).
import { execFileSync } from "node:child_process";
import { fileURLToPath } from "node:url";

export default function setup(): void {
  execFileSync(process.execPath, [fileURLToPath(new URL("../../scripts/build.mjs", import.meta.url))], { stdio: ["ignore", "ignore", "inherit"] });
}
