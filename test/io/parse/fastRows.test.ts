// The importer's fast lane for plain numeric tables (lib/io/parse/fastRows.ts).
//
// Sources of the expected values:
// - "exact equivalence": the general path of the importer (parseCurveTextGeneral, every text read
//   a string per line and per cell) is the source of truth; the lane must give the same curve
//   (every Float64Array bit-equal, Object.is per element), the same record, or the same error;
// - number syntax: ECMA-262 StringToNumber, i.e. what Number("…") gives (the lane's m·10^k and
//   m/10^k with both operands exact is one correctly rounded operation: closed form).
import { readdirSync, readFileSync, statSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { isDotspecError } from "../../../lib/util/errors.ts";
import { seededRandom, type SeededRandom } from "../../../lib/util/random.ts";
import { FAST_LANE, plainHead, readPlainRows, type PlainRows } from "../../../lib/io/parse/fastRows.ts";
import { resolveParseOptions, type ParseOptions } from "../../../lib/io/parse/options.ts";
import { curveHead, parseCurveText, parseCurveTextGeneral, type ParsedCurve } from "../../../lib/io/parse/parseCurveText.ts";

const root = join(dirname(fileURLToPath(import.meta.url)), "..", "..", "..");

/** The lane's rows for a text, or null when it gives up (as parseCurveText runs it). */
function laneRows(text: string, options: ParseOptions = {}): PlainRows | null {
  const o = resolveParseOptions(options);
  const head = plainHead(text, o);
  if (!head) return null;
  try {
    return readPlainRows(text, head, curveHead(head.text, o, head.format));
  } catch (e) {
    if (isDotspecError(e)) return null;
    throw e;
  }
}

type Outcome = { parsed: ParsedCurve } | { code: string; message: string };

function outcome(f: () => ParsedCurve): Outcome {
  try {
    return { parsed: f() };
  } catch (e) {
    if (!isDotspecError(e)) throw e;
    return { code: e.code, message: e.message };
  }
}

/** Elements of two arrays that are not the same double (Object.is), and a length mismatch. */
function differences(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let bad = a.length === b.length ? 0 : 1;
  for (let i = 0; i < Math.min(a.length, b.length); i++) if (!Object.is(a[i], b[i])) bad++;
  return bad;
}

/** The fast and general roads give the same curve and record, or the same error. */
function expectSameRoads(text: string, options: ParseOptions = {}): Outcome {
  const fast = outcome(() => parseCurveText(text, options));
  const general = outcome(() => parseCurveTextGeneral(text, options));
  if (!("parsed" in general)) {
    expect(fast).toEqual(general);
    return general;
  }
  expect("parsed" in fast).toBe(true);
  const a = (fast as { parsed: ParsedCurve }).parsed;
  const b = general.parsed;
  const arrays = (p: ParsedCurve) => [p.curve.biasV, p.curve.currentA, p.curve.didvS ?? new Float64Array(0), ...p.curve.sweeps];
  expect(a.curve.sweeps.length).toBe(b.curve.sweeps.length);
  expect(a.curve.didvS === null).toBe(b.curve.didvS === null);
  const fa = arrays(a);
  const fb = arrays(b);
  for (let k = 0; k < fa.length; k++) expect(differences(fa[k], fb[k])).toBe(0);
  expect(a.curve.meta).toEqual(b.curve.meta);
  expect(a.record).toEqual(b.record);
  return general;
}

/** Every text file of curves under a folder of the repository. */
function curveFiles(folder: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(join(root, folder))) {
    const path = join(root, folder, name);
    if (statSync(path).isDirectory()) out.push(...curveFiles(join(folder, name)));
    else if (/\.(csv|tsv|txt|dat)$/i.test(name)) out.push(join(folder, name));
  }
  return out;
}

describe("fast lane: the repository's curve files (exact equivalence with the general path)", () => {
  const files = [...curveFiles("sample-curves"), ...curveFiles(join("test", "fixtures"))];
  it("finds the sample curves and fixtures", () => {
    expect(files.length).toBeGreaterThanOrEqual(30);
  });
  for (const file of files) {
    it(file, () => {
      const text = readFileSync(join(root, file), "utf8");
      expectSameRoads(text, { source: file });
    });
  }
  it("takes the lane on the large plain sample curves (not on the decimal-comma one)", () => {
    // dot-04.csv writes decimal commas: the lane gives it to the general path (by construction).
    const taken = ["dot-01.csv", "dot-02.tsv", "dot-03.txt", "dot-04.csv", "dot-05.dat", "dot-06.tsv"].map(
      (f) => laneRows(readFileSync(join(root, "sample-curves", f), "utf8")) !== null,
    );
    expect(taken).toEqual([true, true, true, false, true, true]);
  });
});

// ---- generated tables ----

type Layout = {
  delimiter: "," | ";" | "\t" | "whitespace";
  eol: "\n" | "\r\n";
  header: boolean;
  currents: number;
  shape: "up" | "down" | "upDown" | "downUp" | "upUp";
  other: boolean;
};

const pick = <T,>(rng: SeededRandom, xs: readonly T[]): T => xs[Math.floor(rng.uniform() * xs.length)];

/** A number written one of many ways: few to many digits, fixed or exponent form, signs, case. */
function writeNumber(x: number, rng: SeededRandom): string {
  const style = Math.floor(rng.uniform() * 8);
  let s: string;
  if (style === 0) s = x.toPrecision(1 + Math.floor(rng.uniform() * 17));
  else if (style === 1) s = x.toExponential(Math.floor(rng.uniform() * 20));
  else if (style === 2) s = String(x);
  else if (style === 3) s = x.toExponential(Math.floor(rng.uniform() * 9)).replace("e", "E");
  else if (style === 4 && Math.abs(x) < 1e6) s = x.toFixed(Math.floor(rng.uniform() * 21));
  else s = x.toPrecision(1 + Math.floor(rng.uniform() * 10));
  // Signs and exponents as some writers put them: "+1.5", "1.5e+03", "1.5e-007".
  if (s.indexOf("e") < 0 && s.indexOf("E") < 0 && !s.startsWith("-") && rng.uniform() < 0.1) s = "+" + s;
  if (rng.uniform() < 0.1) s = s.replace(/([eE][+-])(\d+)$/, (_, e: string, d: string) => e + d.padStart(3, "0"));
  if (rng.uniform() < 0.05) s = s.replace(/e\+/, "e");
  return s;
}

/** A current-like value: any sign, magnitudes from 1e-20 to 1e5, exact zeros and -0 now and then. */
function currentValue(rng: SeededRandom): number {
  const u = rng.uniform();
  if (u < 0.02) return 0;
  if (u < 0.03) return -0;
  return (rng.uniform() - 0.5) * 10 ** Math.floor(rng.uniform() * 25 - 20);
}

/** The bias of each row, in mV: one sweep of 200–600 rows or two of 100–500 over ±(0.5 … 3) V. */
function biasRows(layout: Layout, rng: SeededRandom): number[] {
  const single = layout.shape === "up" || layout.shape === "down";
  const n = (single ? 200 : 100) + Math.floor(rng.uniform() * 400);
  const span = 500 + Math.floor(rng.uniform() * 2500);
  const up = Array.from({ length: n }, (_, k) => -span + (2 * span * k) / (n - 1));
  const down = [...up].reverse();
  const sweeps = { up: [up], down: [down], upDown: [up, down], downUp: [down, up], upUp: [up, up] }[layout.shape];
  return sweeps.flat();
}

/** A plain table of the layout, seeded: the bias in mV, currents in pA, an ignored column. */
function makeTable(layout: Layout, seed: number): string {
  const rng = seededRandom(seed);
  const bias = biasRows(layout, rng);
  const names = ["bias(mV)", ...Array.from({ length: layout.currents }, (_, k) => `I${k + 1}(${pick(rng, ["pA", "nA", "A", "fA"])})`)];
  if (layout.other) names.splice(1, 0, "z(nm)");
  const join = (cells: string[]): string => {
    if (layout.delimiter !== "whitespace") return cells.join(layout.delimiter);
    let s = rng.uniform() < 0.3 ? " ".repeat(1 + Math.floor(rng.uniform() * 3)) : "";
    cells.forEach((c, k) => (s += (k > 0 ? pick(rng, [" ", "  ", "\t", " \t ", "    "]) : "") + c));
    return s + (rng.uniform() < 0.2 ? pick(rng, [" ", "\t", "   "]) : "");
  };
  const lines: string[] = [];
  if (layout.header) lines.push(join(names));
  for (const b of bias) {
    const cells = [b.toFixed(Math.floor(3 + rng.uniform() * 6))];
    if (layout.other) cells.push(pick(rng, ["0.52", "0.5", "x", "n/a", "-", "1e3"]));
    for (let k = 0; k < layout.currents; k++) cells.push(writeNumber(currentValue(rng), rng));
    lines.push(join(cells));
  }
  return lines.join(layout.eol) + (rng.uniform() < 0.8 ? layout.eol : "");
}

describe("fast lane: generated plain tables (exact equivalence with the general path)", () => {
  const delimiters = [",", ";", "\t", "whitespace"] as const;
  const shapes = ["up", "down", "upDown", "downUp", "upUp"] as const;
  let seed = 1;
  for (const delimiter of delimiters) {
    for (const eol of ["\n", "\r\n"] as const) {
      for (const header of [true, false]) {
        it(`${JSON.stringify(delimiter)}, ${JSON.stringify(eol)}, ${header ? "header" : "no header"}`, () => {
          for (let currents = 1; currents <= 3; currents++) {
            for (const shape of shapes) {
              const layout: Layout = { delimiter, eol, header, currents, shape, other: header && currents !== 2 };
              const text = makeTable(layout, seed++);
              // Every generated table is plain: the lane must take it (by construction).
              expect(laneRows(text)).not.toBeNull();
              const general = expectSameRoads(text);
              expect("parsed" in general).toBe(true);
            }
          }
        });
      }
    }
  }

  it("with a byte-order mark, comments and a preamble in the head, and with options", () => {
    const table = makeTable({ delimiter: ",", eol: "\r\n", header: true, currents: 3, shape: "upDown", other: true }, 4242);
    const texts = [
      "\ufeff" + table,
      "# T: 4.5 K\r\n% tip = W\r\nInstrument X\r\nrun: 7\r\n\r\n" + table,
      "\ufeff# sweep: 1\n\n" + table.replace(/\r\n/g, "\n"),
    ];
    for (const text of texts) {
      expect(laneRows(text)).not.toBeNull();
      expectSameRoads(text);
    }
    // Options: a current column left out (its numbers then skipped as an ignored column), the
    // tip-bias convention, units for a headerless file, a high minimum of points (an error).
    const headerless = makeTable({ delimiter: "\t", eol: "\n", header: false, currents: 3, shape: "up", other: false }, 99);
    const options: ParseOptions[] = [{ currentColumns: [2] }, { biasPolarity: "tip" }, { biasUnit: "mV", currentUnit: "nA" }, { minPoints: 100_000 }, { delimiter: "whitespace" }];
    for (const o of options) {
      expectSameRoads(headerless, o);
      expectSameRoads(texts[1], o);
    }
    expect(laneRows(headerless, { currentColumns: [2] })).not.toBeNull();
  });

  it("the lane's column values equal readNumbers' (the general stage 6) cell by cell", () => {
    const text = makeTable({ delimiter: ",", eol: "\n", header: true, currents: 3, shape: "upDown", other: true }, 77);
    const rows = laneRows(text)!;
    const cells = text.trim().split("\n").slice(1).map((l) => l.split(","));
    const scale = [1e3, 0, ...text.split("\n")[0].split(",").slice(2).map((h) => ({ pA: 1e12, nA: 1e9, A: 1, fA: 1e15 })[h.slice(3, -1)]!)];
    expect(rows.values[1]).toBeNull();
    for (const c of [0, 2, 3, 4]) {
      // toSI divides by the unit's power of ten (lib/io/units.ts): the same double as Number(cell)/scale.
      const expected = cells.map((row) => Number(row[c]) / scale[c]!);
      expect(differences(rows.values[c]!, expected)).toBe(0);
    }
  });
});

describe("fast lane: texts that are not plain go to the general path", () => {
  const base = (rows = 300, eol = "\n") => "bias (V),current (pA)" + eol + Array.from({ length: rows }, (_, k) => `${(k / 100).toFixed(2)},${(k * 0.37).toFixed(3)}`).join(eol) + eol;
  const lines = base().split("\n");
  const withLine = (k: number, line: string) => [...lines.slice(0, k), line, ...lines.slice(k)].join("\n");
  const withCell = (k: number, cell: string) => lines.map((l, i) => (i === k ? l.replace(/,.*/, "," + cell) : l)).join("\n");
  const cases: [string, string][] = [
    ["quotes", withCell(150, '"12.5"')],
    ["a comment line after the head", withLine(150, "# T: 4.5 K")],
    ["a % comment line after the head", withLine(150, "% note")],
    ["a blank line after the head", withLine(150, "")],
    ["a line of spaces after the head", withLine(150, "   ")],
    ["blank lines at the end", base() + "\n\n"],
    ["a ragged row (one cell more)", withCell(150, "1.5,2.5")],
    ["a ragged row (one cell less)", lines.map((l, i) => (i === 150 ? "1.49" : l)).join("\n")],
    ["CR-only line ends", base(300, "\r")],
    ["a lone CR in the data", withCell(150, "1\r5")],
    ["a decimal comma", base().replace(/,/g, ";").replace(/\./g, ",")],
    ["a trailing delimiter", base().replace(/\n/g, ",\n")],
    ["NaN", withCell(150, "NaN")],
    ["inf", withCell(150, "inf")],
    ["a value that overflows", withCell(150, "1e400")],
    ["a D exponent", withCell(150, "1.5D-03")],
    ["a Unicode minus", withCell(150, "\u22121.5")],
    ["hex", withCell(150, "0x10")],
    ["a space in a comma cell", withCell(150, " 1.5")],
    ["a tab in a comma cell", withCell(150, "1.5\t")],
    ["an empty cell", withCell(150, "")],
    ["a point without digits after it", withCell(150, "1.")],
    ["no digits before the point", withCell(150, ".5")],
    ["an exponent of seven digits", withCell(150, "1e0000003")],
    ["non-ASCII", withCell(150, "1.5µ")],
    ["a small file", base(150)],
  ];
  for (const [name, text] of cases) {
    it(name, () => {
      expect(laneRows(text)).toBeNull();
      expectSameRoads(text);
    });
  }
  it("the plain text these cases start from takes the lane (so each case is what makes it give up)", () => {
    expect(laneRows(base())).not.toBeNull();
    expect(laneRows(base(300, "\r\n"))).not.toBeNull();
    // One CRLF among LF line ends is still plain.
    const mixed = withCell(150, "1.5\r");
    expect(laneRows(mixed)).not.toBeNull();
    expectSameRoads(mixed);
  });
  it(`takes the lane from ${FAST_LANE.minDataRows} data rows (by construction of FAST_LANE.minDataRows)`, () => {
    expect(laneRows(base(FAST_LANE.minDataRows - 1))).toBeNull();
    expect(laneRows(base(FAST_LANE.minDataRows))).not.toBeNull();
  });
  it("messages name the same lines: a dropped partial sweep and a sweep too short", () => {
    // A sweep interrupted after 250 rows and restarted: the warning names the lines of the part
    // left out (the general path's text is the reference).
    const up = Array.from({ length: 400 }, (_, k) => `${(k / 100).toFixed(2)},${(k * 0.37).toFixed(3)}`);
    const text = ["bias (V),current (pA)", ...up.slice(0, 30), ...up].join("\n");
    expect(laneRows(text)).not.toBeNull();
    const general = expectSameRoads(text);
    expect("parsed" in general && general.parsed.record.warnings.some((w) => /lines \d+–\d+/.test(w))).toBe(true);
    // Too few distinct bias points: the same error.
    const flat = ["bias (V),current (pA)", ...Array.from({ length: 300 }, (_, k) => `${k % 2},${k}`)].join("\n");
    expectSameRoads(flat);
  });
});

describe("fast lane: the exact m·10^k and m/10^k against Number() (closed form)", () => {
  it("~10^6 random decimal strings read bit-equal to Number()", () => {
    const rng = seededRandom(20261204);
    const digitsOf = (k: number) => Array.from({ length: k }, () => String(Math.floor(rng.uniform() * 10))).join("");
    let bad = 0;
    let firstBad = "";
    let cells = 0;
    for (let t = 0; t < 100; t++) {
      const rows: string[] = [];
      const written: string[][] = [];
      for (let r = 0; r < 5000; r++) {
        const row = [`${r}`];
        for (let c = 0; c < 2; c++) {
          // 1–19 digits, the point anywhere (or none), exponents from −40 to 40 (or none), signs.
          const m = digitsOf(1 + Math.floor(rng.uniform() * 19));
          const p = Math.floor(rng.uniform() * m.length);
          let s = p === 0 || rng.uniform() < 0.2 ? m : `${m.slice(0, p)}.${m.slice(p)}`;
          if (rng.uniform() < 0.7) s += `${pick(rng, ["e", "E"])}${pick(rng, ["", "-", "+"])}${Math.floor(rng.uniform() * 41)}`;
          s = pick(rng, ["", "", "-", "+"]) + s;
          row.push(s);
        }
        written.push(row);
        rows.push(row.join(","));
      }
      const text = "bias (V),I1 (A),I2 (A)\n" + rows.join("\n") + "\n";
      const lane = laneRows(text);
      expect(lane).not.toBeNull();
      for (let r = 0; r < written.length; r++) {
        for (let c = 1; c <= 2; c++) {
          cells++;
          if (!Object.is(lane!.values[c]![r], Number(written[r][c]))) {
            bad++;
            if (!firstBad) firstBad = written[r][c];
          }
        }
      }
    }
    expect(cells).toBe(1_000_000);
    expect(firstBad).toBe("");
    expect(bad).toBe(0);
  });
});
