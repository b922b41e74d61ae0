/**
 * Input values as people type them — `6 m`, `19.7 ft`, `12 kN/m`, `0.8 kip/ft`, or a bare number in the
 * input's own unit — read, converted and checked against the input's bounds. Each refusal names the input.
 */
import type { InputDefinition } from "./definition";
import { compileExpression, ExpressionError } from "./expressions";
import { describeDimension, hasDimensionOf, isTradeUnitText, math, unitNamesIn, TRADE_UNITS, type Value } from "./units";
import { formatValue } from "./format";

export interface InputProblem {
  readonly input: string;
  readonly message: string;
}

/** A number, optionally signed and with a decimal part and exponent, then an optional unit. */
const NUMBER_AND_UNIT = /^\s*([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*?)\s*$/;
export const MAX_INPUT_TEXT = 60;

/** Read one typed value of an input; a text, or a number meaning "in the input's unit". */
export function readInput(key: string, definition: InputDefinition, raw: string | number): Value | InputProblem {
  const label = definition.label;
  // Sections and materials are found in a library (library-inputs.ts), never read as a number.
  if (definition.quantity === "section" || definition.quantity === "material")
    return { input: key, message: `${label}: choose a ${definition.quantity} from the library` };
  if (definition.quantity === "choice") {
    const text = String(raw).trim();
    if (!definition.choices?.includes(text))
      return {
        input: key,
        message: `${label}: choose one of ${definition.choices?.join(", ")}, not "${text.slice(0, MAX_INPUT_TEXT)}"`,
      };
    return text;
  }
  let value: Value;
  if (typeof raw === "number") {
    if (!Number.isFinite(raw)) return { input: key, message: `${label}: enter a finite number` };
    value = definition.unit ? math.unit(raw, definition.unit) : raw;
  } else {
    if (raw.length > MAX_INPUT_TEXT) return { input: key, message: `${label}: at most ${MAX_INPUT_TEXT} characters` };
    const match = NUMBER_AND_UNIT.exec(raw);
    if (!match)
      return {
        input: key,
        message: `${label}: enter a number${definition.unit ? ` with its unit, e.g. 6 ${definition.unit}` : ""}`,
      };
    const number = Number(match[1]);
    const unitText = match[2];
    if (!Number.isFinite(number)) return { input: key, message: `${label}: enter a finite number` };
    if (unitText === "") value = definition.unit ? math.unit(number, definition.unit) : number;
    else {
      if (!isTradeUnitText(unitText))
        return { input: key, message: `${label}: "${unitText.slice(0, MAX_INPUT_TEXT)}" is not a unit Gusset knows` };
      value = math.unit(number, unitText);
    }
  }
  if (definition.quantity === "count") {
    if (typeof value !== "number" || !Number.isInteger(value)) return { input: key, message: `${label}: enter a whole number` };
    return value;
  }
  if (!hasDimensionOf(value, definition.quantity))
    return {
      input: key,
      message: `${label}: ${typeof raw === "string" ? raw.trim() : formatValue(value, undefined, 4)} is ${describeDimension(value)}; enter a ${definition.quantity.replaceAll("-", " ")}${definition.unit ? `, e.g. in ${definition.unit}` : ""}`,
    };
  return value;
}

/** Check a value against the input's bounds, which may read the other inputs' values. */
export function boundsProblem(
  key: string,
  definition: InputDefinition,
  value: Value,
  scope: ReadonlyMap<string, Value>,
): InputProblem | null {
  const known = new Set(scope.keys());
  for (const [side, source] of [
    ["min", definition.min],
    ["max", definition.max],
  ] as const) {
    if (source === undefined) continue;
    let bound: Value;
    try {
      bound = compileExpression(source, known).evaluate(scope);
    } catch (error) {
      if (error instanceof ExpressionError)
        return {
          input: key,
          message: `${definition.label}: its ${side}imum \`${source}\` cannot be evaluated (${error.reason})`,
        };
      throw error;
    }
    let outside: boolean;
    try {
      outside =
        side === "min"
          ? (math.smaller(value as number, bound as number) as boolean)
          : (math.larger(value as number, bound as number) as boolean);
    } catch {
      return { input: key, message: `${definition.label}: its ${side}imum \`${source}\` is not of the same kind as the input` };
    }
    if (outside) {
      const shown = formatValue(value, definition.unit, 4, true);
      const limit = formatValue(bound, definition.unit, 4, true);
      return {
        input: key,
        message: `${definition.label}: ${shown} is ${side === "min" ? "below the minimum" : "above the maximum"} ${limit}`,
      };
    }
  }
  return null;
}

/** Unit names in a value, for tests and messages. */
export function unitsOf(value: Value): string[] {
  return math.isUnit(value) ? unitNamesIn(value).filter((u) => TRADE_UNITS.has(u)) : [];
}
