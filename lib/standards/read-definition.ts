/**
 * A standard's definition read from its source, remembered: a published version's source never changes, and
 * reading it (YAML, then the schema) is the costliest step of storing a run after the evaluation itself. The
 * most recently used 64 sources are kept, by their text. Callers must not change what they get.
 */
import { DefinitionSchema, type Definition } from "./definition";
import { parseSource } from "./source";

const LIMIT = 64;
const read = new Map<string, Definition | null>();

/** The definition of a source, or null when it does not read (a problem the source's own checks report). */
export function definitionOfSource(source: string): Definition | null {
  const hit = read.get(source);
  if (hit !== undefined) {
    read.delete(source);
    read.set(source, hit);
    return hit;
  }
  const parsed = parseSource(source);
  const checked = parsed.ok ? DefinitionSchema.safeParse(parsed.parsed.data) : null;
  const definition = checked?.success ? checked.data : null;
  read.set(source, definition);
  if (read.size > LIMIT) read.delete(read.keys().next().value!);
  return definition;
}
