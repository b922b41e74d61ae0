// A standard whose input is a section of a firm library: its draft is checked, verified and shown against the
// library's published version, and a withdrawn entry is refused by name. Real use cases, real database.
import { describe, expect, it } from "vitest";
import { runUseCase } from "@/lib/use-cases/run";
import { withdrawLibraryEntry } from "@/lib/use-cases/libraries";
import { createStandard, previewDraft, saveDraft } from "@/lib/use-cases/standards";
import { libraryEntriesFor } from "@/lib/use-cases/library-resolution";
import { readLibraryVersion } from "@/lib/use-cases/library-reads";
import { buildSectionOrThrow } from "@/lib/libraries";
import { createTestUser } from "./helpers/people";
import { beamSource, publishedSections } from "./helpers/library-standard";

let counter = 0;
const unique = (label: string) => `${label}-${Date.now().toString(36)}-${(counter++).toString(36)}`;

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
