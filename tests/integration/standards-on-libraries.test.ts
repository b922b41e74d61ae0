// A standard whose input is a section of a firm library: its draft is checked, verified and shown against the
// library's published version, and a withdrawn entry is refused by name. Real use cases, real database.
import { describe, expect, it } from "vitest";
import { stringify } from "yaml";
import type { Actor } from "@/lib/domain/actor";
import { runUseCase } from "@/lib/use-cases/run";
import {
  approveAndPublishLibrary,
  createLibrary,
  saveLibraryDraft,
  submitLibraryDraft,
  withdrawLibraryEntry,
} from "@/lib/use-cases/libraries";
import { createStandard, previewDraft, saveDraft } from "@/lib/use-cases/standards";
import { libraryEntriesFor } from "@/lib/use-cases/library-resolution";
import { readLibraryVersion } from "@/lib/use-cases/library-reads";
import { buildSectionOrThrow } from "@/lib/libraries";
import { createTestUser } from "./helpers/people";

let counter = 0;
const unique = (label: string) => `${label}-${Date.now().toString(36)}-${(counter++).toString(36)}`;

/** Invented sections: two I sections made in the builder (metres). */
const I = (key: string, d: number, b: number) => ({
  key,
  origin: { from: "builder" },
  shape: "i",
  dimensions: { d, b, tf: 0.012, tw: 0.008, r: 0.012 },
});

async function publishedSections(author: Actor, reviewer: Actor) {
  const slug = unique("beams");
  const { draftId } = await runUseCase(createLibrary, { actor: author, input: { slug, kind: "sections", title: "Beams" } });
  const document = { kind: "sections", title: "Beams", entries: [I("TB 300", 0.3, 0.15), I("TB 400", 0.4, 0.18)] };
  await runUseCase(saveLibraryDraft, { actor: author, input: { draftId, document } });
  const { reviewId } = await runUseCase(submitLibraryDraft, { actor: author, input: { draftId, changelog: "First." } });
  await runUseCase(approveAndPublishLibrary, { actor: reviewer, input: { reviewId } });
  return slug;
}

/** A simply supported beam whose I comes from the section input; a case checks the deflection 5wL⁴/384EI. */
function beamSource(library: string, Ix: number): string {
  const definition = {
    title: "Beam on a library section",
    category: "beams",
    summary: "A test beam.",
    scope: "Tests only.",
    inputs: {
      L: { label: "Span", quantity: "length", unit: "m", default: "6 m" },
      w: { label: "Load", quantity: "force-per-length", unit: "kN/m", default: "10 kN/m" },
      beam: { label: "Beam section", quantity: "section", library, shapes: ["i"], default: "TB 300" },
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
        name: "Deflection of the 400 deep section",
        inputs: { beam: "TB 400" },
        expect: { delta: { value: `5 * 10 kN/m * (6 m)^4 / (384 * 200 GPa * ${Ix} m^4)`, tolerance: 1e-6 } },
        source: "AWC Design Aid No. 6 (2005), Fig. 1: Δmax = 5wL⁴/384EI",
      },
    ],
  };
  return `---\n${stringify(definition)}---\n# Beam\n`;
}

describe("a standard on a firm library", () => {
  it("compiles and verifies against the library's latest version, and shows its default section's values", async () => {
    const [lead, second] = await Promise.all([
      createTestUser({ role: "lead", label: "on-libraries-a" }),
      createTestUser({ role: "lead", label: "on-libraries-b" }),
    ]);
    const library = await publishedSections(lead.actor, second.actor);
    const Ix = buildSectionOrThrow({ shape: "i", d: 0.4, b: 0.18, tf: 0.012, tw: 0.008, r: 0.012 }).properties.Ix;
    const source = beamSource(library, Ix);

    const entries = await libraryEntriesFor(source);
    expect(Object.keys(entries)).toEqual([library]);
    expect(entries[library].version).toBe(1);
    expect(Object.keys(entries[library].entries).sort()).toEqual(["tb 300", "tb 400"]);

    const { draftId } = await runUseCase(createStandard, {
      actor: lead.actor,
      input: { slug: unique("on-library"), title: "Beam on a library section" },
    });
    const saved = await runUseCase(saveDraft, { actor: lead.actor, input: { draftId, source } });
    expect(saved.check.problems).toEqual([]);
    expect(saved.check.verification.map((v) => [v.name, v.pass])).toEqual([["Deflection of the 400 deep section", true]]);

    const preview = await runUseCase(previewDraft, { actor: lead.actor, input: { draftId } });
    if (!preview.ok) throw new Error(preview.message);
    expect(preview.evaluation.inputs.beam.entry).toMatchObject({ library, version: 1, key: "TB 300" });
  });

  it("refuses an entry withdrawn from the library, naming the input and the entry", async () => {
    const [lead, second] = await Promise.all([
      createTestUser({ role: "lead", label: "on-libraries-c" }),
      createTestUser({ role: "lead", label: "on-libraries-d" }),
    ]);
    const library = await publishedSections(lead.actor, second.actor);
    const source = beamSource(library, 1e-4);
    const { draftId } = await runUseCase(createStandard, {
      actor: lead.actor,
      input: { slug: unique("on-library"), title: "Beam on a library section" },
    });
    const version = await runUseCase(readLibraryVersion, { actor: lead.actor, input: { slug: library, number: 1 } });
    await runUseCase(withdrawLibraryEntry, {
      actor: second.actor,
      input: { versionId: version.id, entryKey: "TB 300", reason: "Flange thickness mistyped." },
    });
    const saved = await runUseCase(saveDraft, { actor: lead.actor, input: { draftId, source } });
    expect(saved.check.problems.map((p) => p.message)).toContain(
      `Beam section: there is no section “TB 300” in version 1 of “${library}” (with the default inputs)`,
    );
  });
});
