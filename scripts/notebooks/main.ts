/**
 * `npm run notebooks`: builds the notebooks if needed and serves them on 127.0.0.1, printing the
 * address. `npm run notebooks:build`: only builds them into dist/notebooks.
 *
 *   node bin/run-ts.mjs scripts/notebooks/main.ts serve [--port N]
 *   node bin/run-ts.mjs scripts/notebooks/main.ts build
 */
import { buildIsStale, buildNotebooks, NOTEBOOK_PATHS } from "./buildNotebooks.ts";
import { serveStatic } from "./serveStatic.ts";
import { relative } from "node:path";

const [command = "serve", ...rest] = process.argv.slice(2);
const portAt = rest.indexOf("--port");
const port = portAt >= 0 ? Number(rest[portAt + 1]) : Number(process.env.PORT ?? 5180);

if (command === "build") {
  await buildNotebooks();
  console.log(`notebooks built into ${relative(process.cwd(), NOTEBOOK_PATHS.out) || "."}`);
} else if (command === "serve") {
  if (!Number.isInteger(port) || port < 0 || port > 65535) {
    console.error(`notebooks: --port must be an integer 0–65535; got ${rest[portAt + 1] ?? process.env.PORT}`);
    process.exit(2);
  }
  if (buildIsStale()) {
    console.error("building the notebooks…");
    await buildNotebooks();
  }
  let served;
  try {
    served = await serveStatic(NOTEBOOK_PATHS.out, port);
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    console.error(code === "EADDRINUSE" ? `notebooks: port ${port} is in use; try --port 0 for a free one` : `notebooks: ${(err as Error).message}`);
    process.exit(1);
  }
  console.log(served.url);
  console.error("(Ctrl-C stops the server)");
} else {
  console.error("usage: notebooks [serve [--port N] | build]");
  process.exit(2);
}
