/**
 * A checked numeric expression's arithmetic as plain closures over numbers, for the one place an expression runs
 * tens of thousands of times: a check at every section of every member under every combination.
 *
 * Nothing is generated or run as JavaScript text. mathjs parses the expression and the allowlist checks it
 * (expressions.ts); each node of that checked tree then becomes a small function doing exactly what mathjs does
 * for plain numbers — its comparisons with its tolerances (relTol, absTol), `min` and `max` keeping the first of
 * nearly equal values, `pow`, `sqrt`, `log`, `asin`, `acos` going complex (here: not a number) where mathjs
 * does. Whatever it does not mirror exactly is left to mathjs: texts, conditions as results, `floor`, `ceil`,
 * `sign`, `cbrt`, `hypot`. A result that is not a finite number is also left to mathjs, which says what went
 * wrong. tests/standards/numeric-fast.test.ts compares the two on random trees and values.
 */
import type { MathNode } from "mathjs";

/** The expression on its names' values, in the order of the names given when it was compiled. */
export type FastNumeric = (values: ArrayLike<number>) => number;
type Node = (values: ArrayLike<number>) => number;

/** mathjs's own test for nearly equal numbers (utils/number.js nearlyEqual, with its configured tolerances). */
function nearlyEqualWith(relTol: number, absTol: number) {
  return (a: number, b: number): boolean => {
    if (!Number.isFinite(a) || !Number.isFinite(b)) return a === b;
    if (a === b) return true;
    return Math.abs(a - b) <= Math.max(relTol * Math.max(Math.abs(a), Math.abs(b)), absTol);
  };
}

const COMPARISONS = new Set(["smaller", "smallerEq", "larger", "largerEq", "and", "or", "not"]);
const SAME = "__gussetSame";
const DIFFERENT = "__gussetDifferent";

/** Whether a node gives a condition (true or false) in mathjs rather than a number. */
function isCondition(node: MathNode): boolean {
  const n = node as MathNode & { fn?: unknown; content?: MathNode; trueExpr?: MathNode; falseExpr?: MathNode };
  if (n.type === "OperatorNode") return COMPARISONS.has(n.fn as string);
  if (n.type === "FunctionNode") {
    const name = (n.fn as { name?: string }).name;
    return name === SAME || name === DIFFERENT;
  }
  if (n.type === "ParenthesisNode") return isCondition(n.content!);
  if (n.type === "ConditionalNode") return isCondition(n.trueExpr!) || isCondition(n.falseExpr!);
  return false;
}

const truth = (x: boolean) => (x ? 1 : 0);

/** Null when some part is not mirrored exactly (mathjs then runs the expression). */
export function fastNumeric(
  root: MathNode,
  names: ReadonlyArray<string>,
  tolerances: { relTol: number; absTol: number },
): FastNumeric | null {
  if (isCondition(root)) return null;
  const nearlyEqual = nearlyEqualWith(tolerances.relTol, tolerances.absTol);
  const slot = new Map(names.map((name, index) => [name, index]));

  const build = (node: MathNode): Node | null => {
    const n = node as MathNode & {
      value?: unknown;
      name?: string;
      op?: string;
      fn?: unknown;
      args?: MathNode[];
      content?: MathNode;
      condition?: MathNode;
      trueExpr?: MathNode;
      falseExpr?: MathNode;
    };
    switch (n.type) {
      case "ConstantNode": {
        const value = n.value;
        return typeof value === "number" ? () => value : null;
      }
      case "SymbolNode": {
        const index = slot.get(n.name!);
        if (index !== undefined) return (v) => v[index];
        return n.name === "pi" ? () => Math.PI : null;
      }
      case "ParenthesisNode":
        return build(n.content!);
      case "ConditionalNode": {
        const [test, yes, no] = [build(n.condition!), build(n.trueExpr!), build(n.falseExpr!)];
        if (!test || !yes || !no) return null;
        return (v) => {
          const t = test(v);
          return Number.isNaN(t) ? NaN : t ? yes(v) : no(v);
        };
      }
      case "OperatorNode":
        return operator(n.fn as string, n.args ?? []);
      case "FunctionNode":
        return call((n.fn as { name?: string }).name ?? "", n.args ?? []);
      default:
        return null;
    }
  };

  const operator = (fn: string, args: MathNode[]): Node | null => {
    const parts = args.map(build);
    if (parts.some((p) => p === null)) return null;
    const [a, b] = parts as Node[];
    switch (fn) {
      case "add":
        return (v) => a(v) + b(v);
      case "subtract":
        return (v) => a(v) - b(v);
      case "multiply":
        return (v) => a(v) * b(v);
      case "divide":
        return (v) => a(v) / b(v);
      case "unaryMinus":
        return (v) => -a(v);
      case "unaryPlus":
        return a;
      case "pow":
        return (v) => {
          const x = a(v);
          const y = b(v);
          // A negative base with a fractional exponent: complex in mathjs, NaN from Math.pow.
          if ((x * x < 1 && y === Infinity) || (x * x > 1 && y === -Infinity)) return 0;
          return Math.pow(x, y);
        };
      case "smaller":
        return compare(a, b, (x, y) => x < y && !nearlyEqual(x, y));
      case "smallerEq":
        return compare(a, b, (x, y) => x <= y || nearlyEqual(x, y));
      case "larger":
        return compare(a, b, (x, y) => x > y && !nearlyEqual(x, y));
      case "largerEq":
        return compare(a, b, (x, y) => x >= y || nearlyEqual(x, y));
      case "and":
        return (v) => {
          const x = a(v);
          if (Number.isNaN(x)) return NaN;
          if (!x) return 0;
          const y = b(v);
          return Number.isNaN(y) ? NaN : truth(Boolean(y));
        };
      case "or":
        return (v) => {
          const x = a(v);
          if (Number.isNaN(x)) return NaN;
          if (x) return 1;
          const y = b(v);
          return Number.isNaN(y) ? NaN : truth(Boolean(y));
        };
      case "not":
        return (v) => {
          const x = a(v);
          return Number.isNaN(x) ? NaN : truth(!x);
        };
      default:
        return null;
    }
  };

  const compare =
    (a: Node, b: Node, relation: (x: number, y: number) => boolean): Node =>
    (v) => {
      const x = a(v);
      const y = b(v);
      return Number.isNaN(x) || Number.isNaN(y) ? NaN : truth(relation(x, y));
    };

  const call = (name: string, args: MathNode[]): Node | null => {
    const parts = args.map(build);
    if (parts.some((p) => p === null)) return null;
    const fns = parts as Node[];
    const [a, b] = fns;
    const unary =
      (f: (x: number) => number): Node =>
      (v) =>
        f(a(v));
    switch (name) {
      case "abs":
        return unary(Math.abs);
      case "sqrt":
        return unary((x) => (x < 0 ? NaN : Math.sqrt(x)));
      case "exp":
        return unary(Math.exp);
      case "log":
        return unary((x) => (x < 0 ? NaN : Math.log(x)));
      case "log10":
        return unary((x) => (x < 0 ? NaN : Math.log10(x)));
      case "sin":
        return unary(Math.sin);
      case "cos":
        return unary(Math.cos);
      case "tan":
        return unary(Math.tan);
      case "atan":
        return unary(Math.atan);
      case "asin":
        return unary((x) => (x >= -1 && x <= 1 ? Math.asin(x) : NaN));
      case "acos":
        return unary((x) => (x >= -1 && x <= 1 ? Math.acos(x) : NaN));
      case "atan2":
        return (v) => Math.atan2(a(v), b(v));
      case "min":
      case "max": {
        // mathjs keeps the running value unless the next is strictly smaller (larger) beyond its tolerance.
        const better =
          name === "min"
            ? (x: number, best: number) => x < best && !nearlyEqual(x, best)
            : (x: number, best: number) => x > best && !nearlyEqual(x, best);
        return (v) => {
          let best = fns[0](v);
          if (Number.isNaN(best)) return NaN;
          for (let k = 1; k < fns.length; k++) {
            const x = fns[k](v);
            if (Number.isNaN(x)) return NaN;
            if (better(x, best)) best = x;
          }
          return best;
        };
      }
      case SAME:
        return compare(a, b, nearlyEqual);
      case DIFFERENT:
        return compare(a, b, (x, y) => !nearlyEqual(x, y));
      default:
        return null;
    }
  };

  return build(root);
}
