// analysisToJson: the record's peak ↔ multiplet link (added fields peakIndices, multipletIndex,
// satellitePeakIndices) checked against the fixture's closed-form peak positions.
import { describe, it, expect } from "vitest";
import { analysisToJson } from "../../lib/index.ts";
import { simulatedAnalysis } from "./fixture.ts";
import { FILLING, chargingPeakV } from "../cli/harness.ts";

const { analysis } = simulatedAnalysis();
const json = analysisToJson(analysis);
// A quarter of Ec in bias: the project's tolerance for a peak position.
const tolV = (0.25 * FILLING.chargingEnergyEV) / FILLING.eta;
const peakNear = (v: number) => {
  const hits = json.peaks.map((p, i) => ({ p, i })).filter(({ p }) => Math.abs(p.biasV - v) < tolV);
  expect(hits, `one peak within ${tolV} V of ${v} V`).toHaveLength(1);
  return hits[0];
};

describe("analysisToJson(analysis): peaks and multiplets linked by index", () => {
  it("names the s doublet and the first p peaks by their index in `peaks` (closed form ±(|ε| + Ec(n + ½))/η)", () => {
    const s = json.multiplets.find((m) => m.label === "s")!;
    const p = json.multiplets.find((m) => m.label === "p")!;
    expect(s.peakIndices).toEqual([0, 1].map((n) => peakNear(chargingPeakV(0.5, n)).i));
    expect(p.peakIndices).toEqual([2, 3, 4].map((n) => peakNear(chargingPeakV(0.8, n)).i));
  });

  it("gives each peak its multiplet's index and keeps the label field", () => {
    json.peaks.forEach((p, i) => {
      const owner = json.multiplets.findIndex((m) => m.peakIndices.includes(i));
      expect(p.multipletIndex).toBe(owner < 0 ? null : owner);
      expect(p.multiplet).toBe(owner < 0 ? null : json.multiplets[owner].label);
    });
  });

  it("lists the charging satellite of p (one carrier in s: n = 1) by index, outside every multiplet", () => {
    const sat = peakNear(chargingPeakV(0.8, 1));
    expect(json.evidence.satellitePeakIndices).toContain(sat.i);
    expect(sat.p.multipletIndex).toBeNull();
    json.evidence.satellitePeakIndices.forEach((i, k) => expect(json.peaks[i].biasV).toBe(json.evidence.satellitePeaksV[k]));
  });

  it("copies the index arrays: the record does not share them with the analysis", () => {
    json.multiplets.forEach((m, k) => {
      expect(m.peakIndices).toEqual(analysis.assignment.multiplets[k].peakIndices);
      expect(m.peakIndices).not.toBe(analysis.assignment.multiplets[k].peakIndices);
    });
    expect(JSON.parse(JSON.stringify(json))).toEqual(json);
  });
});

describe("analysisToJson(analysis, record, extras): notes, metadata and provenance (new fields only)", () => {
  it("without extras: no notes, empty metadata, provenance null", () => {
    expect(json.notes).toEqual([]);
    expect(json.metadata).toEqual({});
    expect(json.provenance).toBeNull();
  });

  it("with extras: copies of the notes and metadata (not the caller's objects) and the provenance as given", () => {
    const notes = ["η = 0.8 taken from the file's metadata (\"eta\")"];
    const metadata = { dot: "D1", eta: "0.8" };
    const provenance = { tool: "dotspec" as const, version: "0.1.0", command: "analyze", input: null, options: {} };
    const j = analysisToJson(analysis, undefined, { notes, metadata, provenance });
    expect(j.notes).toEqual(notes);
    expect(j.notes).not.toBe(notes);
    expect(j.metadata).toEqual(metadata);
    expect(j.metadata).not.toBe(metadata);
    expect(j.provenance).toBe(provenance);
    // The notes are not warnings (by construction: two lists).
    expect(j.warnings).toEqual(json.warnings);
  });
});

describe("analysisToJson(analysis): the VB ladder's resonances taken out of the current", () => {
  it("records each subtracted step (position, height) with the ladder's Γtip/Γsub and Ec, as plain JSON; null where none", async () => {
    const { lowEtaDraw } = await import("../helpers/lowEtaDraw.ts");
    // Draw 123 of the low-η mix (analyzeCurve note 9 fires there; its steps are checked against
    // the simulation's model in test/pipeline/valenceLadder.test.ts).
    const { analysis: low } = lowEtaDraw(123);
    const taken = low.subtractedResonances!;
    const record = JSON.parse(JSON.stringify(analysisToJson(low)));
    expect(record.subtractedResonances).toEqual({
      steps: taken.steps.map((q) => ({ biasV: q.biasV, heightA: q.heightA })),
      rateRatio: taken.rateRatio,
      chargingEnergyEV: taken.chargingEnergyEV,
    });
    // They are no peaks of the record: none of its peaks sits on a subtracted step.
    for (const q of taken.steps) expect(record.peaks.some((p: { biasV: number }) => Math.abs(p.biasV - q.biasV) < 1e-4)).toBe(false);
    expect(json.subtractedResonances).toBeNull();
  }, 30_000);
});
