// The multiplet colours stay apart for readers with a colour-vision deficiency.
// Sources: the simulation matrices of Machado, Oliveira & Fernandes, "A physiologically-based
// model for simulation of color vision deficiency", IEEE Trans. Vis. Comput. Graph. 15(6),
// 1291–1298 (2009), severity 1.0 (from memory), applied to linear sRGB; the sRGB transfer curve
// and RGB→XYZ matrix of IEC 61966-2-1:1999; CIELAB and the ΔE*ab (CIE 1976) distance of
// CIE 15:2004 (D65 white). The threshold ΔE*ab ≥ 10 for "clearly different at a glance" is
// common practice (no source).
import { describe, expect, it } from "vitest";
import { MULTIPLET_COLORS, multipletColor } from "../../lib/report/multipletColor.ts";

type Matrix = readonly (readonly [number, number, number])[];

const DEFICIENCIES: Record<string, Matrix> = {
  protanopia: [
    [0.152286, 1.052583, -0.204868],
    [0.114503, 0.786281, 0.099216],
    [-0.003882, -0.048116, 1.051998],
  ],
  deuteranopia: [
    [0.367322, 0.860646, -0.227968],
    [0.280085, 0.672501, 0.047413],
    [-0.01182, 0.04294, 0.968881],
  ],
  tritanopia: [
    [1.255528, -0.076749, -0.178779],
    [-0.078411, 0.930809, 0.147602],
    [0.004733, 0.691367, 0.3039],
  ],
  "normal vision": [
    [1, 0, 0],
    [0, 1, 0],
    [0, 0, 1],
  ],
};

function toLinear(c: number): number {
  return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
}

/** CIELAB (D65) of a CSS hex colour as seen through a simulation matrix. */
function labSeen(hex: string, m: Matrix): [number, number, number] {
  const rgb = [1, 3, 5].map((i) => toLinear(parseInt(hex.slice(i, i + 2), 16) / 255));
  const s = m.map((r) => Math.min(1, Math.max(0, r[0] * rgb[0] + r[1] * rgb[1] + r[2] * rgb[2])));
  const X = 0.4124 * s[0] + 0.3576 * s[1] + 0.1805 * s[2];
  const Y = 0.2126 * s[0] + 0.7152 * s[1] + 0.0722 * s[2];
  const Z = 0.0193 * s[0] + 0.1192 * s[1] + 0.9505 * s[2];
  const f = (t: number) => (t > (6 / 29) ** 3 ? Math.cbrt(t) : t / (3 * (6 / 29) ** 2) + 4 / 29);
  const [fx, fy, fz] = [f(X / 0.95047), f(Y), f(Z / 1.08883)];
  return [116 * fy - 16, 500 * (fx - fy), 200 * (fy - fz)];
}

/** The closest pair of a palette under each deficiency: [deficiency, pair, ΔE]. */
function closestPairs(palette: Record<string, string>): [string, string, number][] {
  const names = Object.keys(palette);
  return Object.entries(DEFICIENCIES).map(([who, m]) => {
    let best: [string, string, number] = [who, "", Infinity];
    for (let i = 0; i < names.length; i++) {
      for (let j = i + 1; j < names.length; j++) {
        const a = labSeen(palette[names[i]], m);
        const b = labSeen(palette[names[j]], m);
        const d = Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]);
        if (d < best[2]) best = [who, `${names[i]}/${names[j]}`, d];
      }
    }
    return best;
  });
}

const LABELS = ["s", "p", "d", "f", "v1", "v2"] as const;

describe("MULTIPLET_COLORS", () => {
  it("every two of s, p, d, f, v1, v2 and 'no multiplet' differ by ΔE*ab ≥ 10 with protanopia, deuteranopia, tritanopia", () => {
    const palette: Record<string, string> = Object.fromEntries(LABELS.map((l) => [l, multipletColor(l)]));
    palette.none = multipletColor(null);
    for (const [who, pair, d] of closestPairs(palette)) expect(d, `${who}: ${pair}`).toBeGreaterThanOrEqual(10);
  });

  it("the check can fail: a red–green pair of equal lightness is closer than 10 for deuteranopia", () => {
    // A red and a green of similar lightness: the classic confusion pair.
    const [, , d] = closestPairs({ red: "#C0392B", green: "#6B8E23" }).find(([who]) => who === "deuteranopia")!;
    expect(d).toBeLessThan(10);
  });

  it("the valence groups cycle through their own colours", () => {
    expect(multipletColor("v3")).toBe(MULTIPLET_COLORS.valence[0]);
    expect(multipletColor("v2")).toBe(MULTIPLET_COLORS.valence[1]);
  });
});
