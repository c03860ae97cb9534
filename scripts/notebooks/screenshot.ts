/**
 * Rewrites docs/curve-notebook.png, the README's picture of the one-curve notebook: builds the
 * notebooks, serves them on 127.0.0.1 and photographs the page with Debian's Chromium.
 *
 *   node bin/run-ts.mjs scripts/notebooks/screenshot.ts
 */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { chromium } from "playwright-core";
import { buildNotebooks, ROOT } from "./buildNotebooks.ts";
import { serveStatic } from "./serveStatic.ts";

const out = mkdtempSync(join(tmpdir(), "dotspec-notebooks-"));
const profile = mkdtempSync(join(tmpdir(), "dotspec-chromium-"));
await buildNotebooks(out);
const served = await serveStatic(out, 0);
const context = await chromium.launchPersistentContext(profile, {
  executablePath: "/usr/bin/chromium",
  headless: true,
  args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
  viewport: { width: 900, height: 800 },
});
try {
  const page = await context.newPage();
  await page.goto(served.url + "curve.html");
  await page.locator("[data-testid=curve-figure] > svg").waitFor();
  // From the picker to the end of the figure: what a user sees first.
  const top = await page.locator("[data-testid=drop-zone]").boundingBox();
  const figure = await page.locator("[data-testid=curve-figure]").boundingBox();
  const clip = { x: 0, y: Math.max(0, top!.y - 12), width: 900, height: figure!.y + figure!.height + 12 - Math.max(0, top!.y - 12) };
  await page.screenshot({ path: join(ROOT, "docs", "curve-notebook.png"), clip, fullPage: true });
  console.log("docs/curve-notebook.png written");
} finally {
  await context.close();
  await served.close();
  rmSync(out, { recursive: true, force: true });
  rmSync(profile, { recursive: true, force: true });
}
