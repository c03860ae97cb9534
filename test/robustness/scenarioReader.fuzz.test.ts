/**
 * The scenario reader of `dotspec simulate` under hostile input (fast-check, fixed seeds): the JSON
 * file reader (`readJsonFile`, `parseJsonText`) returns a value or throws a one-line DotspecError
 * naming the file, the line and the column; `parseScenario` returns a scenario whose numbers are all
 * finite or throws a one-line DotspecError naming the key; `simulateCurve` on any scenario that
 * passes gives finite signals or refuses it up front — never another exception, a hang or NaN.
 * Reference: the engine's own `JSON.parse` decides which texts are JSON (ECMA-404); the other
 * expectations are by construction of the inputs.
 */
import fc from "fast-check";
import { afterAll, describe, expect, it } from "vitest";
import { writeFileSync } from "node:fs";
import { join } from "node:path";
import { parseScenario, readJsonFile, simulateCurve, SCENARIO_DEFAULTS } from "../../lib/index.ts";
import { jsonErrorAt, parseJsonText } from "../../lib/io/parseJsonText.ts";
import { EXAMPLE_SCENARIO } from "../fixtures/exampleScenario.ts";
import { joinBytes, outcomeOf, utf16Bytes, utf8Bytes } from "../helpers/fuzz.ts";
import { removeTempDirs, tempDir } from "../cli/harness.ts";

afterAll(removeTempDirs);

const SOURCE = "scenario.json";
const jsonRules = { source: SOURCE, lineCodes: ["io/invalid-json"] };
const scenarioRules = { source: null };
const good = JSON.stringify(EXAMPLE_SCENARIO, null, 2);

describe("parseJsonText(text): the JSON reader", () => {
  it("accepts exactly the texts JSON.parse accepts, and names line and column otherwise (3,000 texts)", () => {
    const jsonish = fc.oneof(
      fc.json(),
      fc.json().map((t) => t.slice(0, Math.max(0, t.length - 1))),
      fc.array(fc.constantFrom("{", "}", "[", "]", ",", ":", '"a"', "1", "-0.5e3", "true", "null", " ", "\n", "\r\n", "\t", "x", "01", '"\\q"', '"\u0001"', "1.", "\u2028"), { maxLength: 30 }).map((a) => a.join("")),
      fc.string({ maxLength: 60 }),
    );
    fc.assert(
      fc.property(jsonish, (text) => {
        let engine = true;
        try {
          JSON.parse(text);
        } catch {
          engine = false;
        }
        // reference: the engine's JSON.parse
        expect(jsonErrorAt(text).reason === "no error", text).toBe(engine);
        const code = outcomeOf(() => parseJsonText(text, SOURCE), jsonRules, () => {});
        if (text.charCodeAt(0) !== 0xfeff) expect(code).toBe(engine ? "ok" : "io/invalid-json");
      }),
      { seed: 12201, numRuns: 3000 },
    );
  });

  it("names the line and column of the first mistake (closed form: counted in the text)", () => {
    expect(() => parseJsonText('{\n  "eta": 0.8,\n  "cb": x\n}', SOURCE)).toThrow(/^scenario\.json: not valid JSON: line 3, column 9: unexpected "x" where a value should be$/);
    expect(() => parseJsonText('{"a": 1', SOURCE)).toThrow(/line 1, column 8: the text ends inside an object/);
    expect(() => parseJsonText('{"a": "b\nc"}', SOURCE)).toThrow(/line 1, column 9: a control character U\+000A inside a string/);
  });

  it("reads nesting 100,000 deep without a stack overflow (a one-line error or the value)", () => {
    const deep = "[".repeat(100_000) + "]".repeat(100_000);
    expect(["ok", "io/invalid-json"]).toContain(outcomeOf(() => parseJsonText(deep, SOURCE), jsonRules, () => {}));
    expect(outcomeOf(() => parseJsonText("[".repeat(100_000), SOURCE), jsonRules, () => {})).toBe("io/invalid-json");
  });
});

describe("readJsonFile(path): bytes and encodings", () => {
  const dir = tempDir("dotspec-scenario-");
  let k = 0;
  const file = (bytes: Uint8Array) => {
    const p = join(dir, `s-${k++}.json`);
    writeFileSync(p, bytes);
    return p;
  };

  it("random bytes after each byte-order mark give a value or a one-line error naming the file (300 files)", () => {
    const prefix = fc.constantFrom(Uint8Array.of(), Uint8Array.of(0xef, 0xbb, 0xbf), Uint8Array.of(0xff, 0xfe), Uint8Array.of(0xfe, 0xff), utf8Bytes('{"eta": '));
    fc.assert(
      fc.property(prefix, fc.uint8Array({ maxLength: 200 }), (head, tail) => {
        const p = file(joinBytes(head, tail));
        outcomeOf(() => readJsonFile(p), { source: p, lineCodes: ["io/invalid-json"] }, () => {});
      }),
      { seed: 12202, numRuns: 300 },
    );
  });

  it.each([
    ["UTF-8 with a byte-order mark", joinBytes(Uint8Array.of(0xef, 0xbb, 0xbf), utf8Bytes(good))],
    ["UTF-16 LE with a byte-order mark", utf16Bytes(good, false)],
    ["UTF-16 BE with a byte-order mark", utf16Bytes(good, true)],
    ["CRLF line ends", utf8Bytes(good.replace(/\n/g, "\r\n"))],
  ])("reads %s as the plain file", (_, bytes) => {
    // by construction: the same scenario as the plain UTF-8 file
    expect(readJsonFile(file(bytes))).toEqual(JSON.parse(good));
  });

  it("refuses NUL bytes outside UTF-16 (io/binary) and a truncated file (io/invalid-json at its last line), naming the file", () => {
    const nul = file(joinBytes(utf8Bytes(good.slice(0, 20)), Uint8Array.of(0), utf8Bytes(good.slice(20))));
    expect(outcomeOf(() => readJsonFile(nul), { source: nul })).toBe("io/binary");
    const lines = good.split("\n").length;
    for (let cut = 0; cut < good.length; cut += 7) {
      const p = file(utf8Bytes(good.slice(0, cut)));
      expect(outcomeOf(() => readJsonFile(p), { source: p, lineCodes: ["io/invalid-json"] }, () => {})).toBe("io/invalid-json");
    }
    // closed form: a text cut before its end fails where it ends, on its last line
    const cutAt = good.lastIndexOf("\n");
    expect(() => readJsonFile(file(utf8Bytes(good.slice(0, cutAt))))).toThrow(new RegExp(`line ${lines - 1}, column \\d+: the text ends inside an object`));
  });

  it("reads a scenario with a description line of 100,000 characters; Latin-1 µ in it reads as µ", () => {
    const long = JSON.stringify({ ...EXAMPLE_SCENARIO, description: "d".repeat(100_000) });
    expect((readJsonFile(file(utf8Bytes(long))) as { description: string }).description.length).toBe(100_000);
    const latin1 = file(joinBytes(utf8Bytes('{"description": "tip 5 '), Uint8Array.of(0xb5), utf8Bytes('m"}')));
    // closed form: Windows-1252 byte B5 is U+00B5
    expect(readJsonFile(latin1)).toEqual({ description: "tip 5 \u00b5m" });
  });
});

/** Values a scenario key may be given. */
const anyValue = fc.oneof(
  fc.double(),
  fc.constantFrom(0, -0, 1e-320, 1e308, -1e308, 1e-300, 0.5, 1, 2, 18, 19, 2 ** 32, -1, Number.MAX_SAFE_INTEGER),
  fc.integer(),
  fc.string({ maxLength: 8 }),
  fc.constantFrom(null, true, [], {}, [1, 2], { energyEV: 0.5, degeneracy: 2 }),
);
const KEYS = ["cb", "vb", "chargingEnergyEV", "eta", "tipRatePerS", "substrateRatePerS", "temperatureK", "broadeningEV", "relaxationRatePerS", "lockInVrms", "bias", "noise", "description", "fromV", "toV", "stepV", "energyEV", "degeneracy", "relative", "seed"];

/** A copy of the example scenario with one value (anywhere in it) replaced, or a key removed or added. */
function mutated(path: number, key: string, value: unknown, mode: number): unknown {
  const s = JSON.parse(good) as Record<string, unknown>;
  const containers: Record<string, unknown>[] = [s, s.bias as Record<string, unknown>, s.noise as Record<string, unknown>, ...(s.cb as Record<string, unknown>[]), ...(s.vb as Record<string, unknown>[])];
  const target = containers[path % containers.length];
  if (mode === 0) delete target[Object.keys(target)[path % Object.keys(target).length]];
  else if (mode === 1) target[key] = value;
  else target[Object.keys(target)[path % Object.keys(target).length]] = value;
  return s;
}

describe("parseScenario(value)", () => {
  it("on any JSON value: a scenario with finite numbers or a one-line DotspecError (2,000 values)", () => {
    fc.assert(
      fc.property(fc.oneof(fc.jsonValue(), fc.anything()), (value) => {
        outcomeOf(() => parseScenario(value), scenarioRules);
      }),
      { seed: 12203, numRuns: 2000 },
    );
  });

  it("on the example with one value replaced, a key removed or added: the same, naming the key (3,000 cases)", () => {
    const codes = new Set<string>();
    fc.assert(
      fc.property(fc.nat(), fc.constantFrom(...KEYS), anyValue, fc.integer({ min: 0, max: 2 }), (path, key, value, mode) => {
        const code = outcomeOf(() => parseScenario(mutated(path, key, value, mode)), scenarioRules);
        codes.add(code);
        if (code !== "ok") return;
      }),
      { seed: 12204, numRuns: 3000 },
    );
    // by construction: some mutations keep the scenario valid, most do not
    expect(codes.has("ok")).toBe(true);
    expect(codes.size).toBeGreaterThan(4);
  });

  it("refuses a state space over SCENARIO_DEFAULTS.maxStates up front (closed form: 19⁴ = 130,321 > 1,200 states)", () => {
    const big = { ...EXAMPLE_SCENARIO, cb: [0.5, 0.6, 0.7, 0.8].map((e) => ({ energyEV: e, degeneracy: 18 })) };
    expect(outcomeOf(() => parseScenario(big), scenarioRules)).toBe("scenario/too-many-states");
    expect(SCENARIO_DEFAULTS.maxStates).toBe(1200);
  });
});

describe("simulateCurve(scenario) on scenarios that pass", () => {
  /** A valid scenario with random magnitudes (few points, so each case is quick). */
  const scenario = fc.record({
    e0: fc.double({ min: 0.01, max: 3, noNaN: true }),
    gap: fc.double({ min: 0.01, max: 1, noNaN: true }),
    ec: fc.oneof(fc.constant(0), fc.double({ min: 1e-6, max: 1, noNaN: true })),
    eta: fc.double({ min: 1e-3, max: 1, noNaN: true }),
    tip: fc.double({ min: 1e-3, max: 1e15, noNaN: true }),
    sub: fc.double({ min: 1e-3, max: 1e15, noNaN: true }),
    // Temperatures below 1 K with no broadening need fine grids of up to the limit: a few such
    // cases (1e-300 K is refused) keep the property quick; the limit itself is tested below.
    t: fc.oneof(fc.double({ min: 1, max: 1e4, noNaN: true }), fc.constantFrom(1e-300, 1e-3, 4.5, 300)),
    broad: fc.oneof(fc.constant(0), fc.double({ min: 1e-3, max: 1, noNaN: true }), fc.constantFrom(1e-12, 1e-9)),
    lock: fc.oneof(fc.constant(0), fc.double({ min: 1e-3, max: 1, noNaN: true }), fc.constantFrom(1e-12, 1e-9, 10, 1e6)),
    noise: fc.oneof(fc.constant(null), fc.record({ relative: fc.double({ min: 0, max: 1, noNaN: true }), seed: fc.nat() })),
    method: fc.constantFrom("exact" as const, "fast" as const),
  });

  it("gives finite bias, current and dI/dV, or refuses the scenario up front with scenario/too-fine (80 scenarios, no hang)", () => {
    const codes = new Set<string>();
    fc.assert(
      fc.property(scenario, (p) => {
        const input = {
          cb: [{ energyEV: p.e0, degeneracy: 2 }, { energyEV: p.e0 + p.gap, degeneracy: 6 }],
          vb: [{ energyEV: -p.e0, degeneracy: 2 }],
          chargingEnergyEV: p.ec,
          eta: p.eta,
          tipRatePerS: p.tip,
          substrateRatePerS: p.sub,
          temperatureK: p.t,
          broadeningEV: p.broad,
          lockInVrms: p.lock,
          bias: { fromV: -2, toV: 2, stepV: 0.1 },
          noise: p.noise,
        };
        codes.add(outcomeOf(() => simulateCurve(input, { method: p.method }), scenarioRules, (sim) => {
          for (const [name, a] of Object.entries({ biasV: sim.biasV, currentA: sim.currentA, didvS: sim.didvS! })) {
            for (let i = 0; i < a.length; i++) if (!Number.isFinite(a[i])) expect.fail(`${name}[${i}] is ${a[i]}`);
          }
        }));
      }),
      { seed: 12205, numRuns: 80 },
    );
    expect(codes.has("ok")).toBe(true);
  }, 120_000);

  it("refuses a scenario whose exact fine grid would not fit (1 mK over 4 V) before allocating it", () => {
    // closed form: kB·1 mK/3 ≈ 2.9·10⁻⁸ eV per step, so 4 V needs ≈ 1.4·10⁸ fine points > 2·10⁷
    const cold = { ...EXAMPLE_SCENARIO, temperatureK: 1e-3, broadeningEV: 0 };
    expect(outcomeOf(() => simulateCurve(cold), scenarioRules)).toBe("scenario/too-fine");
    // the fast method needs no fine grid: the same scenario simulates
    expect(outcomeOf(() => simulateCurve(cold, { method: "fast" }), scenarioRules, () => {})).toBe("ok");
  });
});
