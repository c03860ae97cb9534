/**
 * User formulas for size models ("Eg + a / R^2 - b / R ; a=1, b=0.5"), parsed and evaluated by
 * mathjs in a restricted instance that accepts arithmetic on numbers and nothing else.
 */
import type * as MathJs from "mathjs";
import type { MathNode } from "mathjs";
import { lazyModule } from "../util/lazyModule.ts";
import { DotspecError } from "../util/errors.ts";
import { SIZE_QUANTITIES, type SizeQuantity } from "./sizeQuantities.ts";

/** Limits of {@link parseSizeFormula} (locked by test/sizes/defaults.test.ts). */
export const SIZE_FORMULA_DEFAULTS = Object.freeze({
  /** Longest accepted formula text, characters. */
  maxLength: 300,
  /** Most free parameters in one formula. */
  maxParameters: 8,
  /** Initial value of a parameter not given after ";". */
  initialValue: 1,
  /** Functions a formula may call. */
  functions: Object.freeze(["sqrt", "cbrt", "exp", "log", "log10", "pow", "abs", "sin", "cos", "tan", "sinh", "cosh", "tanh", "atan"]),
  /** Operators a formula may use (mathjs names): + − × ÷ ^ and the unary signs. */
  operators: Object.freeze(["add", "subtract", "multiply", "divide", "pow", "unaryMinus", "unaryPlus"]),
  /** Symbols with a fixed meaning: R (the radius, nm) and pi. */
  reserved: Object.freeze(["R", "pi"]),
});

// The restricted instance, set up as the mathjs documentation on expression-parser security
// advises: keep a private reference to `parse`, then replace the functions that alter the
// instance or parse further input (import, createUnit, evaluate, parse, simplify, derivative,
// and their relatives) by ones that throw. Formulas are also checked node by node against a
// whitelist before they are compiled, so a disabled function is never even reached.
// Created on first use (a pure cache: loading mathjs and creating the instance cost time at
// start-up, see lazyModule).
const mathjs = await lazyModule<typeof MathJs>("mathjs", "commonjs", () => import("mathjs"));
let limitedParse: ((expression: string) => MathNode) | null = null;
function restrictedParse(expression: string): MathNode {
  if (!limitedParse) {
    const { create, all } = mathjs();
    const math = create(all);
    const parse = math.parse;
    const disabled = (name: string) => () => {
      throw new Error(`function ${name} is disabled`);
    };
    math.import(
      Object.fromEntries(
        ["import", "createUnit", "evaluate", "parse", "compile", "simplify", "simplifyConstant", "simplifyCore", "derivative", "resolve", "reviver", "replacer", "chain", "rationalize", "leafCount", "symbolicEqual", "parser"]
          .map((name) => [name, disabled(name)]),
      ),
      { override: true },
    );
    limitedParse = (text: string) => parse(text);
  }
  return limitedParse(expression);
}

/** A parsed user formula. */
export interface SizeFormula {
  /** The text as given (trimmed). */
  text: string;
  /** The quantity named by a "quantity:" prefix, or null (then the formula applies to every quantity). */
  quantity: SizeQuantity | null;
  /** The expression (without prefix and initial values). */
  expression: string;
  /** Free parameters, in order of first appearance. */
  parameters: string[];
  /** Starting values by parameter (given after ";", else 1). */
  initialValues: Record<string, number>;
  /** Evaluates the formula at `radiusNM` (nm) with parameter values in the order of `parameters`; NaN where the result is not a real number. */
  evaluate: (radiusNM: number, values: readonly number[]) => number;
}

function fail(text: string, why: string, fix: string): never {
  throw new DotspecError("sizes/formula", `formula ${JSON.stringify(text.length > 80 ? text.slice(0, 77) + "..." : text)}: ${why}; ${fix}`);
}

const NODE_NAMES: Record<string, string> = {
  AccessorNode: "property access or indexing",
  ArrayNode: "an array literal",
  AssignmentNode: "an assignment",
  BlockNode: "several statements",
  ConditionalNode: "a conditional (?:)",
  FunctionAssignmentNode: "a function definition",
  IndexNode: "indexing",
  ObjectNode: "an object literal",
  RangeNode: "a range (:)",
  RelationalNode: "a comparison",
};

function checkNode(node: MathNode, text: string, parameters: string[]): void {
  const allowedFunctions = SIZE_FORMULA_DEFAULTS.functions as readonly string[];
  switch (node.type) {
    case "ConstantNode": {
      const value = (node as unknown as { value: unknown }).value;
      if (typeof value !== "number") fail(text, `only numbers may appear as constants; got ${JSON.stringify(value)}`, "remove the string or literal");
      return;
    }
    case "ParenthesisNode":
      return;
    case "SymbolNode": {
      const name = (node as unknown as { name: string }).name;
      if (allowedFunctions.includes(name)) fail(text, `${name} is a function, not a value`, `call it: ${name}(…)`);
      if (!/^[A-Za-z][A-Za-z0-9_]{0,31}$/.test(name)) fail(text, `symbol ${JSON.stringify(name)} is not a plain name`, "use letters, digits and _ (up to 32 characters)");
      if (name in Object.prototype) fail(text, `${JSON.stringify(name)} cannot be a parameter name`, "rename it");
      if (!(SIZE_FORMULA_DEFAULTS.reserved as readonly string[]).includes(name) && !parameters.includes(name)) parameters.push(name);
      return;
    }
    case "OperatorNode": {
      const fn = (node as unknown as { fn: string; op: string }).fn;
      if (!(SIZE_FORMULA_DEFAULTS.operators as readonly string[]).includes(fn)) {
        fail(text, `operator ${JSON.stringify((node as unknown as { op: string }).op)} is not allowed`, "use + - * / ^ only");
      }
      break;
    }
    case "FunctionNode": {
      const fnNode = (node as unknown as { fn: MathNode }).fn;
      const name = fnNode.type === "SymbolNode" ? (fnNode as unknown as { name: string }).name : null;
      if (name === null) fail(text, "only named functions may be called", `use one of ${allowedFunctions.join(", ")}`);
      if (!allowedFunctions.includes(name)) fail(text, `unknown or disallowed function ${JSON.stringify(name)}`, `use one of ${allowedFunctions.join(", ")}`);
      for (const arg of (node as unknown as { args: MathNode[] }).args) checkNode(arg, text, parameters);
      return;
    }
    default:
      fail(text, `${NODE_NAMES[node.type] ?? node.type} is not allowed`, "write a plain expression in R and parameter names");
  }
  for (const child of (node as unknown as { args: MathNode[] }).args) checkNode(child, text, parameters);
}

/**
 * Parses a user's size formula: `[quantity:] expression [; name=value, …]`.
 *
 * The variable `R` is the dot radius in nm and the result is in eV; `pi` is π; every other
 * symbol is a free parameter, started from the value after ";" (default 1). A prefix naming one
 * of the quantities ("chargingEnergyEV: a/R + b") limits the formula to that quantity; without
 * it the formula is fitted to every quantity given.
 *
 * Parameters
 * ----------
 * text : string
 *     The formula.
 *
 * Returns
 * -------
 * SizeFormula
 *     The parsed formula ({@link SizeFormula}).
 *
 * Throws
 * ------
 * DotspecError
 *     `sizes/formula` naming the problem, and for a syntax error the position with a caret under it.
 *
 * Notes
 * -----
 * 1. Refuse texts longer than `maxLength`; split off the prefix and the initial values.
 * 2. Parse with mathjs's parser, kept privately in an instance whose import, createUnit,
 *    evaluate, parse, simplify, derivative, resolve, compile… are disabled (the mathjs
 *    documentation's advice on expression-parser security).
 * 3. Walk the tree and allow only ConstantNode (numbers), SymbolNode (plain names),
 *    ParenthesisNode, OperatorNode (+ − × ÷ ^, unary ±) and FunctionNode calling a whitelisted
 *    function by name; anything else (assignments, function definitions, property access,
 *    arrays, objects, strings, ranges, conditionals, comparisons, several statements) is
 *    refused with its name.
 * 4. Compile the checked tree; evaluation passes R and the parameters in the scope, and returns
 *    NaN for a result that is not a real number (a log of a negative value gives a complex one).
 *
 * References
 * ----------
 * mathjs documentation, "Expression parser: Security" (mathjs.org/docs/expressions/security.html).
 *
 * Example
 * -------
 * ```ts
 * parseSizeFormula("Eg + a / R^2 - b / R ; a=1, b=0.5").parameters; // => ["Eg", "a", "b"]
 * ```
 */
export function parseSizeFormula(text: string): SizeFormula {
  if (typeof text !== "string") fail(String(text), "a formula must be text", "give it as a string");
  const trimmed = text.trim();
  if (trimmed.length === 0) fail(trimmed, "empty formula", 'write an expression in R, e.g. "Eg + a / R^2"');
  if (trimmed.length > SIZE_FORMULA_DEFAULTS.maxLength) {
    fail(trimmed, `${trimmed.length} characters is longer than the limit of ${SIZE_FORMULA_DEFAULTS.maxLength}`, "shorten it");
  }
  let body = trimmed;
  let quantity: SizeQuantity | null = null;
  const prefix = /^([A-Za-z][A-Za-z0-9_]*)\s*:(?!=)/.exec(body);
  if (prefix) {
    if (!(SIZE_QUANTITIES as readonly string[]).includes(prefix[1])) {
      fail(trimmed, `unknown quantity ${JSON.stringify(prefix[1])} before ":"`, `use one of ${SIZE_QUANTITIES.join(", ")}, or no prefix to fit every quantity`);
    }
    quantity = prefix[1] as SizeQuantity;
    body = body.slice(prefix[0].length);
  }
  const semicolon = body.indexOf(";");
  const expression = (semicolon >= 0 ? body.slice(0, semicolon) : body).trim();
  const initText = semicolon >= 0 ? body.slice(semicolon + 1).trim() : "";
  if (expression.length === 0) fail(trimmed, "no expression", 'write an expression in R, e.g. "a / R + b"');

  let node: MathNode;
  try {
    node = restrictedParse(expression);
  } catch (err) {
    const message = (err as Error).message ?? String(err);
    const ch = (err as { char?: number }).char;
    if (typeof ch === "number") {
      // mathjs reports the 1-based column of the offending token.
      const at = Math.max(0, Math.min(ch - 1, expression.length));
      const reason = message.replace(/\s*\(char \d+\)/, "");
      throw new DotspecError(
        "sizes/formula",
        `formula ${JSON.stringify(trimmed)}: syntax error at character ${at + 1} of the expression (${reason}); correct it there:\n  ${expression}\n  ${" ".repeat(at)}^`,
      );
    }
    fail(trimmed, `cannot parse (${message})`, "write a plain expression in R and parameter names");
  }
  const parameters: string[] = [];
  checkNode(node, trimmed, parameters);
  if (parameters.length > SIZE_FORMULA_DEFAULTS.maxParameters) {
    fail(trimmed, `${parameters.length} free parameters (${parameters.join(", ")}) exceed the limit of ${SIZE_FORMULA_DEFAULTS.maxParameters}`, "fix some values in the expression");
  }

  const initialValues: Record<string, number> = Object.fromEntries(parameters.map((p) => [p, SIZE_FORMULA_DEFAULTS.initialValue]));
  if (initText.length > 0) {
    for (const item of initText.split(",")) {
      const m = /^\s*([A-Za-z][A-Za-z0-9_]*)\s*=\s*([^=]+?)\s*$/.exec(item);
      const value = m ? Number(m[2]) : NaN;
      if (!m || !Number.isFinite(value)) {
        fail(trimmed, `initial value ${JSON.stringify(item.trim())} is not of the form name=number`, 'write e.g. "; a=1, b=0.5"');
      }
      if (!parameters.includes(m[1])) {
        fail(trimmed, `initial value for ${JSON.stringify(m[1])}, which is not a parameter of the expression`, `the parameters are ${parameters.join(", ") || "(none)"}`);
      }
      initialValues[m[1]] = value;
    }
  }

  const code = node.compile();
  const evaluate = (radiusNM: number, values: readonly number[]): number => {
    const scope = new Map<string, number>([["R", radiusNM]]);
    parameters.forEach((p, i) => scope.set(p, values[i]));
    let result: unknown;
    try {
      result = code.evaluate(scope);
    } catch {
      return NaN;
    }
    return typeof result === "number" ? result : NaN;
  };
  return { text: trimmed, quantity, expression, parameters, initialValues, evaluate };
}
