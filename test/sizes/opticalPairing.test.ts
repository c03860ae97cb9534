// Optical pairing with closed-form inputs: levels chosen by hand, J_eh = 1.786·e²/(4πε₀εR) with
// e²/(4πε₀) = 1.439965 eV·nm (CODATA 2018, by hand) and the 1.786 of L. E. Brus, J. Chem. Phys.
// 80, 4403 (1984); optical peaks placed at E_c − E_h − J_eh of chosen pairs.
import { describe, expect, it } from "vitest";
import { expectClose } from "../helpers/expectClose.ts";
import { expectError } from "../helpers/errors.ts";
import { pairOptical, type DotLevels } from "../../lib/sizes/opticalPairing.ts";
import { resolveMaterial } from "../../lib/sizes/materials.ts";

const material = resolveMaterial({ base: "CdSe", dielectricConstant: 10 });
const J = (r: number) => (1.786 * 1.439965) / (10 * r);

describe("pairOptical(dots, optical, material)", () => {
  it("averages the dots within the tolerance and predicts E_c − E_h − J_eh (J_eh = 0.125452 eV at 2.05 nm, ε = 10, by hand)", () => {
    const dots: DotLevels[] = [
      { dot: "a", radiusNM: 2.0, singleParticleGapEV: 2.0, levelSpacingSPEV: 0.3, valenceSpacingsEV: [0.1, 0.15] },
      { dot: "b", radiusNM: 2.1, singleParticleGapEV: 1.9, levelSpacingSPEV: 0.28, valenceSpacingsEV: [0.12] },
      { dot: "far", radiusNM: 3.0, singleParticleGapEV: 1.5, levelSpacingSPEV: 0.2, valenceSpacingsEV: [] },
    ];
    const [row] = pairOptical(dots, [{ radiusNM: 2.05, peaksEV: [1.95 - 0.125452] }], material);
    expect(row.dotsUsed).toEqual(["a", "b"]);
    expectClose(row.coulombEV, 0.125452, { atol: 1e-6 });
    expectClose(row.levelsEV.s, 1.95, { rtol: 1e-12 });
    expectClose(row.levelsEV.p, (2.3 + 2.18) / 2, { rtol: 1e-12 });
    expectClose(row.levelsEV.h2, -0.11, { rtol: 1e-12 });
    expectClose(row.levelsEV.h3, -0.25, { rtol: 1e-12 });
    const top = row.peaks[0].candidates[0];
    expect(top.label).toBe("h1-s");
    expectClose(top.mismatchEV, 0, { atol: 1e-6 });
    expectClose(row.peaks[0].candidates.find((c) => c.label === "h2-p")!.predictedEV, 2.24 + 0.11 - J(2.05), { atol: 1e-6 });
    expect(row.peaks[0].assigned!.label).toBe("h1-s");
    // candidates ranked by |mismatch|
    const m = row.peaks[0].candidates.map((c) => Math.abs(c.mismatchEV));
    expect([...m].sort((x, y) => x - y)).toEqual(m);
  });

  it("assigns the same pair to the k-th peak at every size, even where another pair is locally closer", () => {
    const dots: DotLevels[] = [
      { dot: "A", radiusNM: 2, singleParticleGapEV: 2.0, levelSpacingSPEV: 0.3, valenceSpacingsEV: [0.1] },
      { dot: "B", radiusNM: 3, singleParticleGapEV: 1.7, levelSpacingSPEV: 0.2, valenceSpacingsEV: [0.18] },
    ];
    const rows = pairOptical(dots, [
      { radiusNM: 2, peaksEV: [2.3 - J(2), 2.0 - J(2)] }, // exactly h1-s and h1-p (given out of order)
      { radiusNM: 3, peaksEV: [1.7 - J(3), 1.885 - J(3)] }, // peak 2: h2-s (1.88) is closer than h1-p (1.90)
    ], material);
    expect(rows[0].peaks.map((p) => p.assigned!.label)).toEqual(["h1-s", "h1-p"]);
    expect(rows[1].peaks[1].candidates[0].label).toBe("h2-s");
    expect(rows[1].peaks.map((p) => p.assigned!.label)).toEqual(["h1-s", "h1-p"]);
    expectClose(rows[1].peaks[1].assigned!.mismatchEV, -0.015, { atol: 1e-6 });
  });

  it("leaves a row without nearby dots unpaired, with a warning", () => {
    const rows = pairOptical([{ dot: "A", radiusNM: 2, singleParticleGapEV: 2, levelSpacingSPEV: null, valenceSpacingsEV: [] }],
      [{ radiusNM: 2, peaksEV: [1.9] }, { radiusNM: 4, peaksEV: [1.5] }], material);
    expect(rows[0].peaks[0].assigned!.label).toBe("h1-s");
    expect(rows[1].dotsUsed).toEqual([]);
    expect(rows[1].peaks[0].assigned).toBeNull();
    expect(rows[1].warnings.join(" ")).toContain("no dot within");
  });

  it("validates rows and options", () => {
    expectError(() => pairOptical([], [{ radiusNM: 0, peaksEV: [] }], material), "sizes/optical-row", "radiusNM");
    expectError(() => pairOptical([], [], material, { radiusToleranceNM: -1 }), "options/not-positive", "radiusToleranceNM");
  });
});
