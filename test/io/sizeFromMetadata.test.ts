// sizeFromMetadata: a curve's dot and size from its metadata lines. Expected values by
// construction; radius = diameter / 2 (closed form).
import { describe, it, expect } from "vitest";
import { sizeFromMetadata, SIZE_METADATA_KEYS } from "../../lib/io/sizeFromMetadata.ts";

describe("sizeFromMetadata(metadata)", () => {
  it("SIZE_METADATA_KEYS is locked", () => {
    expect(SIZE_METADATA_KEYS).toEqual({ dot: ["dot", "dot_id"], radius: ["radius_nm", "radius (nm)"], diameter: ["diameter_nm", "diameter (nm)"] });
  });
  it("reads radius_nm, or halves diameter_nm; keys in any case", () => {
    expect(sizeFromMetadata({ dot: "A", radius_nm: "1.7" })).toEqual({ dot: "A", radiusNM: 1.7, key: "radius_nm", problem: null });
    expect(sizeFromMetadata({ Dot: "B", Diameter_nm: " 3.2 " })).toEqual({ dot: "B", radiusNM: 1.6, key: "Diameter_nm", problem: null });
  });
  it("no size: nulls and no problem; a bad size: a problem naming the line", () => {
    expect(sizeFromMetadata({ dot: "A" })).toEqual({ dot: "A", radiusNM: null, key: null, problem: null });
    const bad = sizeFromMetadata({ radius_nm: "-1" });
    expect(bad.radiusNM).toBeNull();
    expect(bad.problem).toContain('"radius_nm: -1"');
    expect(sizeFromMetadata({ radius_nm: "about 2" }).problem).toContain("not a size");
  });
});
