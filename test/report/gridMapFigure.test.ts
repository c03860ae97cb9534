// gridMapFigure: the SVG of one grid map. Structure checked directly (well-formed SVG, the raster
// as a PNG whose pixels follow the map, axes in nm, a scale bar), and the PNG encoder against
// the PNG specification.
import { describe, expect, it } from "vitest";
import { JSDOM } from "jsdom";
import { deflateSync, inflateSync } from "node:zlib";
import { analyzeGrid } from "../../lib/grid/analyzeGrid.ts";
import { GRID_MAP_FIGURE_DEFAULTS } from "../../lib/report/gridMapFigure.ts";
import { encodePng } from "../../lib/report/pngCanvas.ts";
import { loadGridMapFigure } from "../../lib/index.ts";
import { sphereDotCube } from "../fixtures/gridCubes.ts";

const grid = analyzeGrid(sphereDotCube({ nx: 12, ny: 8, stepNM: 0.6, centreNM: [1.2, 0] }), { eta: 0.8 });
const draw = await loadGridMapFigure();
const sMap = grid.maps.find((m) => m.label === "s")!;
const svg = draw(sMap);

/** Decodes an 8-bit RGBA PNG without filters (what encodePng writes): width, height, pixels. */
function decodePng(png: Uint8Array): { width: number; height: number; rgba: Uint8Array } {
  const view = new DataView(png.buffer, png.byteOffset, png.byteLength);
  const width = view.getUint32(16), height = view.getUint32(20);
  let o = 8;
  const idat: Uint8Array[] = [];
  while (o < png.length) {
    const len = view.getUint32(o);
    const type = String.fromCharCode(...png.subarray(o + 4, o + 8));
    if (type === "IDAT") idat.push(png.subarray(o + 8, o + 8 + len));
    o += 12 + len;
  }
  const raw = inflateSync(Buffer.concat(idat));
  const rgba = new Uint8Array(width * height * 4);
  for (let y = 0; y < height; y++) rgba.set(raw.subarray(y * (1 + 4 * width) + 1, (y + 1) * (1 + 4 * width)), y * 4 * width);
  return { width, height, rgba };
}

describe("gridMapFigure(map)", () => {
  it("is well-formed SVG with the title, nm axes, a legend and a scale bar", () => {
    const doc = new JSDOM(svg, { contentType: "image/svg+xml" }).window.document;
    expect(doc.documentElement.getAttribute("xmlns")).toBe("http://www.w3.org/2000/svg");
    expect(svg).toContain("s — 0.625 V");
    expect(svg).toContain("x (nm)");
    expect(svg).toContain("y (nm)");
    expect(svg).toContain("dI/dV (nS)");
    expect(svg).toMatch(/>\d+(\.\d+)? nm</);
  });
  it("holds the map as a PNG raster, one pixel per grid pixel, brightest at the dot centre (x = +1.2 nm, right of the middle)", () => {
    const hrefs = [...svg.matchAll(/href="data:image\/png;base64,([^"]+)"/g)].map((m) => Buffer.from(m[1], "base64"));
    const raster = hrefs.map((b) => decodePng(new Uint8Array(b))).find((p) => p.width === 12 && p.height === 8)!;
    expect(raster).toBeDefined();
    // viridis runs dark → yellow: the brightest (largest R + G) pixel is the map's maximum
    let best = 0, bestI = 0;
    for (let i = 0; i < 96; i++) {
      const v = raster.rgba[4 * i] + raster.rgba[4 * i + 1];
      if (v > best) [best, bestI] = [v, i];
    }
    const col = bestI % 12;
    // grid x = −3.3 + 0.6·col: the dot centre 1.2 nm is column 7.5, so column 7 or 8
    expect([7, 8]).toContain(col);
  });
  it("matches the snapshot (numbers rounded to 0.1, the PNG replaced by its size)", () => {
    // A snapshot of our own output, not a check value: inspect a difference, then update with
    // npx vitest run test/report -u.
    const rounded = svg
      .replace(/data:image\/png;base64,([^"]+)/g, (_m, b64: string) => {
        const png = Buffer.from(b64, "base64");
        return `png ${png.readUInt32BE(16)}x${png.readUInt32BE(20)}`;
      })
      .replace(/-?\d+\.\d+(e-?\d+)?/g, (x) => {
        const r = Number(Number(x).toFixed(1));
        return String(Object.is(r, -0) ? 0 : r);
      });
    expect(rounded).toMatchSnapshot();
  });
  it("defaults are locked", () => {
    expect(Object.isFrozen(GRID_MAP_FIGURE_DEFAULTS)).toBe(true);
    expect(GRID_MAP_FIGURE_DEFAULTS.scheme).toBe("viridis"); // perceptually uniform, colour-blind safe (common practice (no source))
    expect(GRID_MAP_FIGURE_DEFAULTS.width).toBe(420);
  });
});

describe("encodePng(image, deflate)", () => {
  it("writes the PNG signature, an IHDR of the size and pixels that inflate back (PNG specification, ISO/IEC 15948)", () => {
    const data = Uint8ClampedArray.from({ length: 3 * 2 * 4 }, (_, i) => (i * 37) % 256);
    const png = encodePng({ width: 3, height: 2, data }, deflateSync);
    expect(Array.from(png.subarray(0, 8))).toEqual([137, 80, 78, 71, 13, 10, 26, 10]);
    const back = decodePng(png);
    expect([back.width, back.height]).toEqual([3, 2]);
    expect(Array.from(back.rgba)).toEqual(Array.from(data));
  });
  it("gives the CRC of IEND that the specification fixes (0xAE426082)", () => {
    const png = encodePng({ width: 1, height: 1, data: Uint8ClampedArray.of(0, 0, 0, 255) }, deflateSync);
    expect(Array.from(png.subarray(png.length - 4))).toEqual([0xae, 0x42, 0x60, 0x82]);
  });
});
