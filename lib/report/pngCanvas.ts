/**
 * A minimal canvas for drawing rasters outside a browser: enough of HTMLCanvasElement and its 2-D
 * context for Observable Plot's raster mark (createImageData, putImageData, toDataURL as PNG).
 *
 * The zlib compressor is handed in (Node's `deflateSync`, loaded by the figure loader only outside
 * a browser), so this module imports nothing of Node and the public entry can reach it.
 */

/** A zlib (RFC 1950) compressor: Node's `zlib.deflateSync`. */
export type Deflate = (bytes: Uint8Array) => Uint8Array;

interface ImageDataLike {
  width: number;
  height: number;
  data: Uint8ClampedArray;
}

const CRC_TABLE = (() => {
  const t = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    t[n] = c >>> 0;
  }
  return t;
})();

/** CRC-32 of the PNG specification (ISO/IEC 15948, Annex D). */
function crc32(bytes: Uint8Array): number {
  let c = 0xffffffff;
  for (const b of bytes) c = CRC_TABLE[(c ^ b) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

function chunk(type: string, data: Uint8Array): Uint8Array {
  const out = new Uint8Array(12 + data.length);
  const view = new DataView(out.buffer);
  view.setUint32(0, data.length);
  for (let i = 0; i < 4; i++) out[4 + i] = type.charCodeAt(i);
  out.set(data, 8);
  view.setUint32(8 + data.length, crc32(out.subarray(4, 8 + data.length)));
  return out;
}

/**
 * Encodes RGBA pixels as a PNG file (8-bit RGBA, no filtering, zlib-compressed).
 *
 * References
 * ----------
 * W3C, Portable Network Graphics (PNG) Specification (Second Edition), ISO/IEC 15948:2003.
 *
 * Example
 * -------
 * ```ts
 * encodePng({ width: 1, height: 1, data: Uint8ClampedArray.of(255, 0, 0, 255) }, deflateSync).subarray(0, 8);
 * // => [137, 80, 78, 71, 13, 10, 26, 10]  (the PNG signature)
 * ```
 */
export function encodePng(image: ImageDataLike, deflate: Deflate): Uint8Array {
  const { width, height, data } = image;
  const raw = new Uint8Array(height * (1 + 4 * width));
  for (let y = 0; y < height; y++) {
    raw[y * (1 + 4 * width)] = 0; // filter: none
    raw.set(data.subarray(y * 4 * width, (y + 1) * 4 * width), y * (1 + 4 * width) + 1);
  }
  const ihdr = new Uint8Array(13);
  const v = new DataView(ihdr.buffer);
  v.setUint32(0, width);
  v.setUint32(4, height);
  ihdr.set([8, 6, 0, 0, 0], 8); // 8 bits, RGBA, deflate, no filter method, no interlace
  const parts = [Uint8Array.of(137, 80, 78, 71, 13, 10, 26, 10), chunk("IHDR", ihdr), chunk("IDAT", new Uint8Array(deflate(raw))), chunk("IEND", new Uint8Array(0))];
  const out = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
  let o = 0;
  for (const p of parts) {
    out.set(p, o);
    o += p.length;
  }
  return out;
}

/** "rgb(r, g, b)", "rgba(r, g, b, a)" or "#rrggbb" as RGBA bytes (black for anything else). */
function parseColor(style: string): [number, number, number, number] {
  const m = /^rgba?\(\s*([\d.]+)[,\s]+([\d.]+)[,\s]+([\d.]+)(?:[,\s/]+([\d.]+))?\s*\)$/.exec(style.trim());
  if (m) return [+m[1], +m[2], +m[3], m[4] === undefined ? 255 : Math.round(+m[4] * 255)];
  const h = /^#([0-9a-f]{6})$/i.exec(style.trim());
  if (h) return [parseInt(h[1].slice(0, 2), 16), parseInt(h[1].slice(2, 4), 16), parseInt(h[1].slice(4, 6), 16), 255];
  return [0, 0, 0, 255];
}

/**
 * A canvas element stand-in: `putImageData` (rasters) and `fillRect` with an `rgb()`/`#rrggbb`
 * `fillStyle` (colour ramps), and `toDataURL()` returning the PNG of the pixels.
 */
function pngCanvas(deflate: Deflate): unknown {
  let image: ImageDataLike | null = null;
  const pixels = (): ImageDataLike => {
    if (!image || image.width !== canvas.width || image.height !== canvas.height) {
      image = { width: canvas.width, height: canvas.height, data: new Uint8ClampedArray(canvas.width * canvas.height * 4) };
    }
    return image;
  };
  const context = {
    fillStyle: "#000000",
    createImageData: (w: number, h: number): ImageDataLike => ({ width: w, height: h, data: new Uint8ClampedArray(w * h * 4) }),
    putImageData: (img: ImageDataLike) => {
      image = img;
    },
    fillRect: (x: number, y: number, w: number, h: number) => {
      const img = pixels();
      const rgba = parseColor(String(context.fillStyle));
      for (let j = Math.max(0, y); j < Math.min(img.height, y + h); j++)
        for (let i = Math.max(0, x); i < Math.min(img.width, x + w); i++) img.data.set(rgba, 4 * (j * img.width + i));
    },
  };
  const canvas = {
    width: 0,
    height: 0,
    getContext: () => context,
    toDataURL: () => `data:image/png;base64,${Buffer.from(encodePng(pixels(), deflate)).toString("base64")}`,
  };
  return canvas;
}

/**
 * The same document, except that `createElement("canvas")` gives a PNG canvas: for drawing Plot
 * rasters with a DOM that has no canvas (jsdom in Node). `deflate` compresses the PNG data
 * (Node's `zlib.deflateSync`).
 */
export function withPngCanvas(document: Document, deflate: Deflate): Document {
  return new Proxy(document, {
    get(target, key) {
      if (key === "createElement") return (name: string, opts?: ElementCreationOptions) => (String(name).toLowerCase() === "canvas" ? pngCanvas(deflate) : target.createElement(name, opts));
      const value = Reflect.get(target, key, target);
      return typeof value === "function" ? value.bind(target) : value;
    },
  });
}
