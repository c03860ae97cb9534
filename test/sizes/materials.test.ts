// The materials table and the override reader. The built-in values themselves are sourced in
// lib/sizes/materials.ts (handbooks, "from memory"); here: that every value carries a source,
// lies in its physical range, and that overrides are checked.
import { describe, expect, it } from "vitest";
import { expectClose } from "../helpers/expectClose.ts";
import { expectError } from "../helpers/errors.ts";
import { MATERIALS, MATERIAL_RANGES, parseMaterialJson, resolveMaterial } from "../../lib/sizes/materials.ts";

const NUMERIC = Object.keys(MATERIAL_RANGES) as (keyof typeof MATERIAL_RANGES)[];

describe("MATERIALS", () => {
  it("has InP, CdSe, PbS, CdTe and InAs, each value in range and with a source", () => {
    for (const name of ["InP", "CdSe", "PbS", "CdTe", "InAs"]) {
      const m = MATERIALS[name];
      expect(m.name).toBe(name);
      for (const key of NUMERIC) {
        const r = MATERIAL_RANGES[key];
        expect(m[key], `${name}.${key}`).toBeGreaterThanOrEqual(r.min);
        expect(m[key], `${name}.${key}`).toBeLessThanOrEqual(r.max);
        expect(m.sources[key], `${name}.${key} source`).toMatch(/\w{4,}/);
      }
      expect(Object.isFrozen(m)).toBe(true);
    }
  });
  it("InP is 1.421 eV, mₑ 0.08, m_h 0.6, ε 12.5 (Ioffe NSM archive, from memory)", () => {
    const m = MATERIALS.InP;
    expect([m.bandGapEV, m.electronMassE, m.holeMassE, m.dielectricConstant]).toEqual([1.421, 0.08, 0.6, 12.5]);
  });
  it("α is the two-band Kane estimate 1/Eg (closed form)", () => {
    for (const m of Object.values(MATERIALS)) expectClose(m.nonParabolicityPerEV, 1 / m.bandGapEV, { rtol: 1e-15 });
  });
});

describe("resolveMaterial(nameOrOverrides)", () => {
  it("finds built-ins by name, ignoring case", () => {
    expect(resolveMaterial("cdse")).toBe(MATERIALS.CdSe);
  });
  it("overrides fields of a base and marks their source", () => {
    const m = resolveMaterial({ base: "CdSe", electronMassE: 0.12 }, "mine.json");
    expect(m.electronMassE).toBe(0.12);
    expect(m.holeMassE).toBe(MATERIALS.CdSe.holeMassE);
    expect(m.sources.electronMassE).toContain("mine.json");
    expect(m.name).toBe("CdSe (modified)");
    expect(resolveMaterial({ name: "InAs", holeMassE: 0.3 }).bandGapEV).toBe(MATERIALS.InAs.bandGapEV);
  });
  it("accepts a complete custom material and asks for missing fields otherwise", () => {
    const full = { name: "X", bandGapEV: 1, electronMassE: 0.1, holeMassE: 0.5, dielectricConstant: 10, nonParabolicityPerEV: 1, barrierEV: 3, barrierMassE: 1 };
    expect(resolveMaterial(full).name).toBe("X");
    const { barrierEV: _, ...partial } = full;
    expectError(() => resolveMaterial(partial, "x.json"), "sizes/material-key", "x.json", "barrierEV");
  });
  it("refuses unknown materials and keys", () => {
    expectError(() => resolveMaterial("GaN"), "sizes/unknown-material", "GaN", "CdSe");
    expectError(() => resolveMaterial({ base: "InP", efectiveMass: 1 } as never, "f.json"), "sizes/material-key", "f.json", "efectiveMass");
  });
  it("refuses values out of physical range, naming the key and the file", () => {
    const cases: [string, number][] = [
      ["electronMassE", 0], ["electronMassE", 11], ["holeMassE", -0.1], ["bandGapEV", -1], ["bandGapEV", 11],
      ["dielectricConstant", 0.5], ["dielectricConstant", 2000], ["barrierEV", 0], ["nonParabolicityPerEV", -1],
    ];
    for (const [key, value] of cases) {
      expectError(() => resolveMaterial({ base: "InP", [key]: value }, "over.json"), "sizes/material-value", "over.json", key, String(value));
    }
    expectError(() => resolveMaterial({ base: "InP", holeMassE: "0.5" as unknown as number }, "s.json"), "sizes/material-value", "holeMassE");
  });
});

describe("parseMaterialJson(text, source)", () => {
  it("reads an override file", () => {
    expect(parseMaterialJson('{"base": "InP", "holeMassE": 0.45}', "inp.json").holeMassE).toBe(0.45);
  });
  it("names the file for bad JSON, a non-object, and bad values", () => {
    expectError(() => parseMaterialJson("{base: InP}", "bad.json"), "sizes/material-json", "bad.json", "not valid JSON");
    expectError(() => parseMaterialJson("[1, 2]", "arr.json"), "sizes/material-json", "arr.json", "array");
    expectError(() => parseMaterialJson('{"base": "PbS", "electronMassE": 12}', "pbs.json"), "sizes/material-value", "pbs.json", "electronMassE");
  });
});
