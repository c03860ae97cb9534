/**
 * Builds the notebooks in notebooks/ into a static folder (HTML, JavaScript, CSS, the bundled
 * sample curves) that any static file server can serve: every library is bundled, nothing is
 * fetched from elsewhere at run time.
 */
import { existsSync, readdirSync, statSync } from "node:fs";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";

/** The repository root. */
export const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), "..", "..");

/** Where the notebooks live and where their static build goes (git-ignored). */
export const NOTEBOOK_PATHS = Object.freeze({
  source: join(ROOT, "notebooks"),
  template: join(ROOT, "notebooks", "template.html"),
  out: join(ROOT, "dist", "notebooks"),
});

/** The notebook pages: every .html in notebooks/ except the page template. */
export function notebookPages(): string[] {
  return readdirSync(NOTEBOOK_PATHS.source)
    .filter((f) => f.endsWith(".html") && f !== "template.html")
    .sort()
    .map((f) => join(NOTEBOOK_PATHS.source, f));
}

/** Newest modification time (ms) of the files a build depends on. */
function newestSource(): number {
  let newest = 0;
  const walk = (dir: string) => {
    for (const name of readdirSync(dir)) {
      const path = join(dir, name);
      const s = statSync(path);
      if (s.isDirectory()) walk(path);
      else newest = Math.max(newest, s.mtimeMs);
    }
  };
  for (const dir of ["notebooks", "lib", "sample-curves"]) walk(join(ROOT, dir));
  for (const file of ["package-lock.json"]) newest = Math.max(newest, statSync(join(ROOT, file)).mtimeMs);
  return newest;
}

/** True when the static build is missing or older than a file it is built from. */
export function buildIsStale(out = NOTEBOOK_PATHS.out): boolean {
  const index = join(out, "index.html");
  if (!existsSync(index)) return true;
  return statSync(index).mtimeMs < newestSource();
}

/**
 * Builds every notebook page into `out` (emptied first) with Vite and the notebook plugin.
 *
 * @param out - the output folder. Default dist/notebooks.
 * @returns the output folder.
 */
export async function buildNotebooks(out = NOTEBOOK_PATHS.out): Promise<string> {
  const { build } = await import("vite");
  const { config, observable } = await import("@observablehq/notebook-kit/vite");
  const kit = config();
  // Only the kit's own `observable:` alias is kept: its `npm:` and `jsr:` aliases would turn an
  // import into a CDN URL fetched at run time, which an offline page must never do.
  type Alias = { find: RegExp | string; replacement: string };
  const alias = ((kit.resolve?.alias ?? []) as unknown as Alias[]).filter((a) => String(a.find).includes("observable:"));
  await build({
    ...kit,
    resolve: { ...kit.resolve, alias },
    configFile: false,
    logLevel: "warn",
    plugins: [observable({ template: NOTEBOOK_PATHS.template })],
    root: NOTEBOOK_PATHS.source,
    base: "./",
    build: {
      outDir: out,
      emptyOutDir: true,
      chunkSizeWarningLimit: 2000,
      rollupOptions: { input: notebookPages() },
    },
  });
  return out;
}
