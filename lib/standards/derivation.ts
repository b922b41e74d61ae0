/**
 * Equations with values substituted, the thing engineers print: a derived value as its symbolic formula (from
 * the very mathjs expression the evaluation ran, with each name's LaTeX symbol), then the same formula with
 * each name replaced by its value in its display unit, then the result in its display unit. Built from the
 * definition and one evaluation, so the print can never disagree with the numbers.
 */
import type { MathNode } from "mathjs";
import type { Definition } from "./definition";
import type { Evaluation } from "./evaluate";
import { checkExpression } from "./expressions";
import { LIBRARY_DISPLAY_UNITS, valueName } from "./library-inputs";
import { formatSignificant, trimZeros } from "./format";
import { math, QUANTITIES, type Quantity } from "./units";

export interface DerivationLatex {
  /** e.g. `\phi_b M_n = 0.9 \, F_y \, Z_x` */
  readonly symbolic: string;
  /** e.g. `= 0.9 \cdot 345\,\mathrm{MPa} \cdot 1.2\times10^{6}\,\mathrm{mm}^{3}` */
  readonly substituted: string;
  /** e.g. `= 373\,\mathrm{kN\,m}` */
  readonly result: string;
}

/** `kN m` → `\mathrm{kN}\,\mathrm{m}`, `mm^4` → `\mathrm{mm}^{4}`, `kN/m` → `\mathrm{kN}/\mathrm{m}`. */
export function unitLatex(unit: string): string {
  return unit
    .trim()
    .split(/\s+|(?=\/)|(?<=\/)/)
    .map((part) => {
      if (part === "/") return "/";
      const [name, power] = part.split("^");
      return `\\mathrm{${name}}${power ? `^{${power}}` : ""}`;
    })
    .join("\\,")
    .replace(/\\,\/\\,/g, "/");
}

/** A name as LaTeX when it has no symbol of its own: `w_D` → `w_{D}`, `phi_M_n` → `phi_{M_n}`. */
export function nameLatex(name: string): string {
  const i = name.indexOf("_");
  return i < 0 ? name : `${name.slice(0, i)}_{${name.slice(i + 1).replaceAll("_", "\\_")}}`;
}

function numberLatex(value: number, digits: number, trim = false): string {
  const text = formatSignificant(value, digits);
  return (trim ? trimZeros(text) : text).replace(
    /×10(.*)$/,
    (_, p: string) => `\\times10^{${p.replace(/[⁻⁰¹²³⁴⁵⁶⁷⁸⁹]/g, (c) => "-0123456789"["⁻⁰¹²³⁴⁵⁶⁷⁸⁹".indexOf(c)])}}`,
  );
}

function quantityLatex(si: number, quantity: Quantity, unit: string | undefined, digits: number, trim = false): string {
  const siUnit = QUANTITIES[quantity];
  if (siUnit === "" || !unit) return numberLatex(si, digits, trim);
  return `${numberLatex(math.unit(si, siUnit).toNumber(unit), digits, trim)}\\,${unitLatex(unit)}`;
}

export function derivationLatex(definition: Definition, evaluation: Evaluation, key: string): DerivationLatex {
  const derived = definition.derived[key];
  if (!derived) throw new Error(`no derived value ${key}`);
  const symbols = new Map<string, string>();
  const values = new Map<string, string>();
  for (const [name, input] of Object.entries(definition.inputs)) {
    symbols.set(name, input.symbol ?? nameLatex(name));
    const e = evaluation.inputs[name];
    if (input.quantity === "choice" || e.entry) values.set(name, `\\text{${String(e.si).replace(/[{}\\]/g, "")}}`);
    // Inputs read back as typed: 6 m, not 6.000 m.
    else values.set(name, quantityLatex(e.si as number, input.quantity as Quantity, input.unit, 6, true));
    // A library entry's values (`beam_Ix`), in the units tables state them in.
    for (const [value, { si, quantity }] of Object.entries(e.entry?.values ?? {})) {
      const full = valueName(name, value);
      symbols.set(full, nameLatex(full));
      values.set(full, quantityLatex(si, quantity, LIBRARY_DISPLAY_UNITS[quantity], 4));
    }
  }
  for (const [name, d] of Object.entries(definition.derived)) {
    symbols.set(name, d.symbol ?? nameLatex(name));
    const e = evaluation.derived[name];
    if (e) values.set(name, quantityLatex(e.si, d.quantity, d.unit, d.digits));
  }
  const { node } = checkExpression(derived.expr, new Set(symbols.keys()));
  const tex = (replacement: Map<string, string>, wrap: boolean) =>
    node.toTex({
      handler: (n: MathNode) => {
        if (n.type !== "SymbolNode") return undefined;
        const name = (n as unknown as { name: string }).name;
        const r = replacement.get(name);
        if (r === undefined) return undefined;
        // Braces keep `\cdot` from running into the symbol (`\cdotF_y` is no command).
        return wrap ? `{\\left(${r}\\right)}` : `{${r}}`;
      },
    });
  const own = symbols.get(key)!;
  const result = evaluation.derived[key];
  return {
    symbolic: `${own} = ${tex(symbols, false)}`,
    substituted: `= ${tex(values, true)}`,
    result: `= ${quantityLatex(result.si, derived.quantity, derived.unit, derived.digits)}`,
  };
}
