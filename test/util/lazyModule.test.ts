// lazyModule(specifier, format, load): a dependency loaded on first use. Expected values are
// derived by construction (the getter returns the package's own exports, the same object on
// every call, and does not call `load` where Node can `require` the package).
import { describe, it, expect } from "vitest";
import { lazyModule } from "../../lib/util/lazyModule.ts";

describe("lazyModule(specifier, format, load)", () => {
  it("loads a CommonJS package on the getter's first call, not through load(), and returns the same object after", async () => {
    let loads = 0;
    const get = await lazyModule<typeof import("cli-progress")>("cli-progress", "commonjs", () => {
      loads++;
      return import("cli-progress");
    });
    expect(loads).toBe(0);
    const first = get();
    expect(typeof first.MultiBar).toBe("function");
    expect(get()).toBe(first);
    expect(loads).toBe(0);
  });

  it("loads an ES-module package with require where Node supports it (process.features.require_module), else through load()", async () => {
    let loads = 0;
    const get = await lazyModule<typeof import("ml-levenberg-marquardt")>("ml-levenberg-marquardt", "module", () => {
      loads++;
      return import("ml-levenberg-marquardt");
    });
    expect(typeof get().levenbergMarquardt).toBe("function");
    expect(loads).toBe((process as { features: { require_module?: boolean } }).features.require_module === true ? 0 : 1);
  });
});
