/**
 * Numbers that look like the wrong units. The engine reads SI (N, m, Pa); a model typed from a drawing in mm
 * and MPa still analyses, with results wrong by factors of a thousand or a million. Steel's E is about 2e11 Pa
 * and timber's about 1e10 Pa, so an E below 1e6 is almost surely MPa (N/mm²); a member longer than 1000 is
 * almost surely mm. Read from the raw input, so the hints come whether or not the model is valid.
 */

/** E below this (Pa) looks like MPa. The softest structural materials are near 1e8 Pa. */
const E_LOOKS_LIKE_MPA = 1e6;
/** A member longer than this (m) looks like mm. */
const LENGTH_LOOKS_LIKE_MM = 1e3;
const LISTED = 3;

type Json = Record<string, unknown>;

function records(value: unknown): Json[] {
  return Array.isArray(value) ? value.filter((v): v is Json => v !== null && typeof v === "object" && !Array.isArray(v)) : [];
}

function finite(v: unknown): v is number {
  return typeof v === "number" && Number.isFinite(v);
}

/** "AB, BC and 4 more" */
function listIds(ids: ReadonlyArray<string>): string {
  const shown = ids.slice(0, LISTED).join(", ");
  return ids.length > LISTED ? `${shown} and ${ids.length - LISTED} more` : shown;
}

export function unitHints(input: unknown): string[] {
  if (input === null || typeof input !== "object") return [];
  const model = input as Json;
  const members = records(model.members);
  const hints: string[] = [];

  const byE = new Map<number, string[]>();
  for (const m of members) {
    if (finite(m.E) && m.E > 0 && m.E < E_LOOKS_LIKE_MPA) byE.set(m.E, [...(byE.get(m.E) ?? []), String(m.id)]);
  }
  for (const [E, ids] of byE) {
    const word = ids.length > 1 ? "members" : "member";
    const pascals = (E * 1e6).toExponential().replace("e+", "e");
    hints.push(
      `E = ${E} (${word} ${listIds(ids)}) looks like MPa (N/mm²); the engine expects Pa (N/m²), so multiply by 1e6 (${E} MPa = ${pascals} Pa)`,
    );
  }

  const at = new Map<string, { x: number; y: number }>();
  for (const n of records(model.nodes)) if (finite(n.x) && finite(n.y)) at.set(String(n.id), { x: n.x, y: n.y });
  const long: { id: string; length: number }[] = [];
  for (const m of members) {
    const a = at.get(String(m.start));
    const b = at.get(String(m.end));
    if (!a || !b) continue;
    const length = Math.hypot(b.x - a.x, b.y - a.y);
    if (length > LENGTH_LOOKS_LIKE_MM) long.push({ id: String(m.id), length });
  }
  if (long.length > 0) {
    long.sort((p, q) => q.length - p.length);
    const ids = listIds(long.map((l) => l.id));
    const longest = Number(long[0].length.toPrecision(6));
    const subject = long.length > 1 ? `Members ${ids} are up to ${longest} long` : `Member ${ids} is ${longest} long`;
    hints.push(`${subject}: that looks like mm; the engine expects m, so divide the coordinates by 1000`);
  }
  return hints;
}
