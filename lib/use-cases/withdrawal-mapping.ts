import "server-only";
// How a withdrawn version's inputs map onto its successor's: checked once, when the lead declares it, against both
// versions' input definitions (a zod schema built from them, one issue per problem, each naming the input), and
// applied to each affected run's inputs when the batch re-runs it.
import { z } from "@/lib/domain/zod";
import { AppError } from "@/lib/domain/errors";
import type { InputMapping } from "@/db/schema";
import type { Definition } from "@/lib/standards/definition";
import { readInput } from "@/lib/standards/inputs";
import { isLibraryInput } from "@/lib/standards/library-inputs";
import type { RunInputs } from "./run-store";

const label = (definition: Definition, key: string) => `${definition.inputs[key]?.label ?? key} (${key})`;

/** The mapping as a zod schema of the two definitions: every old input carried, renamed or dropped; every new one given. */
export function mappingAgainst(from: Definition, to: Definition, successorName: string) {
  const old = Object.keys(from.inputs);
  const next = Object.keys(to.inputs);
  return z
    .object({
      rename: z.record(z.string(), z.string()),
      values: z.record(z.string(), z.union([z.string(), z.number()])),
      drop: z.array(z.string()),
    })
    .superRefine((mapping, context) => {
      const problem = (path: (string | number)[], message: string) => context.addIssue({ code: "custom", path, message });
      const renamed = new Set(Object.keys(mapping.rename));
      const dropped = new Set(mapping.drop);
      const covered = new Map<string, string>();
      const cover = (target: string, by: string, path: (string | number)[]) => {
        const earlier = covered.get(target);
        if (earlier) problem(path, `${label(to, target)} of ${successorName} is given twice: by ${earlier} and by ${by}.`);
        else covered.set(target, by);
      };
      for (const [source, target] of Object.entries(mapping.rename)) {
        const path = ["rename", source];
        if (!Object.hasOwn(from.inputs, source)) problem(path, `The withdrawn version has no input “${source}” to rename.`);
        else if (!Object.hasOwn(to.inputs, target))
          problem(path, `${successorName} has no input “${target}” to rename ${source} to.`);
        else if (from.inputs[source].quantity !== to.inputs[target].quantity)
          problem(
            path,
            `${label(from, source)} is a ${from.inputs[source].quantity} and ${label(to, target)} a ${to.inputs[target].quantity}: they cannot be one input.`,
          );
        else cover(target, `the renamed ${source}`, path);
        if (dropped.has(source)) problem(path, `${source} is both renamed and dropped; choose one.`);
      }
      mapping.drop.forEach((source, index) => {
        if (!Object.hasOwn(from.inputs, source))
          problem(["drop", index], `The withdrawn version has no input “${source}” to drop.`);
      });
      for (const source of old) {
        if (renamed.has(source) || dropped.has(source)) continue;
        if (!Object.hasOwn(to.inputs, source))
          problem(
            ["rename", source],
            `${successorName} has no input ${label(from, source)}: rename it to one of its inputs, or drop it.`,
          );
        else if (from.inputs[source].quantity !== to.inputs[source].quantity)
          problem(
            ["rename", source],
            `${label(from, source)} was a ${from.inputs[source].quantity} and is a ${to.inputs[source].quantity} in ${successorName}: rename or drop it.`,
          );
        else cover(source, `the old ${source}`, ["rename", source]);
      }
      for (const [target, value] of Object.entries(mapping.values)) {
        const path = ["values", target];
        if (!Object.hasOwn(to.inputs, target)) {
          problem(path, `${successorName} has no input “${target}” to give a value to.`);
          continue;
        }
        const definition = to.inputs[target];
        if (!isLibraryInput(definition)) {
          const read = readInput(target, definition, value);
          if (typeof read === "object" && read !== null && "message" in read) problem(path, read.message);
        } else if (typeof value !== "string") problem(path, `${label(to, target)} takes the name of a library entry.`);
        cover(target, "a value given", path);
      }
      for (const target of next)
        if (!covered.has(target))
          problem(["values", target], `${label(to, target)} is new in ${successorName}: give the value old runs take for it.`);
    });
}

/** The mapping, or a 422 with one message per problem, keyed `mapping.<rename|values|drop>.<input>`. */
export function checkMappingOrThrow(
  from: Definition,
  to: Definition,
  mapping: InputMapping,
  successorName: string,
): InputMapping {
  const parsed = mappingAgainst(from, to, successorName).safeParse(mapping);
  if (parsed.success) return { rename: parsed.data.rename, values: parsed.data.values, drop: parsed.data.drop };
  const fieldErrors: Record<string, string[]> = {};
  for (const issue of parsed.error.issues) (fieldErrors[["mapping", ...issue.path].join(".")] ??= []).push(issue.message);
  const count = parsed.error.issues.length;
  throw new AppError(
    "invalid-input",
    `The mapping onto ${successorName} has ${count === 1 ? "a problem" : `${count} problems`}: ${parsed.error.issues[0].message}`,
    { fieldErrors },
  );
}

/**
 * A run's inputs on the successor: what the person typed, the withdrawn version's defaults for the rest (so a
 * changed default in the successor does not change what the run meant), renamed, dropped and completed as declared.
 */
export function mapRunInputs(from: Definition, typed: RunInputs, mapping: InputMapping): Record<string, string | number> {
  const full: Record<string, string | number> = {};
  for (const [key, input] of Object.entries(from.inputs)) full[key] = Object.hasOwn(typed, key) ? typed[key] : input.default;
  const out: Record<string, string | number> = {};
  for (const [key, value] of Object.entries(full)) {
    if (mapping.drop.includes(key)) continue;
    out[Object.hasOwn(mapping.rename, key) ? mapping.rename[key] : key] = value;
  }
  return { ...out, ...mapping.values };
}
