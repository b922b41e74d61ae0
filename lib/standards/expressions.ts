/**
 * Expressions of a standard: mathjs syntax, checked against an allowlist before they are ever compiled.
 *
 * Blocking a list of dangerous functions is not a sandbox — `config(…)` changes the shared instance for every
 * later evaluation, `ones(3000, 3000)` and `1:5e6` eat time and memory, `f(x) = …` defines functions. So an
 * expression may contain only: numbers and quoted texts, names (a known name, a trade unit or `pi`),
 * arithmetic, comparison and logical operators, parentheses, `a ? b : c`, and calls of the functions in
 * FUNCTIONS. Everything else (assignments, function definitions, matrices, ranges, property access, indexing,
 * `to` conversions, any other function) is refused with the expression named.
 */
import type { MathNode } from "mathjs";
import { fastNumeric } from "./numeric-fast";
import { math, TRADE_UNITS, type Value } from "./units";

export const MAX_EXPRESSION_LENGTH = 400;

/** Functions an expression may call, with how many arguments each takes. */
const FUNCTIONS: Readonly<Record<string, { min: number; max: number }>> = {
  abs: { min: 1, max: 1 },
  sqrt: { min: 1, max: 1 },
  cbrt: { min: 1, max: 1 },
  min: { min: 2, max: 8 },
  max: { min: 2, max: 8 },
  sin: { min: 1, max: 1 },
  cos: { min: 1, max: 1 },
  tan: { min: 1, max: 1 },
  asin: { min: 1, max: 1 },
  acos: { min: 1, max: 1 },
  atan: { min: 1, max: 1 },
  atan2: { min: 2, max: 2 },
  hypot: { min: 2, max: 4 },
  exp: { min: 1, max: 1 },
  log: { min: 1, max: 1 },
  log10: { min: 1, max: 1 },
  floor: { min: 1, max: 1 },
  ceil: { min: 1, max: 1 },
  sign: { min: 1, max: 1 },
};

const OPERATORS = new Set([
  "add",
  "subtract",
  "multiply",
  "divide",
  "pow",
  "unaryMinus",
  "unaryPlus",
  "equal",
  "unequal",
  "smaller",
  "smallerEq",
  "larger",
  "largerEq",
  "and",
  "or",
  "not",
]);

const CONSTANTS = new Set(["pi"]);

// `==` and `!=` compare texts (a choice's value) as texts; mathjs's own `equal` would try to read them as
// numbers. The checked tree calls these instead; no expression can name them (they are not in FUNCTIONS).
const SAME = "__gussetSame";
const DIFFERENT = "__gussetDifferent";
function same(a: unknown, b: unknown): boolean {
  if (typeof a === "string" || typeof b === "string") return a === b;
  return math.equal(a as number, b as number) as boolean;
}
math.import({ [SAME]: same, [DIFFERENT]: (a: unknown, b: unknown) => !same(a, b) }, { override: true });

/** Names no input, derived value or loop variable may take: units, functions, constants and mathjs words. */
export function reservedNameReason(name: string): string | null {
  if (TRADE_UNITS.has(name)) return `\`${name}\` is the name of a unit`;
  if (name in FUNCTIONS) return `\`${name}\` is the name of a function`;
  if (CONSTANTS.has(name) || ["e", "i", "true", "false", "null", "Infinity", "NaN", "to", "in", "mod"].includes(name))
    return `\`${name}\` is a reserved word of expressions`;
  return null;
}

export class ExpressionError extends Error {
  constructor(
    readonly expression: string,
    readonly reason: string,
  ) {
    super(`${reason} in \`${expression}\``);
  }
}

export interface CompiledExpression {
  readonly source: string;
  /** Names (not units or constants) the expression reads. */
  readonly names: ReadonlyArray<string>;
  evaluate(scope: ReadonlyMap<string, Value>): Value;
}

function describeNode(node: MathNode): string {
  switch (node.type) {
    case "AssignmentNode":
      return "an assignment";
    case "FunctionAssignmentNode":
      return "a function definition";
    case "ArrayNode":
      return "a list or matrix";
    case "RangeNode":
      return "a range";
    case "AccessorNode":
      return "property access or indexing";
    case "IndexNode":
      return "indexing";
    case "ObjectNode":
      return "an object";
    case "BlockNode":
      return "several statements";
    default:
      return `a ${node.type}`;
  }
}

/**
 * Parse and check an expression; `known` holds the names it may read. Throws ExpressionError with a sentence
 * a person can act on.
 */
/** The names an expression may read: a Set, or the Map of values itself. */
export interface KnownNames {
  has(name: string): boolean;
}

export function checkExpression(source: string, known: KnownNames): { node: MathNode; names: string[] } {
  if (source.length > MAX_EXPRESSION_LENGTH)
    throw new ExpressionError(source.slice(0, 40) + "…", `an expression may be at most ${MAX_EXPRESSION_LENGTH} characters`);
  let node: MathNode;
  try {
    node = math.parse(source);
  } catch (error) {
    throw new ExpressionError(source, `cannot read the expression (${(error as Error).message})`);
  }
  const names = new Set<string>();
  const visit = (n: MathNode, isCallee: boolean): void => {
    switch (n.type) {
      case "ConstantNode": {
        const value = (n as unknown as { value: unknown }).value;
        if (typeof value !== "number" && typeof value !== "string")
          throw new ExpressionError(source, `the constant ${String(value)} is not allowed`);
        return;
      }
      case "SymbolNode": {
        const name = (n as unknown as { name: string }).name;
        if (isCallee) return;
        if (known.has(name)) names.add(name);
        else if (!TRADE_UNITS.has(name) && !CONSTANTS.has(name)) throw new ExpressionError(source, `unknown name \`${name}\``);
        return;
      }
      case "ParenthesisNode":
        visit((n as unknown as { content: MathNode }).content, false);
        return;
      case "ConditionalNode": {
        const c = n as unknown as { condition: MathNode; trueExpr: MathNode; falseExpr: MathNode };
        visit(c.condition, false);
        visit(c.trueExpr, false);
        visit(c.falseExpr, false);
        return;
      }
      case "OperatorNode": {
        const op = n as unknown as { fn: string; op: string; args: MathNode[] };
        if (!OPERATORS.has(op.fn)) throw new ExpressionError(source, `the operator \`${op.op}\` is not allowed`);
        for (const a of op.args) visit(a, false);
        return;
      }
      case "FunctionNode": {
        const f = n as unknown as { fn: MathNode; args: MathNode[] };
        const name = f.fn.type === "SymbolNode" ? (f.fn as unknown as { name: string }).name : null;
        const rule = name !== null && Object.hasOwn(FUNCTIONS, name) ? FUNCTIONS[name] : undefined;
        if (!rule || known.has(name!))
          throw new ExpressionError(source, `the function \`${name ?? "(computed)"}\` is not allowed`);
        if (f.args.length < rule.min || f.args.length > rule.max)
          throw new ExpressionError(
            source,
            `\`${name}\` takes ${rule.min === rule.max ? rule.min : `${rule.min} to ${rule.max}`} argument${rule.max === 1 ? "" : "s"}`,
          );
        for (const a of f.args) visit(a, false);
        return;
      }
      default:
        throw new ExpressionError(source, `${describeNode(n)} is not allowed`);
    }
  };
  visit(node, false);
  const compared = node.transform((n) => {
    if (n.type !== "OperatorNode") return n;
    const op = n as unknown as { fn: string; args: MathNode[] };
    if (op.fn !== "equal" && op.fn !== "unequal") return n;
    return new math.FunctionNode(new math.SymbolNode(op.fn === "equal" ? SAME : DIFFERENT), op.args);
  });
  return { node: compared, names: [...names] };
}

/** Compiled expressions by source text and allowed names; a version's expressions compile once. */
const cache = new Map<string, CompiledExpression>();
const CACHE_LIMIT = 20_000;

export function compileExpression(source: string, known: KnownNames): CompiledExpression {
  // Cached by its text: a cached expression serves wherever every name it reads is known (names are never
  // units, so no other symbol of it can change meaning); otherwise it is checked again and refused.
  const key = source;
  const hit = cache.get(key);
  if (hit && hit.names.every((name) => known.has(name))) return hit;
  const { node, names } = checkExpression(source, known);
  const code = node.compile();
  const compiled: CompiledExpression = {
    source,
    names,
    evaluate(scope) {
      return runCompiled(source, code, names, scope);
    },
  };
  if (cache.size >= CACHE_LIMIT) cache.clear();
  cache.set(key, compiled);
  return compiled;
}

/**
 * Run a compiled tree with only the names it reads handed over (nothing else is reachable from it), and check
 * its result: a finite real number, a quantity, a text or a condition.
 */
function runCompiled(
  source: string,
  code: { evaluate(scope: Map<string, unknown>): unknown },
  names: ReadonlyArray<string>,
  scope: { get(name: string): unknown },
  own = new Map<string, unknown>(),
): Value {
  for (const name of names) {
    const value = scope.get(name);
    if (value === undefined) throw new ExpressionError(source, `\`${name}\` has no value here`);
    own.set(name, value);
  }
  let out: unknown;
  try {
    out = code.evaluate(own);
  } catch (error) {
    throw new ExpressionError(source, describeMathError(error as Error));
  }
  return checkResult(source, out);
}

function describeMathError(error: Error): string {
  const m = error.message;
  if (/Units do not match/i.test(m)) return "the units do not match (adding or comparing values of different kinds)";
  if (/Unit .* not found|Undefined symbol/i.test(m)) return m.replace(/^.*?(Undefined symbol|Unit)/, "$1");
  return m;
}

function checkResult(source: string, out: unknown): Value {
  if (typeof out === "number") {
    if (!Number.isFinite(out)) throw new ExpressionError(source, "the result is not a finite number (a division by zero?)");
    return out;
  }
  if (typeof out === "string" || typeof out === "boolean") return out;
  if (math.isUnit(out)) {
    const v = out.value;
    if (v === null || !Number.isFinite(v as number))
      throw new ExpressionError(source, "the result is not a finite number (a division by zero?)");
    return out;
  }
  if (math.isComplex(out))
    throw new ExpressionError(source, "the result is not a real number (the root or log of a negative value?)");
  throw new ExpressionError(source, "the result is not a number");
}

/** Values in SI as plain numbers (texts and conditions as they are), for the numeric path. */
export type SiValue = number | string | boolean;

/** Where a numeric expression reads its names: a Map, or a lighter view over several. */
export interface SiScope {
  get(name: string): SiValue | undefined;
}

export interface NumericExpression {
  readonly names: ReadonlyArray<string>;
  evaluate(scope: SiScope): SiValue;
  /**
   * The same on numbers only, through the closures of numeric-fast.ts: null when the expression or a value is
   * not one those mirror exactly, or the result is not a finite number — then `evaluate` answers (and says why).
   */
  evaluateNumber(scope: SiScope): number | null;
}

const numericCache = new Map<string, NumericExpression>();

/**
 * The same expression on plain SI numbers: every unit in it replaced by its factor to SI (`kN` → 1000,
 * `mm` → 0.001, `deg` → π/180), every name read as its SI number. Sound only after the expression has been
 * evaluated once with units, which checks its dimensions: then the SI arithmetic gives the SI result, many
 * times faster — used where one expression runs at hundreds of sections.
 */
export function compileNumeric(source: string, known: KnownNames): NumericExpression {
  const key = source;
  const hit = numericCache.get(key);
  if (hit && hit.names.every((name) => known.has(name))) return hit;
  const { node, names } = checkExpression(source, known);
  const numeric = node.transform((n) => {
    if (n.type !== "SymbolNode") return n;
    const name = (n as unknown as { name: string }).name;
    if (known.has(name) || !TRADE_UNITS.has(name)) return n;
    return new math.ConstantNode(math.unit(1, name).toSI().toNumber() as number);
  });
  const code = numeric.compile();
  // One map for the expression's names, refilled on each call (every name is set before the expression runs):
  // a check over every section of a large frame calls this tens of thousands of times.
  const own = new Map<string, unknown>();
  // mathjs's tolerances for comparing numbers (its config; read, never changed here).
  const { relTol = 1e-12, absTol = 1e-15 } = math.config({});
  const fast = fastNumeric(numeric, names, { relTol, absTol });
  const values = new Float64Array(names.length);
  const compiled: NumericExpression = {
    names,
    evaluate(scope) {
      const value = runCompiled(source, code, names, scope, own);
      if (math.isUnit(value)) throw new ExpressionError(source, "a unit was left in the numeric form");
      return value as SiValue;
    },
    evaluateNumber(scope) {
      if (!fast) return null;
      for (let k = 0; k < names.length; k++) {
        const value = scope.get(names[k]);
        if (typeof value !== "number") return null;
        values[k] = value;
      }
      const result = fast(values);
      return Number.isFinite(result) ? result : null;
    },
  };
  if (numericCache.size >= CACHE_LIMIT) numericCache.clear();
  numericCache.set(key, compiled);
  return compiled;
}
