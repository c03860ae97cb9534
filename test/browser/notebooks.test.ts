// The notebooks in a real browser: Debian's Chromium driven by playwright-core, the static build
// served on 127.0.0.1. Check values: facts of the trade and closed forms, named beside each check:
// the s level of a dot in shell filling holds two electrons, so its multiplet has two peaks
// whatever the smoothing; smoothing with a longer Savitzky–Golay window broadens the peaks (the
// filter's pass band narrows as the window grows: Savitzky & Golay, Anal. Chem. 36, 1627 (1964));
// a window in mV becomes the nearest odd number of bias steps, so the window shown is within one
// step of the window set (the project's documented rule); a bad file gives the line that
// `dotspec analyze` prints for it (the CLI itself is run as the reference). The size-series page
// is checked against `dotspec sizes` run in Node on the same files (by construction: the page
// calls the same library functions, so every value must agree); the demo's dot count is the
// number of dot ids in its META.csv, the size table the page reads. The grid page is checked
// against `analyzeGrid` run in Node on the same file (by construction), its s map against the
// closed-form RMS radius of the projected 1s density of a particle in a sphere,
// R·√((2/3)(1/3 − 1/(2π²))) (the grid tests' check value), its energies against E = η·V, and its
// bad files against the line `dotspec grid` prints; a grid the page analyses in slices against
// `analyzeGrid` on the whole grid (by construction: the parts of a pass make the whole pass).
//
// Screenshots go to artifacts/browser/ (git-ignored); so do the measured control-to-redraw
// times (timings.json), which are reported, not asserted: speed is not a test here.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { execFile } from "node:child_process";
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { cpus, loadavg, tmpdir } from "node:os";
import { join } from "node:path";
import { promisify } from "node:util";
import type { BrowserContext, Page } from "playwright-core";
import { buildNotebooks, ROOT } from "../../scripts/notebooks/buildNotebooks.ts";
import { serveStatic, type StaticServer } from "../../scripts/notebooks/serveStatic.ts";
import { expectClose } from "../helpers/expectClose.ts";
import {
  analysisToJson,
  analyzeCurve,
  analyzeGrid,
  compareModelsReasons,
  fitToJson,
  modelComparisonJson,
  etaFromMetadata,
  failureReason,
  fitCurve,
  formatUncertain,
  readCurveFile,
  formatCsv,
  GRID_PROFILE_COLUMNS,
  parseGridTable,
  readGridFile,
  parseCurveText,
  parseScenario,
  parseSizeFormula,
  parseSizeMeta,
  SIZE_TABLE_FILES,
  sizeSeriesTables,
  type GridJson,
  type SizeSeriesJson,
} from "../../lib/index.ts";
import { sphereDotCube } from "../fixtures/gridCubes.ts";
import { float32Npy } from "../../scripts/make-sample-grid.ts";

const CHROMIUM = "/usr/bin/chromium";
const HAVE_CHROMIUM = existsSync(CHROMIUM);
const ARTIFACTS = join(ROOT, "artifacts", "browser");
const LAUNCH_ARGS = [
  "--headless",
  "--no-sandbox",
  "--disable-gpu",
  "--disable-quic",
  "--no-first-run",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
];

if (!HAVE_CHROMIUM && !process.env.CI) {
  console.warn(
    "\n" +
      "!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!\n" +
      "!! SKIPPING the notebook browser tests: /usr/bin/chromium is not installed.\n" +
      "!! Install it with:  sudo apt-get update && sudo apt-get install -y chromium\n" +
      "!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!\n",
  );
}

describe.runIf(!HAVE_CHROMIUM && process.env.CI)("notebooks in Chromium (CI)", () => {
  it("needs /usr/bin/chromium", () => {
    throw new Error("/usr/bin/chromium is missing on CI: .ci/run must install it (apt-get install -y chromium) before npm test");
  });
});

describe.runIf(HAVE_CHROMIUM)("notebooks in Chromium", () => {
  let out = "";
  let profile = "";
  let served: StaticServer;
  let context: BrowserContext;
  /** Requests per host, and those refused because they left 127.0.0.1. */
  const requests = { local: 0, offHost: [] as string[] };
  const pageErrors: string[] = [];
  const work = mkdtempSync(join(tmpdir(), "dotspec-browser-files-"));

  beforeAll(async () => {
    mkdirSync(ARTIFACTS, { recursive: true });
    out = mkdtempSync(join(tmpdir(), "dotspec-notebooks-"));
    profile = mkdtempSync(join(tmpdir(), "dotspec-chromium-"));
    await buildNotebooks(out);
    served = await serveStatic(out, 0);
    const { chromium } = await import("playwright-core");
    context = await chromium.launchPersistentContext(profile, {
      executablePath: CHROMIUM,
      headless: true,
      args: LAUNCH_ARGS,
      viewport: { width: 1000, height: 900 },
      acceptDownloads: true,
    });
    await context.route("**/*", (route) => {
      const url = new URL(route.request().url());
      if (url.protocol === "blob:" || url.protocol === "data:") return route.continue();
      if (url.hostname === "127.0.0.1") {
        requests.local++;
        return route.continue();
      }
      requests.offHost.push(url.href);
      return route.abort();
    });
  }, 180_000);

  afterAll(async () => {
    await context?.close();
    await served?.close();
    for (const dir of [out, profile, work]) if (dir) rmSync(dir, { recursive: true, force: true });
  });

  async function open(name: string): Promise<Page> {
    const page = await context.newPage();
    page.on("pageerror", (e) => pageErrors.push(`${name}: ${e.message}`));
    await page.goto(served.url + name);
    return page;
  }

  /** Drops files (name, text, MIME type) on the page's drop zone, as a user dragging them from a folder. */
  async function dropFiles(page: Page, files: { name: string; text: string; type: string }[]): Promise<void> {
    const transfer = await page.evaluateHandle((list) => {
      const dt = new DataTransfer();
      for (const f of list) dt.items.add(new File([f.text], f.name, { type: f.type }));
      return dt;
    }, files);
    await page.dispatchEvent("[data-testid=drop-zone]", "drop", { dataTransfer: transfer });
  }

  /** The range input of an Inputs control, by its label. */
  const range = (page: Page, label: string) => page.locator(`form:has(> label:text-is("${label}")) input[type=range]`);
  const checkbox = (page: Page, label: string) => page.locator(`form:has(> label:text-is("${label}")) input[type=checkbox]`);

  async function setRange(page: Page, label: string, value: number): Promise<void> {
    await range(page, label).evaluate((el: HTMLInputElement, v: number) => {
      el.value = String(v);
      el.dispatchEvent(new Event("input", { bubbles: true }));
    }, value);
  }

  /** Peaks of the peak table: bias, FWHM (mV) and multiplet. */
  async function peakRows(page: Page): Promise<{ biasV: number; fwhmMV: number; multiplet: string }[]> {
    return page.locator("[data-testid=peak-table] tbody tr").evaluateAll((rows) =>
      rows.map((r) => ({
        biasV: Number((r as HTMLElement).dataset.biasV),
        fwhmMV: Number(r.children[4].textContent),
        multiplet: (r as HTMLElement).dataset.multiplet ?? "",
      })),
    );
  }

  async function errorCells(page: Page): Promise<number> {
    return page.locator(".observablehq--error").count();
  }

  /** The line `dotspec analyze FILE` prints for a file it cannot read, without "dotspec: ". */
  async function cliLine(dir: string, file: string): Promise<string> {
    const run = promisify(execFile);
    const result = await run(process.execPath, [join(ROOT, "bin", "dotspec.js"), "analyze", file], { cwd: dir }).then(
      () => ({ stderr: "" }),
      (err: { stderr: string }) => err,
    );
    const line = result.stderr.split("\n").find((l) => l.startsWith("dotspec: "));
    expect(line, `the CLI's message for ${file}`).toBeDefined();
    return line!.slice("dotspec: ".length);
  }

  it("the start page links the notebooks and loads nothing from elsewhere", async () => {
    const page = await open("index.html");
    await expect.poll(() => page.locator("main a[href='./curve.html']").count()).toBe(1);
    expect(await page.locator("main a[href='./model.html']").count()).toBe(1);
    expect(await page.locator("main a[href='./sizes.html']").count()).toBe(1);
    expect(await page.locator("main a[href='./grid.html']").count()).toBe(1);
    await page.close();
  });

  it("one curve: a sample through the file input; moving the smoothing window keeps the s doublet and broadens the peaks", async () => {
    const page = await open("curve.html");
    await page.locator("[data-testid=curve-figure] > svg").waitFor();
    await page.setInputFiles("[data-testid=file-input]", join(ROOT, "sample-curves", "dot-01.csv"));
    await expect.poll(() => page.locator("[data-testid=picked]").textContent()).toBe("dot-01.csv");
    await expect.poll(() => page.locator("[data-testid=curve-figure] > svg > title").first().textContent()).toContain("dot-01.csv");
    expect(await page.locator("[data-testid=import-columns] tbody tr").count()).toBe(4); // bias + 3 current sweeps, as in the file's header

    await checkbox(page, "automatic window").uncheck();
    const step = Number((await page.locator("[data-testid=import-summary]").textContent())!.match(/step ([\d.]+) mV/)![1]);
    const figures: string[] = [];
    const peaksAt: Record<number, Awaited<ReturnType<typeof peakRows>>> = {};
    for (const windowMV of [40, 80]) {
      await setRange(page, "smoothing window (mV)", windowMV);
      await expect
        .poll(async () => Math.abs(Number(await page.locator("[data-testid=settings]").getAttribute("data-window-mv")) - windowMV))
        .toBeLessThanOrEqual(step); // nearest odd number of bias steps: within one step of the window set
      expect(await page.locator("[data-testid=settings]").textContent()).toContain("as set");
      expect(await range(page, "smoothing window (mV)").inputValue()).toBe(String(windowMV));
      peaksAt[windowMV] = await peakRows(page);
      figures.push((await page.locator("[data-testid=curve-figure]").innerHTML())!);
      await page.screenshot({ path: join(ARTIFACTS, `curve-window-${windowMV}.png`), fullPage: true });
    }
    // Shell filling: the s doublet keeps its two peaks (spin degeneracy of the s level).
    expect(await page.locator("[data-testid=regime]").getAttribute("data-regime")).toBe("shell-filling");
    for (const w of [40, 80]) expect(peaksAt[w].filter((p) => p.multiplet === "s")).toHaveLength(2);
    // A longer window broadens the peaks: the mean FWHM of the s and p peaks grows.
    const meanFwhm = (rows: typeof peaksAt[number]) => {
      const sp = rows.filter((p) => p.multiplet === "s" || p.multiplet === "p");
      return sp.reduce((s, p) => s + p.fwhmMV, 0) / sp.length;
    };
    expect(meanFwhm(peaksAt[80])).toBeGreaterThan(meanFwhm(peaksAt[40]));
    // The plot changed with the window.
    expect(figures[0]).not.toBe(figures[1]);
    expect(await errorCells(page)).toBe(0);
    await page.close();
  });

  it("one curve: pointing at a peak's dot reads its bias, its energy (η × bias) and names its multiplet", async () => {
    const page = await open("curve.html");
    await page.locator("[data-testid=curve-figure] > svg").waitFor();
    const rows = await peakRows(page);
    const s1 = rows.find((p) => p.multiplet === "s")!;
    const dot = page.locator("[data-testid=curve-figure] circle", { hasText: `s: ${s1.biasV.toFixed(4)} V` });
    await dot.hover();
    await expect.poll(() => page.locator("[data-testid=readout]").textContent()).toMatch(/^bias /);
    const text = (await page.locator("[data-testid=readout]").textContent())!;
    // One px of the figure is (bias span)/(plot width) ≈ 10 mV here: the bias read is within 0.02 V.
    const bias = Number(/bias (-?[\d.]+) V/.exec(text)![1]);
    expect(Math.abs(bias - s1.biasV)).toBeLessThan(0.02);
    const energy = Number(/energy (-?[\d.]+) eV \(η = ([\d.]+)\)/.exec(text)![1]);
    const eta = Number(/η = ([\d.]+)\)/.exec(text)![1]);
    expect(Math.abs(energy - eta * bias)).toBeLessThanOrEqual(0.0015); // E = η·V, both shown to 1 meV / 1 mV
    expect(text).toContain(`peak at ${s1.biasV.toFixed(4)} V`);
    expect(text).toContain("(s)");
    await page.locator("[data-testid=curve-figure]").screenshot({ path: join(ARTIFACTS, "curve-pointer.png") });
    await page.close();
  });

  it("one curve: a file dropped on the zone is read like a picked one", async () => {
    const page = await open("curve.html");
    await page.locator("[data-testid=curve-figure] > svg").waitFor();
    const text = readFileSync(join(ROOT, "sample-curves", "dot-04.csv"), "utf8");
    await dropFiles(page, [{ name: "dropped-dot.csv", text, type: "text/csv" }]);
    await expect.poll(() => page.locator("[data-testid=curve-figure] > svg > title").first().textContent()).toContain("dropped-dot.csv");
    // The file's semicolon layout with a lock-in column: the measured dI/dV control is offered.
    expect(await checkbox(page, "use the measured dI/dV column").isDisabled()).toBe(false);
    await checkbox(page, "use the measured dI/dV column").check();
    await expect.poll(() => page.locator("[data-testid=settings]").textContent()).toContain("measured dI/dV");
    expect(await page.locator("[data-testid=peak-table] tbody tr").count()).toBeGreaterThan(0);
    expect(await errorCells(page)).toBe(0);
    await page.close();
  });

  it("the curve chosen in one notebook opens in the other (kept in the tab, not sent anywhere)", async () => {
    const page = await open("curve.html");
    await page.locator("[data-testid=curve-figure] > svg").waitFor();
    await page.locator("[data-testid=sample-select]").selectOption({ label: "dot-03.txt" });
    await expect.poll(() => page.locator("[data-testid=curve-figure] > svg > title").first().textContent()).toContain("dot-03.txt");
    await page.goto(served.url + "model.html");
    await expect.poll(() => page.locator("[data-testid=model-figure] > svg > title").first().textContent()).toContain("dot-03.txt");
    expect(await page.locator("[data-testid=sample-select]").inputValue()).toBe("2");
    const text = readFileSync(join(ROOT, "sample-curves", "dot-02.tsv"), "utf8");
    await dropFiles(page, [{ name: "my-dot.tsv", text, type: "text/tab-separated-values" }]);
    await expect.poll(() => page.locator("[data-testid=model-figure] > svg > title").first().textContent()).toContain("my-dot.tsv");
    await page.goto(served.url + "curve.html");
    await expect.poll(() => page.locator("[data-testid=curve-figure] > svg > title").first().textContent()).toContain("my-dot.tsv");
    expect(await page.locator("[data-testid=picked]").textContent()).toBe("my-dot.tsv");
    expect(await errorCells(page)).toBe(0);
    await page.close();
  });

  it("one curve: bad files give the CLI's one-line reason in the page, and no cell breaks", async () => {
    const page = await open("curve.html");
    await page.locator("[data-testid=curve-figure] > svg").waitFor();
    writeFileSync(join(work, "scan.dat"), Uint8Array.from([0x31, 0x2c, 0x00, 0x32, 0x0a, 0xff, 0x00]));
    writeFileSync(join(work, "notes.csv"), "# a lab note, not a sweep\nsample A looked fine\nno numbers here\n");
    for (const name of ["scan.dat", "notes.csv"]) {
      const expected = await cliLine(work, name);
      await page.setInputFiles("[data-testid=file-input]", join(work, name));
      await expect.poll(() => page.locator("[data-testid=problem]").first().textContent(), { timeout: 10_000 }).toBe(expected);
      // Nothing of the previous curve stays on the page.
      for (const stale of ["curve-figure", "peak-table", "quantities", "multiplets", "downloads", "settings", "regime"]) {
        expect(await page.locator(`[data-testid=${stale}]`).count(), stale).toBe(0);
      }
      expect(await errorCells(page)).toBe(0);
      await page.screenshot({ path: join(ARTIFACTS, `curve-bad-${name}.png`), fullPage: true });
    }
    // A good file afterwards clears the message.
    await page.locator("[data-testid=sample-select]").selectOption({ label: "dot-02.tsv" });
    await page.locator("[data-testid=curve-figure] > svg").waitFor();
    expect(await page.locator("[data-testid=problem]").count()).toBe(0);
    await page.close();
  });

  it("one curve: the downloads are the JSON record, the summary row and the figure", async () => {
    const page = await open("curve.html");
    await page.locator("[data-testid=curve-figure] > svg").waitFor();
    const save = async (label: string) => {
      const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("button", { name: label }).click()]);
      return { name: download.suggestedFilename(), text: readFileSync((await download.path())!, "utf8") };
    };
    const json = await save("JSON record");
    expect(json.name).toBe("dot-01.json");
    expect(JSON.parse(json.text).source).toBe("dot-01.csv");
    const csv = await save("CSV summary row");
    expect(csv.text.split("\n")[0].startsWith("source,regime,gap_V")).toBe(true);
    const svg = await save("SVG figure");
    expect(svg.text.startsWith("<svg")).toBe(true);
    await page.close();
  });

  it("one curve: measures control-to-redraw time on a 2,000-point curve (reported, not asserted)", async () => {
    const page = await open("curve.html");
    await page.locator("[data-testid=curve-figure] > svg").waitFor();
    expect(await page.locator("[data-testid=import-summary]").textContent()).toContain("2000 points");
    await checkbox(page, "automatic window").uncheck();
    await page.locator("[data-testid=settings]:has-text('as set')").waitFor();
    const times: number[] = [];
    const load = loadavg()[0];
    for (const windowMV of [30, 50, 35, 55, 40, 60, 45, 65, 30, 50, 35, 55, 40, 60, 45, 65, 30, 50, 35, 55]) {
      const ms = await page.evaluate((w) => {
        const input = [...document.querySelectorAll("form")].find((f) => f.querySelector(":scope > label")?.textContent === "smoothing window (mV)")!.querySelector("input[type=range]") as HTMLInputElement;
        const cell = document.querySelector("[data-testid=curve-figure]")!.parentElement!;
        const before = cell.querySelector("[data-testid=curve-figure]");
        return new Promise<number>((resolve) => {
          const t0 = performance.now();
          const seen = new MutationObserver(() => {
            const now = cell.querySelector("[data-testid=curve-figure]");
            if (now && now !== before) {
              seen.disconnect();
              requestAnimationFrame(() => resolve(performance.now() - t0));
            }
          });
          seen.observe(cell, { childList: true });
          input.value = String(w);
          input.dispatchEvent(new Event("input", { bubbles: true }));
        });
      }, windowMV);
      times.push(ms);
    }
    times.sort((a, b) => a - b);
    const median = (times[9] + times[10]) / 2;
    const version = context.browser()?.version() ?? (await page.evaluate(() => navigator.userAgent));
    writeFileSync(join(ARTIFACTS, "timings.json"), JSON.stringify({ what: "control to redraw, one-curve notebook, 2,000 points", chromium: version, loadAverage1min: load, msSorted: times, medianMs: median }, null, 2) + "\n");
    console.log(`control-to-redraw (2,000 points): median ${median.toFixed(1)} ms, range ${times[0].toFixed(1)}–${times[times.length - 1].toFixed(1)} ms (load average ${load.toFixed(1)} on ${cpus().length} cores)`);
    expect(times.every((t) => t > 0)).toBe(true);
    await page.close();
  });

  it("model: the fit runs from a button, its values come with errors and its residuals are drawn", async () => {
    const page = await open("model.html");
    await page.locator("[data-testid=model-figure] > svg").waitFor();
    const panels = () => page.locator("[data-testid=model-figure] > svg > svg").count();
    expect(await panels()).toBe(2);
    // Moving Ec redraws the model.
    const before = await page.locator("[data-testid=model-figure]").innerHTML();
    const ec = Number(await range(page, "charging energy Ec (eV)").inputValue());
    await setRange(page, "charging energy Ec (eV)", +(ec + 0.02).toFixed(3));
    await expect.poll(() => page.locator("[data-testid=model-figure]").innerHTML()).not.toBe(before);

    await page.getByRole("button", { name: "Run the fit" }).click();
    await page.locator("[data-testid=fit-values]").waitFor({ timeout: 20_000 });
    expect(await page.locator("[data-testid=fit-status]").getAttribute("data-converged")).toBe("true");
    // The headline follows the status, as `dotspec fit` heads it (not the optimiser's convergence).
    expect(await page.locator("[data-testid=fit-status]").getAttribute("data-status")).toBe("good");
    expect(await page.locator("[data-testid=fit-status]").textContent()).toMatch(/^Fit good: /);
    await expect.poll(panels).toBe(3);
    // The controls now start from the fit.
    await page.locator(".dotspec-note:has-text('The controls hold the fitted values')").waitFor();
    expect(await page.locator("[data-testid=model-figure]").textContent()).toContain("residual, data − fitted model (pA)");
    const rows = await page.locator("[data-testid=fit-values] tbody tr").allTextContents();
    expect(rows.some((r) => r.startsWith("charging energy Ec") && r.includes("±"))).toBe(true);
    await page.screenshot({ path: join(ARTIFACTS, "model-fit.png"), fullPage: true });
    expect(await errorCells(page)).toBe(0);
    await page.close();
  });

  it("model: with the comparison on, the page shows every grouping tried and the same values `fitCurve` gives in Node", async () => {
    const page = await open("model.html");
    await page.locator("[data-testid=model-figure] > svg").waitFor();
    await checkbox(page, "compare every grouping of the peaks (slower)").check();
    await page.getByRole("button", { name: "Run the fit" }).click();
    await page.locator("[data-testid=fit-alternatives]").waitFor({ timeout: 60_000 });
    // by construction: the page runs the library's fitCurve on the file as `dotspec fit --compare-models` does
    const { curve } = readCurveFile(join(ROOT, "sample-curves", "dot-01.csv"));
    const stated = etaFromMetadata(curve.meta.metadata);
    const analysis = analyzeCurve(curve, stated ? { eta: stated.eta } : {});
    const fit = fitCurve(analysis, { compareModels: true });
    expect(await page.locator("[data-testid=fit-status]").getAttribute("data-status")).toBe(fit.status);
    // The rules decide dot-01 (no note, the toggle started off), and the page weighs the fit
    // against them as `dotspec analyze --compare-models all` does.
    expect(compareModelsReasons(analysis, "undecided")).toBeNull();
    expect(await page.locator("[data-testid=rules-not-decisive]").count()).toBe(0);
    const weighed = modelComparisonJson(fitToJson(fit, analysisToJson(analysis)), "all", {
      ranBecause: compareModelsReasons(analysis, "all")!,
      rules: { regime: analysis.assignment.regime, chargingEnergyEV: analysis.assignment.energies.chargingEnergyEV },
    });
    expect(await page.locator("[data-testid=fit-decision]").getAttribute("data-decides")).toBe(String(weighed.decides));
    expect(await page.locator("[data-testid=fit-decision]").textContent()).toContain(weighed.decision!);
    expect(await page.locator("[data-testid=fit-alternatives] tbody tr").count()).toBe(fit.alternatives.length);
    const quantities = await page.locator("[data-testid=fit-quantities] tbody tr").allTextContents();
    const ec = formatUncertain(fit.chargingEnergyEV.value * 1000, fit.chargingEnergyEV.standardError * 1000);
    expect(quantities.find((r) => r.startsWith("charging energy Ec"))).toContain(`${ec} meV`);
    await page.screenshot({ path: join(ARTIFACTS, "model-compare.png"), fullPage: true });
    expect(await errorCells(page)).toBe(0);
    await page.close();
  });

  it("model: on a curve the rules do not decide (dot-06), the page says why and starts with the comparison on", async () => {
    const page = await open("model.html");
    await page.locator("[data-testid=sample-select]").selectOption({ label: "dot-06.tsv" });
    await page.locator("[data-testid=rules-not-decisive]").waitFor({ timeout: 20_000 });
    // by construction: the page asks the library's compareModelsReasons, as `dotspec analyze --compare-models` does
    const { curve } = readCurveFile(join(ROOT, "sample-curves", "dot-06.tsv"));
    const stated = etaFromMetadata(curve.meta.metadata);
    const reasons = compareModelsReasons(analyzeCurve(curve, stated ? { eta: stated.eta } : {}), "undecided");
    expect(reasons).not.toBeNull();
    expect(await page.locator("[data-testid=rules-not-decisive]").textContent()).toContain(reasons![0]);
    expect(await checkbox(page, "compare every grouping of the peaks (slower)").isChecked()).toBe(true);
    expect(await errorCells(page)).toBe(0);
    await page.close();
  });

  it("model: the simulated curve and its scenario download and read back with the library", async () => {
    const page = await open("model.html");
    await page.locator("[data-testid=model-figure] > svg").waitFor();
    const save = async (label: string) => {
      const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("button", { name: label }).click()]);
      return readFileSync((await download.path())!, "utf8");
    };
    const scenario = parseScenario(JSON.parse(await save("Scenario (JSON)")));
    const { curve } = parseCurveText(await save("Simulated curve (CSV)"), { source: "model.csv" });
    // The curve spans the scenario's bias axis: (to − from)/step + 1 points (closed form).
    expect(curve.biasV.length).toBe(Math.floor((scenario.bias.toV - scenario.bias.fromV) / scenario.bias.stepV + 1e-9) + 1);
    expect(await errorCells(page)).toBe(0);
    await page.close();
  });

  it("model: a bad file gives its reason in the page and no cell breaks", async () => {
    const page = await open("model.html");
    await page.locator("[data-testid=model-figure] > svg").waitFor();
    writeFileSync(join(work, "empty.csv"), "");
    const expected = await cliLine(work, "empty.csv");
    await page.setInputFiles("[data-testid=file-input]", join(work, "empty.csv"));
    await expect.poll(() => page.locator("[data-testid=problem]").first().textContent()).toBe(expected);
    for (const stale of ["model-figure", "fit-values", "simulate-downloads"]) expect(await page.locator(`[data-testid=${stale}]`).count(), stale).toBe(0);
    expect(await page.getByRole("button", { name: "Run the fit" }).count()).toBe(0);
    expect(await range(page, "charging energy Ec (eV)").count()).toBe(0);
    expect(await errorCells(page)).toBe(0);
    await page.close();
  });

  /** `dotspec sizes ARGS` run in DIR: its stdout and its "dotspec: " lines on stderr. */
  async function cliSizes(dir: string, args: string[]): Promise<{ stdout: string; lines: string[] }> {
    const run = promisify(execFile);
    const result = await run(process.execPath, [join(ROOT, "bin", "dotspec.js"), "sizes", ...args], { cwd: dir, maxBuffer: 64 << 20 }).then(
      (r) => r,
      (err: { stdout: string; stderr: string }) => err,
    );
    // The per-file failure lines only: not the closing count ("N done, N failed, …") nor warnings.
    const lines = result.stderr.split("\n").filter((l) => l.startsWith("dotspec: ")).map((l) => l.slice("dotspec: ".length));
    return { stdout: result.stdout, lines: lines.filter((l) => !/^\d+ done, /.test(l) && !/: (warning|note): /.test(l)) };
  }

  /** The per-dot table of the size-series page: one record per row, by column heading. */
  async function dotRows(page: Page): Promise<Record<string, string>[]> {
    return page.locator("[data-testid=dot-table] table").evaluate((table) => {
      const heads = [...table.querySelectorAll("thead th")].map((th) => th.textContent!.trim());
      return [...table.querySelectorAll("tbody tr")].map((tr) => Object.fromEntries([...tr.children].map((td, i) => [heads[i], td.textContent!.trim()])));
    });
  }

  it("size series: the demo series gives one row per dot with the values `dotspec sizes` computes, the flagged and unassigned curves, the fits and the figures", async () => {
    const series = join(ROOT, "sample-curves", "series");
    const page = await open("sizes.html");
    await page.locator("[data-testid=demo-series]").waitFor();
    // From the click to the next frame after the per-dot table is in the page (reported, not asserted).
    const load = loadavg()[0];
    const loadMs = await page.evaluate(
      () =>
        new Promise<number>((resolve) => {
          const t0 = performance.now();
          const seen = new MutationObserver(() => {
            if (document.querySelector("[data-testid=dot-table] table")) {
              seen.disconnect();
              requestAnimationFrame(() => resolve(performance.now() - t0));
            }
          });
          seen.observe(document.body, { childList: true, subtree: true });
          (document.querySelector("[data-testid=demo-series]") as HTMLButtonElement).click();
        }),
    );
    writeFileSync(join(ARTIFACTS, "timings-sizes.json"), JSON.stringify({ what: "demo series (28 curves of 800 points) from the click to the per-dot table", loadAverage1min: load, ms: loadMs }, null, 2) + "\n");
    console.log(`size series: demo series analysed and shown in ${loadMs.toFixed(0)} ms (load average ${load.toFixed(1)} on ${cpus().length} cores)`);
    await page.locator("[data-testid=dot-table] table").waitFor({ timeout: 60_000 });
    const reference = cliSizes(series, ["curves", "--meta", "META.csv", "--material", "InP", "--optical", "optical.csv", "--json"]);
    const record = JSON.parse((await reference).stdout) as SizeSeriesJson;
    // The demo's dot count: the distinct dot ids of its size table.
    const dots = new Set(parseSizeMeta(readFileSync(join(series, "META.csv"), "utf8"), "META.csv").map((r) => r.dot));
    const rows = await dotRows(page);
    expect(rows).toHaveLength(dots.size);
    expect(record.dots).toHaveLength(dots.size);
    // Every dot's gap and regime as the command gives them (the table shows 4 decimals).
    for (const d of record.dots) {
      const row = rows.find((r) => r.dot === d.dot)!;
      expect(row, d.dot).toBeDefined();
      expectClose(Number(row["gap (eV)"].split(" ± ")[0]), d.energies.gapEV!, { atol: 0.5e-4 + 1e-12, what: `${d.dot} gap shown to 4 decimals` });
      expect(row.regime.startsWith(d.regime === "shell-filling" ? "filling" : d.regime === "shell-tunneling" ? "tunnelling" : "undetermined"), d.dot).toBe(true);
    }
    // Flagged and unassigned curves, as the command lists them (the page names files without their folder).
    const flagged = await page.locator("[data-testid=flagged] tbody tr td:nth-child(2)").allTextContents();
    expect(new Set(flagged)).toEqual(new Set(record.dots.flatMap((d) => d.flags.map((f) => f.file.split("/").pop()))));
    expect(flagged.length).toBeGreaterThan(0);
    const unassigned = await page.locator("[data-testid=unassigned] tbody tr td:first-child").allTextContents();
    expect(unassigned).toEqual(record.unassigned.map((u) => u.file.split("/").pop()));
    // The Ec fit with ε_eff, the value the command fits.
    const charging = record.fits.find((f) => f.model === "charging-sphere")!;
    const ecRow = page.locator("[data-testid=fits] tbody tr[data-model=charging-sphere]");
    expect(await ecRow.count()).toBe(1);
    const epsShown = Number(/dielectricConstantEff = ([\d.]+)/.exec((await ecRow.textContent())!)![1]);
    const eps = charging.params.dielectricConstantEff;
    expectClose(epsShown, eps, { atol: 0.5 * 10 ** (Math.floor(Math.log10(eps)) - 3) + 1e-12, what: "ε_eff shown to 4 significant digits" });
    expect(await page.locator("[data-testid=fits] tbody tr").count()).toBe(record.fits.length);
    // The five figures of `dotspec sizes --out`, the optical pairing, the downloads.
    for (const name of ["gap", "chargingEnergy", "levelSpacing", "valence", "optical"]) {
      expect(await page.locator(`[data-testid=size-figure-${name}] > svg`).count(), name).toBe(1);
    }
    expect(await page.locator("[data-testid=optical] tbody tr").count()).toBe(record.optical!.reduce((s, p) => s + p.peaks.length, 0));
    const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("button", { name: "JSON record" }).click()]);
    const saved = JSON.parse(readFileSync((await download.path())!, "utf8")) as SizeSeriesJson;
    // The same numbers to rounding: Chromium's and Node's math functions may differ in the last bit.
    const ec = (j: SizeSeriesJson) => j.dots.map((d) => d.energies.chargingEnergyEV);
    expect(ec(saved).map((v) => v === null)).toEqual(ec(record).map((v) => v === null));
    expectClose(ec(saved).filter((v) => v !== null) as number[], ec(record).filter((v) => v !== null) as number[], { rtol: 1e-9, what: "Ec per dot, page vs dotspec sizes" });
    // The dots table of `dotspec sizes --out`: its columns and one row per dot (the library's tables of the command's record).
    const [csvDownload] = await Promise.all([page.waitForEvent("download"), page.getByRole("button", { name: "CSV: dots" }).click()]);
    expect(csvDownload.suggestedFilename()).toBe(SIZE_TABLE_FILES.dots);
    const csvLines = readFileSync((await csvDownload.path())!, "utf8").trimEnd().split("\n");
    const expectedDots = sizeSeriesTables(record, []).dots;
    expect(csvLines[0]).toBe(formatCsv([], expectedDots.columns).trimEnd());
    expect(csvLines).toHaveLength(1 + expectedDots.rows.length);
    expect(await page.locator("[data-testid=problems]").count()).toBe(0);
    await page.screenshot({ path: join(ARTIFACTS, "sizes-demo.png"), fullPage: true });
    await page.locator("[data-testid=dot-table]").screenshot({ path: join(ARTIFACTS, "sizes-dot-table.png") });
    await page.locator("[data-testid=drop-zone]").screenshot({ path: join(ARTIFACTS, "sizes-picker.png") });
    expect(await errorCells(page)).toBe(0);

    // A formula of the user's is fitted too; a hostile one is refused with the library's message.
    const formulaBox = page.locator("textarea");
    await formulaBox.fill("gapEV: Eg + a / R^2 ; a=1");
    await page.getByRole("button", { name: "Fit the formulas" }).click();
    const formulaRows = page.locator("[data-testid=fits] tbody tr[data-model^='formula: ']");
    await expect.poll(() => formulaRows.count()).toBe(1);
    expect(await formulaRows.getAttribute("data-quantity")).toBe("gapEV");
    const hostile = 'import("x")';
    const refusal = (() => {
      try {
        parseSizeFormula(hostile);
        return "accepted";
      } catch (error) {
        return failureReason("", error);
      }
    })();
    await formulaBox.fill(hostile);
    await page.getByRole("button", { name: "Fit the formulas" }).click();
    await expect.poll(() => page.locator("[data-testid=formula-problem]").textContent()).toBe(refusal);
    expect(refusal).toContain('"import"');
    await expect.poll(() => formulaRows.count()).toBe(0);
    expect(await ecRow.count()).toBe(1); // the rest of the series stands
    await page.screenshot({ path: join(ARTIFACTS, "sizes-formula-refused.png"), fullPage: true });
    expect(await errorCells(page)).toBe(0);
    await page.close();
  });

  it("size series: a bad file among good ones gives the line `dotspec sizes` prints for it, and the rest is still analysed", async () => {
    const dir = join(work, "series");
    mkdirSync(dir, { recursive: true });
    const good = ["qd-7-s01-1.csv", "qd-7-s01-2.csv", "qd-7-s02-1.csv", "qd-7-s02-2.csv", "qd-7-s02-3.csv"];
    for (const f of good) writeFileSync(join(dir, f), readFileSync(join(ROOT, "sample-curves", "series", "curves", f)));
    writeFileSync(join(dir, "broken.csv"), "# a lab note, not a sweep\nsample A looked fine\nno numbers here\n");
    const reference = cliSizes(dir, [".", "--json"]);
    const page = await open("sizes.html");
    await page.setInputFiles("[data-testid=curve-files]", [...good, "broken.csv"].map((f) => join(dir, f)));
    await page.locator("[data-testid=dot-table] table").waitFor({ timeout: 60_000 });
    const { stdout, lines } = await reference;
    expect(lines).toHaveLength(1);
    expect(lines[0].startsWith("broken.csv: ")).toBe(true);
    await expect.poll(() => page.locator("[data-testid=problems] [data-testid=problem]").allTextContents()).toEqual(lines);
    // Without a size table, each file's own "# dot:" and "# radius_nm:" lines: the dots the command finds.
    const record = JSON.parse(stdout) as SizeSeriesJson;
    const rows = await dotRows(page);
    expect(rows.map((r) => r.dot)).toEqual(record.dots.map((d) => d.dot));
    expect(rows.map((r) => r.curves)).toEqual(record.dots.map((d) => String(d.curves)));
    expect(await errorCells(page)).toBe(0);
    await page.screenshot({ path: join(ARTIFACTS, "sizes-bad-file.png"), fullPage: true });
    await page.close();
  });

  it("size series: a size table saved as Windows-1252 is read as the command reads it, with the command's warning", async () => {
    const dir = join(work, "series-latin1");
    mkdirSync(dir, { recursive: true });
    const names = ["qd-7-s01-1.csv", "qd-7-s01-2.csv"];
    for (const f of names) writeFileSync(join(dir, f), readFileSync(join(ROOT, "sample-curves", "series", "curves", f)));
    // WHATWG Encoding Standard: byte 0xB5 is µ in windows-1252 and not valid UTF-8 on its own
    writeFileSync(join(dir, "META.csv"), Buffer.concat([Buffer.from(`file,dot,radius_nm,notes\n${names[0]},D1,1.5,tip 5 `), Buffer.from([0xb5]), Buffer.from(`m\n${names[1]},D1,1.5,\n`)]));
    const reference = cliSizes(dir, [".", "--meta", "META.csv", "--json"]);
    const page = await open("sizes.html");
    await page.setInputFiles("[data-testid=meta-file]", join(dir, "META.csv"));
    await page.setInputFiles("[data-testid=curve-files]", names.map((f) => join(dir, f)));
    await page.locator("[data-testid=dot-table] table").waitFor({ timeout: 60_000 });
    const { lines } = await reference;
    const warning = lines.find((l) => l.startsWith("warning: "))!.slice("warning: ".length);
    expect(warning).toContain("META.csv: the file is not valid UTF-8");
    await expect.poll(() => page.locator("[data-testid=warnings] li").allTextContents()).toContain(warning);
    expect((await dotRows(page)).map((r) => r.dot)).toEqual(["D1"]);
    await page.close();
  });

  it("size series: files dropped on the zone, a META.csv among them taken as the size table", async () => {
    const series = join(ROOT, "sample-curves", "series");
    const names = ["qd-7-s03-1.csv", "qd-7-s03-2.csv", "qd-7-s05-1.csv", "qd-7-s05-2.csv"];
    // A size table of these four curves: the demo table's rows for them.
    const metaText = readFileSync(join(series, "META.csv"), "utf8").split("\n").filter((l) => !/^qd-7-/.test(l) || names.some((n) => l.startsWith(n + ","))).join("\n");
    const dots = new Set(parseSizeMeta(metaText, "META.csv").map((r) => r.dot));
    const files = [{ name: "META.csv", text: metaText }, ...names.map((name) => ({ name, text: readFileSync(join(series, "curves", name), "utf8") }))];
    const page = await open("sizes.html");
    await dropFiles(page, files.map((f) => ({ ...f, type: "text/csv" })));
    await page.locator("[data-testid=dot-table] table").waitFor({ timeout: 60_000 });
    expect(await page.locator("[data-testid=picked]").textContent()).toBe("4 curve files, size table META.csv");
    expect((await dotRows(page)).map((r) => r.dot)).toEqual([...dots]);
    expect(await page.locator("[data-testid=unassigned]").count()).toBe(0); // every dropped curve is in the table
    expect(await errorCells(page)).toBe(0);
    await page.close();
  });

  /** Rows of the grid page's map table: label, kind, RMS radius (nm, unrounded), and the cells as shown by column heading. */
  async function mapRows(page: Page): Promise<{ label: string; kind: string; rmsRadiusNM: number | null; cells: Record<string, string> }[]> {
    return page.locator("[data-testid=map-table]").evaluate((table) => {
      const heads = [...table.querySelectorAll("thead th")].map((th) => th.textContent!.trim());
      return [...table.querySelectorAll("tbody tr")].map((tr) => {
        const d = (tr as HTMLElement).dataset;
        return {
          label: d.label!,
          kind: d.kind!,
          rmsRadiusNM: d.rmsRadiusNm === "null" ? null : Number(d.rmsRadiusNm),
          cells: Object.fromEntries([...tr.children].map((td, i) => [heads[i], td.textContent!.trim()])),
        };
      });
    });
  }

  /** The line `dotspec grid ARGS` prints for an input it cannot read, without "dotspec: ". */
  async function cliGridLine(dir: string, args: string[]): Promise<string> {
    const run = promisify(execFile);
    const result = await run(process.execPath, [join(ROOT, "bin", "dotspec.js"), "grid", ...args], { cwd: dir }).then(
      () => ({ stderr: "" }),
      (err: { stderr: string }) => err,
    );
    const line = result.stderr.split("\n").find((l) => l.startsWith("dotspec: "));
    expect(line, `the CLI's message for ${args.join(" ")}`).toBeDefined();
    return line!.slice("dotspec: ".length);
  }

  /**
   * Bad grid files — a lab note as a table, an .npy cut short with its sidecar — and the lines
   * `dotspec grid` prints for them, asked for once and early (the CLI takes seconds to start here).
   */
  let gridBad: { dir: string; files: string[][]; lines: Promise<string[]> } | null = null;
  function gridBadFiles(): { dir: string; files: string[][]; lines: Promise<string[]> } {
    if (gridBad) return gridBad;
    const dir = join(work, "grid");
    mkdirSync(dir, { recursive: true });
    writeFileSync(join(dir, "notes.csv"), "# a lab note, not a grid\nsample A looked fine\nno numbers here\n");
    writeFileSync(join(dir, "cut.npy"), readFileSync(join(ROOT, "sample-curves", "grid", "dot-grid.npy")).subarray(0, 4096));
    writeFileSync(join(dir, "cut.json"), readFileSync(join(ROOT, "sample-curves", "grid", "dot-grid.json")));
    const files = [["notes.csv"], ["cut.npy", "cut.json"]];
    gridBad = { dir, files, lines: Promise.all(files.map((f) => cliGridLine(dir, [f[0]]))) };
    return gridBad;
  }

  it("grid maps: the demo grid gives the maps `analyzeGrid` finds in Node; the window and η change the table", async () => {
    gridBadFiles(); // the CLI's lines for the next test, while this one runs
    const page = await open("grid.html");
    await page.locator("[data-testid=map-table] tbody tr").first().waitFor({ timeout: 30_000 });
    // The same file analysed in this process with the demo's η (0.8, stated in the page).
    const grid = analyzeGrid(readGridFile(join(ROOT, "sample-curves", "grid", "dot-grid.npy")).cube, { eta: 0.8 });
    const rows = await mapRows(page);
    expect(rows.map((r) => r.label)).toEqual(grid.maps.map((m) => m.label));
    expect(rows.map((r) => r.label)).toEqual(expect.arrayContaining(["s", "p (multiplet)"]));
    // By construction (the page runs the same library): the s map's RMS radius to rounding
    // (Chromium's and Node's math functions may differ in the last bit).
    const sNode = grid.maps.find((m) => m.label === "s")!.rmsRadiusNM!;
    const sPage = rows.find((r) => r.label === "s")!.rmsRadiusNM!;
    expectClose(sPage, sNode, { rtol: 1e-9, what: "s map RMS radius, page vs analyzeGrid in Node" });
    // And the physics of the demo dot (R = 2.4 nm): RMS radius of the projected 1s density,
    // closed form R·√((2/3)(1/3 − 1/(2π²))) = 1.042 nm; 6 % for the noise floor and the 0.3 nm pixels, as in the grid tests.
    expectClose(sPage, 2.4 * Math.sqrt((2 / 3) * (1 / 3 - 1 / (2 * Math.PI ** 2))), { rtol: 0.06, what: "s map RMS radius vs the particle in a sphere" });
    // One map figure per map, drawn by the figure code of `dotspec grid --out`, and the profile plot.
    expect(await page.locator("[data-testid=map-figure]").evaluateAll((els) => els.map((e) => (e as HTMLElement).dataset.label))).toEqual(grid.maps.map((m) => m.label));
    expect(await page.locator("[data-testid=map-figure] > svg > text").first().textContent()).toMatch(/ — /);
    expect(await page.locator("[data-testid=reference-figure] > svg").count()).toBe(1);
    expect(await page.locator("[data-testid=profile-figure] svg").count()).toBeGreaterThan(0);
    expect(await page.locator("[data-testid=profile-figure]").textContent()).toContain("radius from the map's centre (nm)");
    await page.screenshot({ path: join(ARTIFACTS, "grid-demo.png"), fullPage: true });

    // Energies are η × bias (closed form): the s row at η = 0.8, then at η = 0.6.
    const sRow = async () => (await mapRows(page)).find((r) => r.label === "s")!;
    const sBias = grid.maps.find((m) => m.label === "s")!.biasV;
    expect(Number((await sRow()).cells["energy (eV)"])).toBeCloseTo(0.8 * sBias, 3);
    await setRange(page, "η (voltage division)", 0.6);
    await expect.poll(async () => Number((await sRow()).cells["energy (eV)"])).toBeCloseTo(0.6 * sBias, 3);

    // A longer smoothing window (a different Savitzky–Golay filter for every pixel) changes the maps' measures.
    const before = await mapRows(page);
    await checkbox(page, "automatic window").uncheck();
    await setRange(page, "smoothing window (mV)", 120);
    await expect
      .poll(async () => Math.abs(Number(await page.locator("[data-testid=settings]").getAttribute("data-window-mv")) - 120))
      .toBeLessThanOrEqual(9.25); // nearest odd number of bias steps (9.25 mV here): within one step of the window set
    await expect.poll(async () => (await mapRows(page)).find((r) => r.label === "s")?.rmsRadiusNM).not.toBe(before.find((r) => r.label === "s")!.rmsRadiusNM);
    const after = await mapRows(page);
    const windowed = analyzeGrid(readGridFile(join(ROOT, "sample-curves", "grid", "dot-grid.npy")).cube, { eta: 0.6, analyze: { windowMV: 120 } });
    expectClose(after.find((r) => r.label === "s")!.rmsRadiusNM!, windowed.maps.find((m) => m.label === "s")!.rmsRadiusNM!, { rtol: 1e-9, what: "s map RMS radius at 120 mV, page vs Node" });

    // The downloads: the record of `dotspec grid --json` for these settings, the profiles, a map.
    const save = async (label: string) => {
      const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("button", { name: label, exact: true }).click()]);
      return { name: download.suggestedFilename(), text: readFileSync((await download.path())!, "utf8") };
    };
    const record = JSON.parse((await save("JSON record")).text) as GridJson;
    expect(record.maps.map((m) => m.label)).toEqual(windowed.maps.map((m) => m.label));
    expect(record.settings.eta).toBe(0.6);
    const profiles = await save("CSV: radial profiles");
    expect(profiles.text.split("\n")[0]).toBe(GRID_PROFILE_COLUMNS.join(","));
    const sSvg = await save("SVG: s");
    expect(sSvg.name).toBe("dot-grid-s.svg");
    expect(sSvg.text.startsWith("<svg")).toBe(true);

    // Biases typed by hand replace the assigned peaks, as `--at` does; a list that is not numbers says so.
    const atBox = page.getByRole("textbox", { name: /map biases/ });
    await atBox.fill("0.9, 1.2");
    await page.getByRole("button", { name: "Map these biases" }).click();
    const atGrid = analyzeGrid(readGridFile(join(ROOT, "sample-curves", "grid", "dot-grid.npy")).cube, { eta: 0.6, analyze: { windowMV: 120 }, atV: [0.9, 1.2] });
    await expect.poll(async () => (await mapRows(page)).map((r) => r.label)).toEqual(atGrid.maps.map((m) => m.label));
    expect(atGrid.maps.slice(0, 2).map((m) => m.label)).toEqual(["at 0.900 V", "at 1.200 V"]);
    await atBox.fill("0.9; x");
    await page.getByRole("button", { name: "Map these biases" }).click();
    await expect.poll(() => page.locator("[data-testid=problem]").first().textContent()).toContain('got "0.9; x"');
    expect(await page.locator("[data-testid=map-table]").count()).toBe(0);
    expect(await errorCells(page)).toBe(0);
    await page.close();
  });

  it("grid maps: a long table dropped on the zone is read and analysed as in Node; bad files give the line `dotspec grid` prints", async () => {
    // A small long table of the grid tests' sphere dot (10 × 10 pixels), written as the README shows it.
    const cube = sphereDotCube({ nx: 10, ny: 10, stepNM: 0.6 });
    const lines = ["x (nm),y (nm),bias (V),current (pA)"];
    const nb = cube.biasV.count;
    for (let iy = 0; iy < cube.yNM.count; iy++)
      for (let ix = 0; ix < cube.xNM.count; ix++)
        for (let k = 0; k < nb; k++) {
          const x = cube.xNM.start + ix * cube.xNM.step, y = cube.yNM.start + iy * cube.yNM.step, v = cube.biasV.start + k * cube.biasV.step;
          lines.push(`${x.toFixed(3)},${y.toFixed(3)},${v.toFixed(5)},${(cube.currentA[(iy * cube.xNM.count + ix) * nb + k] * 1e12).toPrecision(6)}`);
        }
    const tableText = lines.join("\n") + "\n";
    const grid = analyzeGrid(parseGridTable(tableText, { source: "scan.csv" }).cube);
    const page = await open("grid.html");
    await page.locator("[data-testid=map-table] tbody tr").first().waitFor({ timeout: 30_000 });
    await dropFiles(page, [{ name: "scan.csv", text: tableText, type: "text/csv" }]);
    await expect.poll(() => page.locator("[data-testid=grid-summary]").textContent()).toContain("scan.csv: 10 × 10 pixels");
    await expect.poll(async () => (await mapRows(page).catch(() => [])).map((r) => r.label)).toEqual(grid.maps.map((m) => m.label));
    // No η for one's own files (taken as 1, as `dotspec grid` without --eta): the same s map.
    expectClose((await mapRows(page)).find((r) => r.label === "s")!.rmsRadiusNM!, grid.maps.find((m) => m.label === "s")!.rmsRadiusNM!, { rtol: 1e-9, what: "s map RMS radius of the dropped table, page vs Node" });
    expect(await errorCells(page)).toBe(0);

    const { dir, files: badFiles, lines: cliLines } = gridBadFiles();
    const expectedLines = await cliLines;
    for (const [i, files] of badFiles.entries()) {
      const expected = expectedLines[i];
      await page.setInputFiles("[data-testid=grid-files]", files.map((f) => join(dir, f)));
      await expect.poll(() => page.locator("[data-testid=problem]").first().textContent(), { timeout: 10_000 }).toBe(expected);
      for (const stale of ["map-table", "maps", "reference-figure", "profile-figure", "downloads", "settings", "grid-summary"]) {
        expect(await page.locator(`[data-testid=${stale}]`).count(), stale).toBe(0);
      }
      expect(await errorCells(page)).toBe(0);
      await page.screenshot({ path: join(ARTIFACTS, `grid-bad-${files[0]}.png`), fullPage: true });
    }
    // The demo grid afterwards clears the message.
    await page.locator("[data-testid=demo-grid]").click();
    await page.locator("[data-testid=map-table] tbody tr").first().waitFor();
    expect(await page.locator("[data-testid=problem]").count()).toBe(0);
    await page.close();
  });

  it("grid maps: a grid of several slices shows its progress and gives the maps of `analyzeGrid` on the whole grid", async () => {
    // The demo grid tiled 3 × 3 (72 × 72 pixels × 241 biases, 1.25 M samples): more than one slice
    // of about a million samples per pass, so the page runs each pass in parts and shows a progress bar.
    const demo = readGridFile(join(ROOT, "sample-curves", "grid", "dot-grid.npy")).cube;
    const n = demo.xNM.count, tiles = 3, N = n * tiles, nb = demo.biasV.count;
    const tiled = new Float32Array(N * N * nb);
    for (let iy = 0; iy < N; iy++)
      for (let ix = 0; ix < N; ix++) {
        const from = ((iy % n) * n + (ix % n)) * nb;
        tiled.set(demo.currentA.subarray(from, from + nb), (iy * N + ix) * nb);
      }
    const dir = join(work, "tiled");
    mkdirSync(dir, { recursive: true });
    writeFileSync(join(dir, "tiled.npy"), float32Npy(tiled, [N, N, nb]));
    const sidecar = { xNM: [demo.xNM.start, demo.xNM.step, N], yNM: [demo.yNM.start, demo.yNM.step, N], biasV: [demo.biasV.start, demo.biasV.step, nb], currentUnit: "A" };
    writeFileSync(join(dir, "tiled.json"), JSON.stringify(sidecar));
    const grid = analyzeGrid(readGridFile(join(dir, "tiled.npy")).cube);
    const page = await open("grid.html");
    await page.locator("[data-testid=map-table] tbody tr").first().waitFor({ timeout: 30_000 });
    await page.evaluate(() => {
      const w = window as unknown as { progressSeen: number };
      w.progressSeen = 0;
      new MutationObserver(() => {
        if (document.querySelector("[data-testid=progress] progress")) w.progressSeen++;
      }).observe(document.body, { childList: true, subtree: true });
    });
    await page.setInputFiles("[data-testid=grid-files]", [join(dir, "tiled.npy"), join(dir, "tiled.json")]);
    await expect.poll(() => page.locator("[data-testid=grid-summary]").textContent()).toContain("tiled.npy: 72 × 72 pixels");
    await expect.poll(async () => (await mapRows(page).catch(() => [])).map((r) => r.label), { timeout: 30_000 }).toEqual(grid.maps.map((m) => m.label));
    expect(await page.evaluate(() => (window as unknown as { progressSeen: number }).progressSeen)).toBeGreaterThan(0);
    expect(await page.locator("[data-testid=progress]").count()).toBe(0); // gone when done
    // By construction: the parts of each pass put together are the pass over the whole grid.
    const rows = await mapRows(page);
    for (const m of grid.maps) {
      const row = rows.find((r) => r.label === m.label)!;
      if (m.rmsRadiusNM === null) expect(row.rmsRadiusNM, m.label).toBeNull();
      else expectClose(row.rmsRadiusNM!, m.rmsRadiusNM, { rtol: 1e-9, what: `${m.label} RMS radius, page in slices vs analyzeGrid in Node` });
    }
    expect(await errorCells(page)).toBe(0);
    await page.close();
  });

  it("no page raised an error and no request left 127.0.0.1", () => {
    expect(pageErrors).toEqual([]);
    expect(requests.offHost).toEqual([]);
    expect(requests.local).toBeGreaterThan(10); // the counting saw the page's own requests
  });
});
