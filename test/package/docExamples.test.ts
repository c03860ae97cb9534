// The Example block of every public function's doc comment runs: taken from the compiled
// declarations (dist/*.d.ts; the test run's global setup builds dist/), run as an ES module
// against the built library with the public names it uses imported for it, working directory the
// repository root (scripts/docExamples.ts says how the code is read and run). An example that
// throws fails the test, and so does a statement marked `// throws` that does not throw.
//
// Expected values: each example's own output comments, which its author wrote from running it
// (`node bin/run-ts.mjs scripts/docExamples.ts NAME` prints them). A comment that states a plain
// number (`// => 1.2345`, or `// => 15 (…)` / `// => 0.48 eV`: a number as the whole comment or
// its first word, optionally after ≈) is checked to the digits printed, ±half a unit of the last
// one (statedNumber). Other outputs are not compared: strings in quotes, true/false/null,
// arrays, objects, words, and numbers followed by other characters ("1.2, 3.4") are skipped.
// The parsing rule itself is checked below against closed forms of rounding (exact).
import { describe, it, expect } from "vitest";
import { matchesStated, publicFunctions, runExamples, statedNumber, exampleStatements, type ExampleResult } from "../../scripts/docExamples.ts";

describe("the public functions' doc examples", () => {
  const functions = publicFunctions();
  let results: ExampleResult[] = [];

  it("every public function has an example, and every example runs without throwing (offenders listed)", () => {
    results = runExamples(functions);
    const ran = new Set(results.map((r) => r.name));
    const missing = functions.filter((f) => !ran.has(f.name)).map((f) => f.name);
    expect(missing, `public functions without a runnable \`\`\`ts example: ${missing.join(", ")}`).toEqual([]);
    const failed = results.filter((r) => r.error !== null).map((r) => `${r.name}: ${r.error}`);
    expect(failed, `${failed.length} example(s) threw:\n  ${failed.join("\n  ")}`).toEqual([]);
  });

  it("a statement marked `// throws` throws, and a stated output belongs to a value (offenders listed)", () => {
    expect(results.length).toBeGreaterThan(100);
    const wrong = results.flatMap((r) =>
      r.outputs.filter((o) => o.kind === "no-throw" || (o.kind === "no-value" && statedNumber(o.printed) !== null)).map((o) => `${r.name}: ${o.statement} // ${o.printed} (${o.kind})`),
    );
    expect(wrong, wrong.join("\n")).toEqual([]);
  });

  it("every plain number an example states is what it gives, to the digits printed (offenders listed)", () => {
    expect(results.length).toBeGreaterThan(100);
    const checked: string[] = [];
    const wrong: string[] = [];
    for (const r of results) {
      for (const o of r.outputs) {
        const stated = statedNumber(o.printed);
        if (!stated || o.kind === "threw") continue;
        checked.push(r.name);
        if (o.value === null || !matchesStated(o.value, stated)) wrong.push(`${r.name}: ${o.statement.split("\n")[0]} states ${o.printed}, gives ${o.kind} ${o.shown}`);
      }
    }
    expect(wrong, `${wrong.length} stated number(s) differ:\n  ${wrong.join("\n  ")}`).toEqual([]);
    expect(new Set(checked).size).toBeGreaterThan(30);
  });
});

describe("statedNumber / exampleStatements (how an example is read)", () => {
  it("reads a plain number and half a unit of its last digit (closed form), and nothing else", () => {
    const read = (text: string) => {
      const s = statedNumber(text)!;
      return [s.value, Number(s.tolerance.toPrecision(12))];
    };
    expect(read("1.2345")).toEqual([1.2345, 5e-5]);
    expect(read("15 (30 mV at 2 mV per step)")).toEqual([15, 0.5]);
    expect(read("−0.48 eV")).toEqual([-0.48, 0.005]);
    expect(read("≈ 2.5e-9")).toEqual([2.5e-9, 5e-11]);
    expect(read("3e4")).toEqual([3e4, 5e3]);
    for (const other of ['"142.3 ± 1.8"', "true", "null", "[1, 2]", "{ a: 1 }", "1.2, 3.4", "about 3", "NaN"]) expect(statedNumber(other)).toBeNull();
  });

  it("matches to the printed digits: 1.23 accepts 1.2349 and rejects 1.2351 (closed form of rounding)", () => {
    const s = statedNumber("1.23")!;
    expect(matchesStated(1.2349, s)).toBe(true);
    expect(matchesStated(1.2351, s)).toBe(false);
    expect(matchesStated(-1.23, s)).toBe(false);
  });

  it("splits statements and attaches the output comment on the line or the lines below", () => {
    const code = ["const x = f(1, { a: [1, 2] });", "// => 3", 'g("a;b"); // => "a"', "for (const y of [1]) {", "  h(y);", "}", "k(); // throws: a reason", "m();"].join("\n");
    expect(exampleStatements(code)).toEqual([
      { text: "const x = f(1, { a: [1, 2] });", output: "3" },
      { text: 'g("a;b");', output: '"a"' },
      { text: "for (const y of [1]) {\n  h(y);\n}", output: null },
      { text: "k();", output: "throws" },
      { text: "m();", output: null },
    ]);
  });
});
