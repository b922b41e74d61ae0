/** Small standards written in tests, as source files, so each test states only what it is about. */
import { stringify } from "yaml";
import { compileStandard, type CompiledStandard } from "@/lib/standards";

/** A simply supported beam of span L under a uniform load w, with one extract and one check. */
export function beamDefinition(): Record<string, unknown> {
  return {
    title: "Test beam",
    category: "beams",
    summary: "A beam for tests.",
    scope: "Tests only.",
    inputs: {
      L: { label: "Span", quantity: "length", unit: "m", default: "6 m", min: "1 m", max: "30 m" },
      w: { label: "Load", quantity: "force-per-length", unit: "kN/m", default: "10 kN/m" },
      E: { label: "Young's modulus", quantity: "stress", unit: "GPa", default: "200 GPa" },
      I: { label: "Second moment", quantity: "second-moment-of-area", unit: "mm^4", default: "1e8 mm^4" },
    },
    derived: { M_cap: { expr: "300 kN m", quantity: "moment", unit: "kN m" } },
    model: {
      nodes: [
        { id: "A", x: "0 m", y: "0 m", support: "pinned" },
        { id: "B", x: "L", y: "0 m", support: "roller-x" },
      ],
      members: [{ id: "beam", start: "A", end: "B", E: "E", A: "5000 mm^2", I: "I", group: "beams" }],
      load_cases: [{ id: "W", loads: [{ member: "beam", direction: "global-y", w: "-w" }] }],
    },
    extracts: { M_max: { max_abs: "M", members: "beams", under: "W", unit: "kN m" } },
    checks: {
      bending: { label: "Bending", demand: "M_max", capacity: "M_cap", clause: "test", fails: "too big", unit: "kN m" },
    },
  };
}

export function sourceOf(definition: Record<string, unknown>, narrative = "# A test standard\n"): string {
  return `---\n${stringify(definition)}---\n${narrative}`;
}

export function compileOrThrow(source: string): CompiledStandard {
  const out = compileStandard(source);
  if (!out.ok) throw new Error(JSON.stringify(out.problems, null, 2));
  return out.standard;
}

export function problemsOf(source: string) {
  const out = compileStandard(source);
  if (out.ok) throw new Error("expected the standard to be refused");
  return out.problems;
}
