// User formulas: parsing, the restricted mathjs instance, and fitting. Expected values are
// closed forms of the formulas themselves, evaluated in plain JavaScript.
import { describe, expect, it } from "vitest";
import { expectClose } from "../helpers/expectClose.ts";
import { errorOf, expectError } from "../helpers/errors.ts";
import { parseSizeFormula } from "../../lib/sizes/formula.ts";
import { fitSizeModel } from "../../lib/sizes/fitSizeModel.ts";

describe("parseSizeFormula(text)", () => {
  it('reads "Eg + a / R^2 - b / R ; a=1, b=0.5": parameters, starts (default 1), no quantity', () => {
    const f = parseSizeFormula("Eg + a / R^2 - b / R ; a=1, b=0.5");
    expect(f.parameters).toEqual(["Eg", "a", "b"]);
    expect(f.initialValues).toEqual({ Eg: 1, a: 1, b: 0.5 });
    expect(f.quantity).toBeNull();
    expect(f.expression).toBe("Eg + a / R^2 - b / R");
  });

  it("evaluates like the same expression in JavaScript (closed form)", () => {
    const f = parseSizeFormula("Eg + a / R^2 - b / R + sqrt(R) * exp(-c * R) + pi * 0 + 2R");
    const [Eg, a, b, c] = [1.42, 3.1, 0.4, 0.7];
    for (const R of [0.9, 2.5]) {
      expectClose(f.evaluate(R, [Eg, a, b, c]), Eg + a / R ** 2 - b / R + Math.sqrt(R) * Math.exp(-c * R) + 2 * R, { rtol: 1e-14 });
    }
  });

  it("takes a quantity prefix", () => {
    const f = parseSizeFormula("chargingEnergyEV: a/R + b");
    expect(f.quantity).toBe("chargingEnergyEV");
    expect(f.parameters).toEqual(["a", "b"]);
    expectError(() => parseSizeFormula("energyEV: a/R"), "sizes/formula", "unknown quantity", "chargingEnergyEV");
  });

  it("returns NaN where the result is not a real number (log of a negative value)", () => {
    expect(parseSizeFormula("log(a - R)").evaluate(2, [1])).toBeNaN();
  });

  it("refuses hostile or unsupported formulas with a clear error", () => {
    const hostile: [string, string][] = [
      ["import({}, {override: true})", "import"],
      ['createUnit("x")', "createUnit"],
      ['evaluate("1")', "evaluate"],
      ['parse("1")', "parse"],
      ['simplify("x")', "simplify"],
      ["derivative(R^2, R)", "derivative"],
      ["f(x) = x", "function definition"],
      ["a = 1", "assignment"],
      ["{a: 1}", "object literal"],
      ["[1, 2]", "array literal"],
      ["R.constructor", "property access"],
      ['R["constructor"]', "property access"],
      ['"string"', "only numbers"],
      ["'x' + R", "only numbers"],
      ['cos.constructor("return process")', "only named functions"],
      ['cos.constructor("return process")()', "syntax error"],
      ["unknownfn(R)", "unknownfn"],
      ["a ? b : c", "conditional"],
      ["1:3", "range"],
      ["a == b", "operator"],
      ["a!", "operator"],
      ["R'", "operator"],
      ["a and b", "operator"],
      ["sqrt", "function, not a value"],
      ["a\nb", "several statements"],
      ["R * constructor", "cannot be a parameter name"],
      ["R * __proto__", "not a plain name"],
      ["R + " + "1 + ".repeat(100) + "1", "longer than the limit"],
      ["a+b+c+d+e+f+g+h+k+R", "exceed the limit"],
    ];
    for (const [text, fragment] of hostile) {
      const err = errorOf(() => parseSizeFormula(text));
      expect(err.code, text).toBe("sizes/formula");
      expect(err.message, text).toContain(fragment);
    }
  });

  it('points at the position of a typo: "Eg + a / R^^2" → character 12', () => {
    const err = errorOf(() => parseSizeFormula("Eg + a / R^^2"));
    expect(err.code).toBe("sizes/formula");
    expect(err.message).toContain("character 12");
    const lines = err.message.split("\n");
    expect(lines[2].indexOf("^")).toBe(lines[1].indexOf("R^^") + 2);
  });

  it("refuses bad initial values", () => {
    expectError(() => parseSizeFormula("a / R ; a = x"), "sizes/formula", "name=number");
    expectError(() => parseSizeFormula("a / R ; b = 1"), "sizes/formula", "not a parameter");
    expectError(() => parseSizeFormula("  "), "sizes/formula", "empty");
  });

  it("the disabled functions stay disabled for everything parsed later", () => {
    parseSizeFormula("a / R");
    expectError(() => parseSizeFormula('evaluate("2+2")'), "sizes/formula", "evaluate");
  });
});

describe("fitting a formula (fitSizeModel)", () => {
  it("recovers a = 0.9, b = 0.03 from noiseless a/R + b data", () => {
    const f = parseSizeFormula("a / R + b ; a=0.5, b=0");
    const pts = [1, 1.5, 2, 3, 4].map((r) => ({ radiusNM: r, value: 0.9 / r + 0.03, sigma: 0.005 }));
    const fit = fitSizeModel(pts, { model: (r, p) => f.evaluate(r, p), parameters: f.parameters.map((name) => ({ name, initial: f.initialValues[name] })) });
    expectClose([fit.params.a, fit.params.b], [0.9, 0.03], { rtol: 1e-8 });
  });
});
