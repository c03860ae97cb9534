// Pieces the figures share. Check values: closed forms (round ticks are k·step with step in
// {1, 2, 5}·10^m; an energy E sits at bias E/η since E = η·e·V; SI prefixes are powers of 1000)
// and the usual reading of a path's base name (common practice, no source).
import { describe, expect, it } from "vitest";
import { currentUnit, energyAxis, envelope, niceTicks, sourceBaseName } from "../../lib/report/figureParts.ts";
import { expectClose } from "../helpers/expectClose.ts";

describe("sourceBaseName(path)", () => {
  it("keeps the part after the last / or \\", () => {
    expect(sourceBaseName("a/b/dot-1.csv")).toBe("dot-1.csv");
    expect(sourceBaseName("C:\\data\\dot-2.tsv")).toBe("dot-2.tsv");
    expect(sourceBaseName("dot-3.dat")).toBe("dot-3.dat");
    expect(sourceBaseName("folder/")).toBe("folder/");
  });
});

describe("niceTicks(lo, hi, count)", () => {
  it("gives multiples of 1, 2 or 5 × 10^k covering the range", () => {
    // span 5.86 / 10 = 0.586 → the next round step is 1
    expect(niceTicks(-2.64, 3.22, 10)).toEqual([-2, -1, 0, 1, 2, 3]);
    // span 1.2 / 10 = 0.12 → step 0.2
    expect(niceTicks(-0.5, 0.7, 10)).toEqual([-0.4, -0.2, 0, 0.2, 0.4, 0.6]);
    expect(niceTicks(0, 1, 5)).toEqual([0, 0.2, 0.4, 0.6, 0.8, 1]);
    expect(niceTicks(1, 1, 5)).toEqual([]);
  });
});

describe("energyAxis(domain, energies, count)", () => {
  it("puts each energy E at bias E/η and labels it in eV", () => {
    const axis = energyAxis([-3, 3.5], { eta: 0.8, etaGiven: true }, 10);
    const energies = axis.ticks.map((v) => Number(axis.tickFormat(v).replace("\u2212", "-")));
    expectClose(axis.ticks, energies.map((e) => e / 0.8), { rtol: 1e-12 });
    expect(Math.min(...energies)).toBeGreaterThanOrEqual(-3 * 0.8);
    expect(Math.max(...energies)).toBeLessThanOrEqual(3.5 * 0.8);
    expect(axis.label).toBe("energy after η = 0.8 (eV)");
    expect(axis.tickFormat(-1 / 0.8)).toBe("\u22121"); // step 1 eV: no decimals, minus sign U+2212
  });

  it("says when η was not given (η taken as 1)", () => {
    expect(energyAxis([-1, 1], { eta: 1, etaGiven: false }, 10).label).toBe("energy (eV; η not given, taken as 1)");
  });
});

describe("currentUnit(currentA)", () => {
  it("takes the SI prefix that puts the largest |I| below 1000", () => {
    expect(currentUnit([1e-12, -120e-12])).toEqual({ label: "pA", scale: 1e12 });
    expect(currentUnit([2.5e-9])).toEqual({ label: "nA", scale: 1e9 });
  });
});

describe("envelope(x, y, columns, scale)", () => {
  it("keeps every point of a short line, and each column's lowest and highest point of a long one", () => {
    const x = Array.from({ length: 1000 }, (_, i) => i);
    const y = x.map((i) => (i === 503 ? 10 : i === 707 ? -10 : 0));
    expect(envelope(x.slice(0, 40), y.slice(0, 40), 10, 1).x).toHaveLength(40);
    const e = envelope(x, y, 20, 2);
    expect(e.x.length).toBeLessThanOrEqual(4 * 20);
    expect(Math.max(...e.y)).toBe(20);
    expect(Math.min(...e.y)).toBe(-20);
  });
});
