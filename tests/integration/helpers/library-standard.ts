// A sections library and a standard whose beam takes its section from it, shared by the tests of standards on
// libraries and of withdrawing a library entry. The sections are invented and made in the builder (metres).
import { stringify } from "yaml";
import type { Actor } from "@/lib/domain/actor";
import { runUseCase } from "@/lib/use-cases/run";
import { approveAndPublishLibrary, createLibrary, saveLibraryDraft, submitLibraryDraft } from "@/lib/use-cases/libraries";

let counter = 0;
const unique = (label: string) => `${label}-${Date.now().toString(36)}-${(counter++).toString(36)}`;

/** An I section made in the builder (metres). */
export const I = (key: string, d: number, b: number) => ({
  key,
  origin: { from: "builder" },
  shape: "i",
  dimensions: { d, b, tf: 0.012, tw: 0.008, r: 0.012 },
});

/** Two I sections, TB 300 and TB 400, published by two leads; returns the library's slug. */
export async function publishedSections(author: Actor, reviewer: Actor): Promise<string> {
  const slug = unique("beams");
  const { draftId } = await runUseCase(createLibrary, { actor: author, input: { slug, kind: "sections", title: "Beams" } });
  const document = { kind: "sections", title: "Beams", entries: [I("TB 300", 0.3, 0.15), I("TB 400", 0.4, 0.18)] };
  await runUseCase(saveLibraryDraft, { actor: author, input: { draftId, document } });
  const { reviewId } = await runUseCase(submitLibraryDraft, { actor: author, input: { draftId, changelog: "First." } });
  await runUseCase(approveAndPublishLibrary, { actor: reviewer, input: { reviewId } });
  return slug;
}

/**
 * A simply supported beam whose I comes from the section input (`sections.default` by default, TB 300); a case checks
 * the deflection 5wL⁴/384EI with `sections.checked` (TB 400), whose Ix is `Ix` (m⁴).
 */
export function beamSource(
  library: string,
  Ix: number,
  sections: { default: string; checked: string; title?: string } = { default: "TB 300", checked: "TB 400" },
): string {
  const definition = {
    title: sections.title ?? "Beam on a library section",
    category: "beams",
    summary: "A test beam.",
    scope: "Tests only.",
    inputs: {
      L: { label: "Span", quantity: "length", unit: "m", default: "6 m" },
      w: { label: "Load", quantity: "force-per-length", unit: "kN/m", default: "10 kN/m" },
      beam: { label: "Beam section", quantity: "section", library, shapes: ["i"], default: sections.default },
    },
    model: {
      nodes: [
        { id: "A", x: "0 m", y: "0 m", support: "pinned" },
        { id: "B", x: "L", y: "0 m", support: "roller-x" },
      ],
      members: [{ id: "m", start: "A", end: "B", E: "200 GPa", A: "beam_A", I: "beam_Ix", group: "beams" }],
      load_cases: [{ id: "W", loads: [{ member: "m", direction: "global-y", w: "-w" }] }],
    },
    extracts: { delta: { max_abs: "relative_deflection", members: "beams", under: "W", unit: "mm" } },
    verification: [
      {
        name: sections.checked === "TB 400" ? "Deflection of the 400 deep section" : `Deflection of ${sections.checked}`,
        inputs: { beam: sections.checked },
        expect: { delta: { value: `5 * 10 kN/m * (6 m)^4 / (384 * 200 GPa * ${Ix} m^4)`, tolerance: 1e-6 } },
        source: "AWC Design Aid No. 6 (2005), Fig. 1: Δmax = 5wL⁴/384EI",
      },
    ],
  };
  return `---\n${stringify(definition)}---\n# Beam\n`;
}
