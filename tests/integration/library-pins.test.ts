// A standard version's `latest` library references are pinned when it is published: its runs read the library version
// it was verified and approved against, not one published later; drafts still read the newest; a pinned library
// version withdrawn as a whole stops the standard version running, with what to do; the pins are append-only for the
// app's role. Real use cases, real database. The sections are invented and made in the builder; the verification case
// checks the deflection 5wL⁴/384EI (AWC Design Aid No. 6 (2005), Fig. 1).
import { describe, expect, it } from "vitest";
import { db, pool } from "@/db";
import * as schema from "@/db/schema";
import type { Actor } from "@/lib/domain/actor";
import { runUseCase } from "@/lib/use-cases/run";
import {
  approveAndPublishLibrary,
  saveLibraryDraft,
  startLibraryDraft,
  submitLibraryDraft,
  withdrawLibraryEntry,
  withdrawLibraryVersion,
} from "@/lib/use-cases/libraries";
import { readLibraryVersion } from "@/lib/use-cases/library-reads";
import { approveAndPublish, createStandard, readVersion, saveDraft, startDraft, submitDraft } from "@/lib/use-cases/standards";
import { createRun, readRun } from "@/lib/use-cases/runs";
import { readRunForm } from "@/lib/use-cases/run-form";
import { reproduceRun } from "@/lib/use-cases/reproduce";
import { libraryEntriesFor } from "@/lib/use-cases/library-resolution";
import { buildSectionOrThrow } from "@/lib/libraries";
import { readRunRecord } from "@/lib/standards/run-record";
import { createTestUser } from "./helpers/people";
import { I, beamSource, publishedSections } from "./helpers/library-standard";
import { jobFor, uniqueLabel } from "./helpers/withdrawal-fixtures";

async function publishStandard(source: string, author: Actor, reviewer: Actor) {
  const slug = uniqueLabel("pinned");
  const { draftId } = await runUseCase(createStandard, { actor: author, input: { slug, title: "Beam on a library section" } });
  const saved = await runUseCase(saveDraft, { actor: author, input: { draftId, source } });
  expect(saved.check.problems).toEqual([]);
  const { reviewId } = await runUseCase(submitDraft, { actor: author, input: { draftId, changelog: "First." } });
  return runUseCase(approveAndPublish, { actor: reviewer, input: { reviewId } });
}

/** Version 2 of the library: TB 300's flange made thicker (a corrected catalogue value), TB 400 as it was. */
async function publishSecondVersion(library: string, author: Actor, reviewer: Actor) {
  const v1 = await runUseCase(readLibraryVersion, { actor: author, input: { slug: library, number: 1 } });
  const { draftId } = await runUseCase(startLibraryDraft, { actor: author, input: { versionId: v1.id } });
  const thicker = { ...I("TB 300", 0.3, 0.15), dimensions: { d: 0.3, b: 0.15, tf: 0.014, tw: 0.008, r: 0.012 } };
  const document = { kind: "sections", title: "Beams", entries: [thicker, I("TB 400", 0.4, 0.18)] };
  await runUseCase(saveLibraryDraft, { actor: author, input: { draftId, document } });
  const { reviewId } = await runUseCase(submitLibraryDraft, { actor: author, input: { draftId, changelog: "TB 300's tf." } });
  await runUseCase(approveAndPublishLibrary, { actor: reviewer, input: { reviewId } });
  return runUseCase(readLibraryVersion, { actor: author, input: { slug: library, number: 2 } });
}

/** Two leads and an engineer; a sections library (v1) and a standard on it at `latest`, published after it. */
async function standardOnNewSections(label: string) {
  const [lead, second, engineer] = await Promise.all([
    createTestUser({ role: "lead", label: `${label}-a` }),
    createTestUser({ role: "lead", label: `${label}-b` }),
    createTestUser({ role: "engineer", label: `${label}-eng` }),
  ]);
  const library = await publishedSections(lead.actor, second.actor);
  const Ix = buildSectionOrThrow({ shape: "i", d: 0.4, b: 0.18, tf: 0.012, tw: 0.008, r: 0.012 }).properties.Ix;
  const source = beamSource(library, Ix);
  const published = await publishStandard(source, lead.actor, second.actor);
  const v1 = await runUseCase(readLibraryVersion, { actor: lead.actor, input: { slug: library, number: 1 } });
  return { lead: lead.actor, second: second.actor, engineer: engineer.actor, library, source, published, v1 };
}

const pinRows = async (versionId: string) =>
  (
    await pool.query<{ library_version_id: string }>(
      "select library_version_id from standard_version_library_pins where standard_version_id = $1",
      [versionId],
    )
  ).rows;

describe("library references pinned at publication", () => {
  it("runs a published version on the library version it was published with, while drafts take the newest", async () => {
    const { lead, second, engineer, library, source, published, v1 } = await standardOnNewSections("pins");
    expect(source).not.toContain("version:"); // the beam asks for `latest`
    expect(await pinRows(published.versionId)).toEqual([{ library_version_id: v1.id }]);
    const audit = await pool.query<{ details: { libraries: unknown } }>(
      "select details from audit_events where action = 'standards.publish' and subject = $1",
      [`standard-version:${published.versionId}`],
    );
    expect(audit.rows[0].details.libraries).toEqual([{ library, version: 1, contentHash: v1.contentHash }]);

    // A newer library version, with TB 300 changed.
    const v2 = await publishSecondVersion(library, lead, second);
    const hashOf = (version: typeof v1, key: string) => version.entryRows.find((row) => row.key === key)!.entryHash;
    expect(hashOf(v2, "TB 300")).not.toBe(hashOf(v1, "TB 300"));

    // The version's page says what it reads and that a newer library version exists.
    const view = await runUseCase(readVersion, { actor: engineer, input: { slug: published.slug, number: 1 } });
    expect(view.libraryPins).toEqual([
      { library, inputs: ["beam"], requested: "latest", version: 1, how: "pinned", status: "superseded", newer: 2 },
    ]);
    expect(view.libraries[library].version).toBe(1);

    // The run form offers version 1's sections; a run stores version 1's TB 300, its hash the old one.
    const job = await jobFor(engineer, lead);
    const form = await runUseCase(readRunForm, {
      actor: engineer,
      input: { jobNumber: job.jobNumber, slug: published.slug },
    });
    expect(form.fields.find((field) => field.key === "beam")).toMatchObject({ kind: "entry", libraryVersion: 1 });
    const run = await runUseCase(createRun, {
      actor: engineer,
      input: { jobId: job.jobId, versionId: published.versionId, inputs: { beam: "TB 300" }, unitSystem: "si" },
    });
    const record = readRunRecord((await runUseCase(readRun, { actor: engineer, input: { id: run.id } })).record);
    expect(record.libraries).toEqual([
      expect.objectContaining({ input: "beam", library, version: 1, key: "TB 300", entryHash: hashOf(v1, "TB 300") }),
    ]);
    // Reproduced, it reads the same version again.
    const again = await runUseCase(reproduceRun, { actor: lead, input: { id: run.id, mode: "current" } });
    expect(again.comparison.identical).toBe(true);

    // A draft of the same source, and the check before publication, read the newest version.
    expect((await libraryEntriesFor(source))[library].version).toBe(2);

    // A new version of the standard, published now, is pinned to version 2 and runs on it.
    const { draftId } = await runUseCase(startDraft, { actor: lead, input: { versionId: published.versionId } });
    const { reviewId } = await runUseCase(submitDraft, { actor: lead, input: { draftId, changelog: "On beams v2." } });
    const next = await runUseCase(approveAndPublish, { actor: second, input: { reviewId } });
    expect(await pinRows(next.versionId)).toEqual([{ library_version_id: v2.id }]);
    const onV2 = await runUseCase(createRun, {
      actor: engineer,
      input: { jobId: job.jobId, versionId: next.versionId, inputs: { beam: "TB 300" }, unitSystem: "si" },
    });
    const recordV2 = readRunRecord((await runUseCase(readRun, { actor: engineer, input: { id: onV2.id } })).record);
    expect(recordV2.libraries[0]).toMatchObject({ version: 2, entryHash: hashOf(v2, "TB 300") });
  });

  it("refuses a withdrawn entry by name, and a whole pinned library version withdrawn, saying what to do", async () => {
    const { lead, second, engineer, library, published, v1 } = await standardOnNewSections("pins-withdrawn");
    await publishSecondVersion(library, lead, second);
    const job = await jobFor(engineer, lead);
    const run = (beam: string) =>
      runUseCase(createRun, {
        actor: engineer,
        input: { jobId: job.jobId, versionId: published.versionId, inputs: { beam }, unitSystem: "si" },
      });

    await runUseCase(withdrawLibraryEntry, {
      actor: second,
      input: { versionId: v1.id, entryKey: "TB 400", reason: "Web thickness mistyped." },
    });
    await expect(run("TB 400")).rejects.toMatchObject({
      code: "invalid-input",
      fieldErrors: { "inputs.beam": [expect.stringContaining(`there is no section “TB 400” in version 1 of “${library}”`)] },
    });
    expect((await run("TB 300")).outcome).toBe("succeeded");

    await runUseCase(withdrawLibraryVersion, {
      actor: second,
      input: { versionId: v1.id, reason: "Every flange thickness was typed in inches." },
    });
    const refusal = `Version 1 of Beam on a library section reads version 1 of the library “${library}”, which it was pinned to when it was published, and that library version is withdrawn.`;
    await expect(run("TB 300")).rejects.toMatchObject({ code: "conflict", message: expect.stringContaining(refusal) });
    await expect(
      runUseCase(readRunForm, { actor: engineer, input: { jobNumber: job.jobNumber, slug: published.slug } }),
    ).rejects.toMatchObject({ code: "conflict", message: expect.stringContaining(refusal) });
    const view = await runUseCase(readVersion, { actor: engineer, input: { slug: published.slug, number: 1 } });
    expect(view.libraryPins[0]).toMatchObject({ version: 1, status: "withdrawn" });
    // Its page still draws it as published, on version 1, and says it cannot be run.
    expect(view.libraries[library].version).toBe(1);
  });

  it("read what `latest` meant at publication for a version published before pins were recorded", async () => {
    const { lead, second, library, source, published } = await standardOnNewSections("pins-before");
    // A version as one published before this release: the same source, no pins (the seed imports its versions so).
    const published1 = (await runUseCase(readVersion, { actor: lead, input: { slug: published.slug, number: 1 } })).publishedAt;
    const [standard] = await db
      .insert(schema.standards)
      .values({ slug: uniqueLabel("unpinned"), createdById: lead.id })
      .returning();
    const [version] = await db
      .insert(schema.standardVersions)
      .values({
        standardId: standard.id,
        number: 1,
        source,
        contentHash: published.hash,
        title: "Beam on a library section",
        category: "beams",
        summary: "A test beam.",
        changelog: "Published before pins.",
        authorId: lead.id,
        reviewerId: second.id,
        verifiedWith: "test",
        verification: [],
        publishedAt: new Date(published1),
      })
      .returning();
    await publishSecondVersion(library, lead, second);
    const view = await runUseCase(readVersion, { actor: lead, input: { slug: standard.slug, number: version.number } });
    expect(view.libraryPins).toEqual([
      { library, inputs: ["beam"], requested: "latest", version: 1, how: "as-of-publication", status: "superseded", newer: 2 },
    ]);
    expect(view.libraries[library].version).toBe(1);
  });

  it("are append-only for the app's role", async () => {
    const client = await pool.connect();
    try {
      for (const statement of [
        "update standard_version_library_pins set pinned_at = now()",
        "delete from standard_version_library_pins",
      ]) {
        await client.query("begin");
        await expect(client.query(statement)).rejects.toMatchObject({ code: "42501" });
        await client.query("rollback");
      }
    } finally {
      client.release();
    }
  });
});
