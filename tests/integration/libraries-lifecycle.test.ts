// The libraries' lifecycle through the real use cases and data layer: draft → in review → published →
// superseded or withdrawn (a whole version, or one entry of it), the four-eyes rule between any two admins or
// leads, the content and entry hashes, references resolved pinned and "latest", and what each role may do.
// Every refusal is shown to change no row (tests/support/snapshot.ts).
import { describe, expect, it } from "vitest";
import { pool } from "@/db";
import type { Actor } from "@/lib/domain/actor";
import type { Role } from "@/lib/domain/roles";
import { checkLibraryDocument, libraryContentHash, libraryEntryHash, type LibraryDocument } from "@/lib/libraries/document";
import { listWithdrawnLibraryEntries } from "@/lib/data/libraries";
import { runUseCase } from "@/lib/use-cases/run";
import {
  approveAndPublishLibrary,
  createLibrary,
  discardLibraryDraft,
  returnLibraryDraft,
  saveLibraryDraft,
  startLibraryDraft,
  submitLibraryDraft,
  withdrawLibraryEntry,
  withdrawLibraryVersion,
} from "@/lib/use-cases/libraries";
import {
  listLibraries,
  readLibrary,
  readLibraryDraft,
  readLibraryVersion,
  resolveLibraryReference,
} from "@/lib/use-cases/library-reads";
import { expectNoChangeFrom, refusalAudited } from "../support/snapshot";
import { auditEventsFor, createTestUser } from "./helpers/people";

let counter = 0;
const uniqueSlug = (label: string) => `${label}-${Date.now().toString(36)}-${(counter++).toString(36)}`;

/** A tube made in the builder (metres); D and t invented. */
const tube = (key: string, D = 0.1683, t = 0.006) => ({
  key,
  origin: { from: "builder" },
  shape: "circular-hollow",
  dimensions: { D, t },
});
const sections = (title: string, entries: unknown[]) => ({ kind: "sections", title, entries });

async function editors(roles: [Role, Role] = ["lead", "lead"]): Promise<[Actor, Actor]> {
  const [a, b] = await Promise.all([
    createTestUser({ role: roles[0], label: `${roles[0]}-a` }),
    createTestUser({ role: roles[1], label: `${roles[1]}-b` }),
  ]);
  return [a.actor, b.actor];
}

/** A new sections library, its first draft saved, submitted by `author` and published by `reviewer`. */
async function publishedLibrary(author: Actor, reviewer: Actor, entries = [tube("GT 168x6"), tube("GT 114x5", 0.1143, 0.005)]) {
  const slug = uniqueSlug("tubes");
  const { draftId } = await runUseCase(createLibrary, { actor: author, input: { slug, kind: "sections", title: "Tubes" } });
  const document = sections("Tubes", entries);
  await runUseCase(saveLibraryDraft, { actor: author, input: { draftId, document } });
  const { reviewId } = await runUseCase(submitLibraryDraft, { actor: author, input: { draftId, changelog: "First version." } });
  const published = await runUseCase(approveAndPublishLibrary, { actor: reviewer, input: { reviewId } });
  return { draftId, reviewId, document, ...published };
}

describe("a library from first draft to withdrawal", () => {
  it("is saved with problems, returned with comments on an entry, approved by a second person and published as version 1", async () => {
    const [alice, bruno] = await editors(["lead", "admin"]);
    const slug = uniqueSlug("firm-tubes");
    const created = await runUseCase(createLibrary, { actor: alice, input: { slug, kind: "sections", title: "Firm tubes" } });
    const first = await runUseCase(readLibraryDraft, { actor: alice, input: { draftId: created.draftId } });
    expect(first.draft).toMatchObject({
      state: "editing",
      kind: "sections",
      document: { kind: "sections", title: "Firm tubes", entries: [] },
    });
    const { draftId } = created;

    // A document with problems is saved as written (nothing is lost), its problems listed with their entry.
    const broken = sections("Firm tubes", [tube("GT 168x6"), tube("GT 60x9", 0.06, 0.04)]);
    const saved = await runUseCase(saveLibraryDraft, { actor: alice, input: { draftId, document: broken } });
    expect(saved.hash).toBeNull();
    expect(saved.problems.length).toBeGreaterThan(0);
    expect(saved.problems[0]).toMatchObject({ entry: "GT 60x9", path: expect.stringMatching(/^entries\.1\.dimensions/) });
    expect((await runUseCase(readLibraryDraft, { actor: alice, input: { draftId } })).draft.document).toEqual(broken);
    await expectNoChangeFrom(() =>
      expect(runUseCase(submitLibraryDraft, { actor: alice, input: { draftId, changelog: "First." } })).rejects.toMatchObject({
        code: "invalid-input",
        message: expect.stringMatching(/^The document has \d+ problems? to fix first, e\.g\. GT 60x9: /),
      }),
    );
    // A document of another kind is a problem too, said in words.
    const wrongKind = await runUseCase(saveLibraryDraft, {
      actor: alice,
      input: { draftId, document: { kind: "materials", title: "Firm tubes", entries: [] } },
    });
    expect(wrongKind.problems).toEqual([
      { path: "kind", entry: null, message: "This library holds sections; the document is of materials." },
    ]);
    // An empty library is not submitted.
    await runUseCase(saveLibraryDraft, { actor: alice, input: { draftId, document: sections("Firm tubes", []) } });
    await expectNoChangeFrom(() =>
      expect(runUseCase(submitLibraryDraft, { actor: alice, input: { draftId, changelog: "First." } })).rejects.toMatchObject({
        code: "invalid-input",
        message: "Add at least one entry before submitting the library.",
      }),
    );

    const good = sections("Firm tubes", [tube("GT 168x6"), tube("GT 114x5", 0.1143, 0.005)]);
    await runUseCase(saveLibraryDraft, { actor: alice, input: { draftId, document: good } });
    const submitted = await runUseCase(submitLibraryDraft, { actor: alice, input: { draftId, changelog: "First version." } });
    expect(submitted).toMatchObject({ round: 1, entries: 2 });

    // Four eyes: the author neither approves nor returns their own submission, and cannot edit it in review.
    for (const [useCase, input] of [
      [approveAndPublishLibrary, { reviewId: submitted.reviewId }],
      [returnLibraryDraft, { reviewId: submitted.reviewId, note: "Fine by me." }],
    ] as const) {
      await expectNoChangeFrom(() =>
        expect(runUseCase(useCase as never, { actor: alice, input })).rejects.toMatchObject({
          code: "forbidden",
          message: expect.stringMatching(/nobody approves or returns their own/),
        }),
      );
    }
    await expectNoChangeFrom(() =>
      expect(runUseCase(saveLibraryDraft, { actor: alice, input: { draftId, document: good } })).rejects.toMatchObject({
        code: "conflict",
        message: expect.stringMatching(/in review/),
      }),
    );

    // A comment must name an entry of what was submitted.
    await expectNoChangeFrom(() =>
      expect(
        runUseCase(returnLibraryDraft, {
          actor: bruno,
          input: { reviewId: submitted.reviewId, comments: [{ entryKey: "GT 999", body: "Which one?" }] },
        }),
      ).rejects.toMatchObject({ code: "invalid-input", message: expect.stringMatching(/has no entry “GT 999”/) }),
    );
    // The second person (an admin) returns it, with a comment on an entry (named case and spacing aside).
    const returned = await runUseCase(returnLibraryDraft, {
      actor: bruno,
      input: {
        reviewId: submitted.reviewId,
        note: "Say where the tubes come from.",
        comments: [{ entryKey: "gt  114X5", body: "Wall thickness to be confirmed." }],
      },
    });
    expect(returned).toMatchObject({ round: 1, comments: 1, authorName: alice.name });
    const view = await runUseCase(readLibraryDraft, { actor: alice, input: { draftId } });
    expect(view.draft.state).toBe("editing");
    expect(view.reviews).toHaveLength(1);
    expect(view.reviews[0]).toMatchObject({
      outcome: "returned",
      reviewerName: bruno.name,
      note: "Say where the tubes come from.",
      comments: [{ entryKey: "GT 114x5", body: "Wall thickness to be confirmed.", authorName: bruno.name }],
    });
    await expectNoChangeFrom(() =>
      expect(
        runUseCase(approveAndPublishLibrary, { actor: bruno, input: { reviewId: submitted.reviewId } }),
      ).rejects.toMatchObject({
        code: "conflict",
        message: "This submission was already returned.",
      }),
    );

    const final = { ...good, description: "Tubes the firm stocks (invented)." };
    await runUseCase(saveLibraryDraft, { actor: alice, input: { draftId, document: final } });
    const second = await runUseCase(submitLibraryDraft, { actor: alice, input: { draftId, changelog: "First version." } });
    expect(second.round).toBe(2);
    const published = await runUseCase(approveAndPublishLibrary, {
      actor: bruno,
      input: { reviewId: second.reviewId, note: "Checked." },
    });

    // The content hash is the document check's, and each entry row carries its entry's hash.
    const checked = checkLibraryDocument(final);
    if (!checked.ok) throw new Error("the final document should pass");
    expect(published).toMatchObject({
      number: 1,
      title: "Firm tubes",
      entries: 2,
      authorName: alice.name,
      supersedes: [],
      hash: await libraryContentHash(checked.document),
    });
    const version = await runUseCase(readLibraryVersion, { actor: bruno, input: { slug, number: 1 } });
    expect(version).toMatchObject({
      number: 1,
      kind: "sections",
      status: "published",
      contentHash: published.hash,
      authorName: alice.name,
      reviewerName: bruno.name,
      changelog: "First version.",
      withdrawnEntries: [],
    });
    expect(version.document).toEqual(checked.document);
    expect(await libraryContentHash(version.document as LibraryDocument)).toBe(published.hash);
    expect(version.entryRows.map((row) => [row.position, row.key, row.normalisedKey, row.entryHash])).toEqual([
      [0, "GT 168x6", "gt 168x6", await libraryEntryHash(checked.document.entries[0])],
      [1, "GT 114x5", "gt 114x5", await libraryEntryHash(checked.document.entries[1])],
    ]);
    expect(version.events.map((event) => event.kind)).toEqual(["published"]);
    expect((await runUseCase(readLibraryDraft, { actor: alice, input: { draftId } })).draft).toMatchObject({
      state: "published",
      publishedVersionId: version.id,
    });

    // Every step is in the audit trail.
    const actions = async (action: string) =>
      (await auditEventsFor({ action })).filter((e) => (e.details as { slug?: string }).slug === slug);
    expect((await actions("libraries.create")).map((e) => e.actorId)).toEqual([alice.id]);
    expect((await actions("libraries.draft.save")).map((e) => (e.details as { problems: number }).problems > 0)).toEqual([
      true,
      true,
      false,
      false,
      false,
    ]);
    expect((await actions("libraries.draft.submit")).map((e) => (e.details as { round: number }).round)).toEqual([1, 2]);
    expect((await actions("libraries.draft.return")).map((e) => e.actorId)).toEqual([bruno.id]);
    expect((await actions("libraries.publish")).map((e) => [e.actorId, (e.details as { number: number }).number])).toEqual([
      [bruno.id, 1],
    ]);
  });

  it("publishes a second version that supersedes the first; refuses one that changes nothing", async () => {
    const [alice, bruno] = await editors();
    const v1 = await publishedLibrary(alice, bruno);
    const { draftId } = await runUseCase(startLibraryDraft, { actor: bruno, input: { versionId: v1.versionId } });
    // The draft holds what a person writes (the builder's properties are computed again), hashing as version 1.
    const started = await runUseCase(readLibraryDraft, { actor: bruno, input: { draftId } });
    expect(started).toMatchObject({ draft: { basedOnNumber: 1 }, problems: [], hash: v1.hash });
    expect(started.basedOn).toMatchObject({ number: 1, contentHash: v1.hash });
    await expectNoChangeFrom(() =>
      expect(runUseCase(submitLibraryDraft, { actor: bruno, input: { draftId, changelog: "Nothing." } })).rejects.toMatchObject({
        code: "invalid-input",
        message: "The draft is the same as version 1; change something before submitting it.",
      }),
    );
    const entries = [...(v1.document.entries as unknown[]), tube("GT 273x8", 0.273, 0.008)];
    await runUseCase(saveLibraryDraft, { actor: bruno, input: { draftId, document: sections("Tubes", entries) } });
    const { reviewId } = await runUseCase(submitLibraryDraft, { actor: bruno, input: { draftId, changelog: "GT 273x8 added." } });
    const v2 = await runUseCase(approveAndPublishLibrary, { actor: alice, input: { reviewId } });
    expect(v2).toMatchObject({ number: 2, supersedes: [1], entries: 3 });

    const library = await runUseCase(readLibrary, { actor: alice, input: { slug: v1.slug } });
    expect(library.versions.map((v) => [v.number, v.status, v.entries, v.authorName, v.reviewerName])).toEqual([
      [2, "published", 3, bruno.name, alice.name],
      [1, "superseded", 2, alice.name, bruno.name],
    ]);
    const listed = await runUseCase(listLibraries, { actor: alice, input: { kind: "sections" } });
    expect(listed.libraries.find((l) => l.slug === v1.slug)).toMatchObject({
      kind: "sections",
      current: { number: 2 },
      versions: 2,
    });
    expect(
      (await runUseCase(listLibraries, { actor: alice, input: { kind: "materials" } })).libraries.some((l) => l.slug === v1.slug),
    ).toBe(false);

    // A discarded draft stays discarded.
    const other = await runUseCase(startLibraryDraft, { actor: alice, input: { versionId: v2.versionId } });
    await runUseCase(discardLibraryDraft, { actor: alice, input: { draftId: other.draftId } });
    await expectNoChangeFrom(() =>
      expect(
        runUseCase(saveLibraryDraft, { actor: alice, input: { draftId: other.draftId, document: sections("Tubes", []) } }),
      ).rejects.toMatchObject({ code: "conflict", message: "This draft is discarded and can no longer be edited." }),
    );
  });

  it("withdraws one entry with a reason, and resolves references pinned and latest, refusing what is withdrawn", async () => {
    const [alice, bruno] = await editors(["admin", "lead"]);
    const { actor: engineer } = await createTestUser({ role: "engineer", label: "resolver" });
    const v1 = await publishedLibrary(alice, bruno);
    const resolve = (version: number | "latest", entry: string) =>
      runUseCase(resolveLibraryReference, { actor: engineer, input: { library: v1.slug, version, entry } });

    const pinned = await resolve(1, "gt 168X6");
    const version = await runUseCase(readLibraryVersion, { actor: engineer, input: { slug: v1.slug, number: 1 } });
    expect(pinned).toMatchObject({
      library: v1.slug,
      kind: "sections",
      versionId: v1.versionId,
      versionNumber: 1,
      contentHash: v1.hash,
      entryId: version.entryRows[0].id,
      entryKey: "GT 168x6",
      entryHash: version.entryRows[0].entryHash,
      entry: { key: "GT 168x6", shape: "circular-hollow" },
    });
    expect(await libraryEntryHash(pinned.entry)).toBe(pinned.entryHash);
    expect(await resolve("latest", "GT 168x6")).toEqual(pinned);
    await expect(resolve(1, "GT 999")).rejects.toMatchObject({
      code: "not-found",
      message: `Version 1 of ${v1.slug} has no entry “GT 999”.`,
    });
    await expect(resolve(7, "GT 168x6")).rejects.toMatchObject({
      code: "not-found",
      message: `The library “${v1.slug}” has no version 7.`,
    });

    // Withdrawing needs a reason, names an entry the version has, and happens once.
    await expectNoChangeFrom(() =>
      expect(
        runUseCase(withdrawLibraryEntry, { actor: alice, input: { versionId: v1.versionId, entryKey: "GT 114x5", reason: " " } }),
      ).rejects.toMatchObject({ code: "invalid-input" }),
    );
    await expectNoChangeFrom(() =>
      expect(
        runUseCase(withdrawLibraryEntry, {
          actor: alice,
          input: { versionId: v1.versionId, entryKey: "GT 1", reason: "Wrong." },
        }),
      ).rejects.toMatchObject({ code: "not-found", message: `Version 1 of ${v1.slug} has no entry “GT 1”.` }),
    );
    const withdrawn = await runUseCase(withdrawLibraryEntry, {
      actor: alice,
      input: { versionId: v1.versionId, entryKey: "gt 114x5", reason: "Wall thickness is 5.6 mm, not 5 mm." },
    });
    expect(withdrawn).toMatchObject({
      entryKey: "GT 114x5",
      entryId: version.entryRows[1].id,
      entryHash: version.entryRows[1].entryHash,
    });
    await expectNoChangeFrom(() =>
      expect(
        runUseCase(withdrawLibraryEntry, {
          actor: bruno,
          input: { versionId: v1.versionId, entryKey: "GT 114x5", reason: "Again." },
        }),
      ).rejects.toMatchObject({ code: "conflict", message: `GT 114x5 in version 1 of ${v1.slug} is already withdrawn.` }),
    );

    // The version stays published; the entry is listed as withdrawn, and refused when referenced.
    const after = await runUseCase(readLibraryVersion, { actor: engineer, input: { slug: v1.slug, number: 1 } });
    expect(after.status).toBe("published");
    expect(after.withdrawnEntries.map((e) => [e.key, e.withdrawn?.reason, e.withdrawn?.actorName])).toEqual([
      ["GT 114x5", "Wall thickness is 5.6 mm, not 5 mm.", alice.name],
    ]);
    expect(after.events.map((e) => [e.kind, e.entryKey])).toEqual([
      ["published", null],
      ["withdrawn", "gt 114x5"],
    ]);
    for (const wanted of [1, "latest"] as const)
      await expect(resolve(wanted, "GT 114x5")).rejects.toMatchObject({
        code: "conflict",
        message: `GT 114x5 in version 1 of ${v1.slug} was withdrawn (Wall thickness is 5.6 mm, not 5 mm.); choose another entry or a version that corrects it.`,
      });
    expect(await resolve(1, "GT 168x6")).toEqual(pinned);
    // What the impact report will join runs on: the entry's row id, its hash, and why.
    expect(await listWithdrawnLibraryEntries(v1.versionId)).toEqual([
      expect.objectContaining({ entryId: withdrawn.entryId, key: "GT 114x5", whole: false, entryHash: withdrawn.entryHash }),
    ]);

    // A second version corrects it; "latest" moves on, the pinned reference still answers for the good entry.
    const { draftId } = await runUseCase(startLibraryDraft, { actor: bruno, input: { versionId: v1.versionId } });
    const fixed = sections("Tubes", [tube("GT 168x6"), tube("GT 114x5", 0.1143, 0.0056)]);
    await runUseCase(saveLibraryDraft, { actor: bruno, input: { draftId, document: fixed } });
    const { reviewId } = await runUseCase(submitLibraryDraft, {
      actor: bruno,
      input: { draftId, changelog: "GT 114x5 wall 5.6 mm." },
    });
    const v2 = await runUseCase(approveAndPublishLibrary, { actor: alice, input: { reviewId } });
    expect(await resolve("latest", "GT 114x5")).toMatchObject({ versionNumber: 2, versionId: v2.versionId });

    // Withdrawing the whole of version 2: "latest" falls back to version 1, whose withdrawn entry is still refused.
    await runUseCase(withdrawLibraryVersion, {
      actor: bruno,
      input: { versionId: v2.versionId, reason: "Wrong catalogue file." },
    });
    await expect(resolve(2, "GT 168x6")).rejects.toMatchObject({
      code: "conflict",
      message: `Version 2 of ${v1.slug} was withdrawn (Wrong catalogue file.); use a later version.`,
    });
    expect(await resolve("latest", "GT 168x6")).toEqual(pinned);
    await expectNoChangeFrom(() =>
      expect(
        runUseCase(withdrawLibraryEntry, { actor: alice, input: { versionId: v2.versionId, entryKey: "GT 168x6", reason: "x" } }),
      ).rejects.toMatchObject({
        code: "conflict",
        message: `Version 2 of ${v1.slug} is already withdrawn, with every entry in it.`,
      }),
    );
    expect((await listWithdrawnLibraryEntries(v2.versionId)).map((e) => [e.key, e.whole])).toEqual(
      expect.arrayContaining([
        ["GT 168x6", true],
        ["GT 114x5", true],
      ]),
    );
    const entryWithdrawals = (await auditEventsFor({ action: "libraries.entry.withdraw" })).filter(
      (e) => (e.details as { slug?: string }).slug === v1.slug,
    );
    expect(entryWithdrawals.map((e) => e.details)).toEqual([
      {
        slug: v1.slug,
        number: 1,
        entryKey: "GT 114x5",
        entryHash: withdrawn.entryHash,
        reason: "Wall thickness is 5.6 mm, not 5 mm.",
        // No run used the entry, so nobody was told; no replacement entry was named.
        notified: 0,
        replacement: null,
      },
    ]);
  });
});

describe("publishing and the seeded libraries", () => {
  it("gives two publications of one library at the same moment consecutive numbers, never the same one", async () => {
    const [alice, bruno] = await editors(["lead", "admin"]);
    const v1 = await publishedLibrary(alice, bruno);
    const submissions = [];
    for (const [author, t] of [
      [alice, 0.007],
      [bruno, 0.008],
    ] as const) {
      const { draftId } = await runUseCase(startLibraryDraft, { actor: author, input: { versionId: v1.versionId } });
      await runUseCase(saveLibraryDraft, {
        actor: author,
        input: { draftId, document: sections("Tubes", [tube("GT 168x6", 0.1683, t)]) },
      });
      submissions.push({
        author,
        ...(await runUseCase(submitLibraryDraft, { actor: author, input: { draftId, changelog: `t = ${t} m.` } })),
      });
    }
    const results = await Promise.all(
      submissions.map(({ author, reviewId }) =>
        runUseCase(approveAndPublishLibrary, { actor: author.id === alice.id ? bruno : alice, input: { reviewId } }),
      ),
    );
    expect(results.map((r) => r.number).sort()).toEqual([2, 3]);
    const versions = (await runUseCase(readLibrary, { actor: alice, input: { slug: v1.slug } })).versions;
    expect(versions.map((v) => [v.number, v.status])).toEqual([
      [3, "published"],
      [2, "superseded"],
      [1, "superseded"],
    ]);
  });

  it("resolves entries of the seeded libraries for an engineer: a catalogue section with its listed values, a material", async () => {
    const { actor: engineer } = await createTestUser({ role: "engineer", label: "seeded-reader" });
    const section = await runUseCase(resolveLibraryReference, {
      actor: engineer,
      input: { library: "firm-sections", version: "latest", entry: "GI 200x100x8" },
    });
    expect(section).toMatchObject({
      kind: "sections",
      versionNumber: 1,
      entryKey: "GI 200x100x8",
      entry: { shape: "i", origin: { from: "catalogue", file: "demo-catalogue.csv" } },
    });
    if (!("properties" in section.entry) || !("listed" in section.entry)) throw new Error("not a section entry");
    // The catalogue's listed value is the one a run uses, where it gives one.
    expect(section.entry.properties.A).toBe(section.entry.listed.A);
    expect(await libraryEntryHash(section.entry)).toBe(section.entryHash);
    const material = await runUseCase(resolveLibraryReference, {
      actor: engineer,
      input: { library: "materials", version: 1, entry: "astm a992" },
    });
    expect(material).toMatchObject({ kind: "materials", entryKey: "ASTM A992", entry: { family: "steel" } });
  });
});

describe("who may do what", () => {
  // From the issue, written out here rather than read from the permission table: everyone reads the libraries;
  // admins and leads write, review, publish and withdraw them.
  const WRITES: Record<Role, boolean> = { lead: true, admin: true, engineer: false, auditor: false };

  it.each(["engineer", "auditor"] as const)(
    "a %s cannot create, start, save, submit, review, publish or withdraw",
    async (role) => {
      expect(WRITES[role]).toBe(false);
      const [alice, bruno] = await editors();
      const published = await publishedLibrary(alice, bruno);
      const { draftId } = await runUseCase(startLibraryDraft, { actor: alice, input: { versionId: published.versionId } });
      await runUseCase(saveLibraryDraft, {
        actor: alice,
        input: { draftId, document: sections("Tubes", [tube("GT 168x6", 0.1683, 0.007)]) },
      });
      const { reviewId } = await runUseCase(submitLibraryDraft, { actor: alice, input: { draftId, changelog: "Thicker." } });
      const { actor } = await createTestUser({ role });
      const attempts = [
        [createLibrary, { slug: uniqueSlug("nope"), kind: "sections", title: "Not mine" }],
        [startLibraryDraft, { versionId: published.versionId }],
        [saveLibraryDraft, { draftId, document: {} }],
        [submitLibraryDraft, { draftId, changelog: "x" }],
        [discardLibraryDraft, { draftId }],
        [returnLibraryDraft, { reviewId, note: "x" }],
        [approveAndPublishLibrary, { reviewId }],
        [withdrawLibraryVersion, { versionId: published.versionId, reason: "x" }],
        [withdrawLibraryEntry, { versionId: published.versionId, entryKey: "GT 168x6", reason: "x" }],
        [readLibraryDraft, { draftId }],
      ] as const;
      for (const [useCase, input] of attempts) {
        await expectNoChangeFrom(
          () => expect(runUseCase(useCase as never, { actor, input })).rejects.toMatchObject({ code: "forbidden" }),
          { except: [refusalAudited(actor.id, useCase.name)] },
        );
      }
      // They read what is published, and see no drafts.
      expect((await runUseCase(readLibraryVersion, { actor, input: { slug: published.slug, number: 1 } })).number).toBe(1);
      const listed = await runUseCase(listLibraries, { actor, input: {} });
      expect(listed.libraries.some((l) => l.slug === published.slug)).toBe(true);
      expect(listed.drafts).toEqual([]);
      expect((await runUseCase(readLibrary, { actor, input: { slug: published.slug } })).drafts).toEqual([]);
    },
  );

  it("an admin creates, reviews and publishes libraries with a lead, and reads them", async () => {
    expect(WRITES.admin).toBe(true);
    const [admin, lead] = await editors(["admin", "lead"]);
    const byAdmin = await publishedLibrary(admin, lead);
    const byLead = await publishedLibrary(lead, admin);
    expect([byAdmin.number, byLead.number]).toEqual([1, 1]);
    const listed = await runUseCase(listLibraries, { actor: admin, input: {} });
    expect(listed.libraries.map((l) => l.slug)).toEqual(expect.arrayContaining([byAdmin.slug, byLead.slug]));
    // A library with only a draft is the editors' to see.
    const slug = uniqueSlug("draft-only");
    await runUseCase(createLibrary, { actor: admin, input: { slug, kind: "materials", title: "Draft only" } });
    expect((await runUseCase(listLibraries, { actor: lead, input: {} })).libraries.some((l) => l.slug === slug)).toBe(true);
    const { actor: engineer } = await createTestUser({ role: "engineer" });
    expect((await runUseCase(listLibraries, { actor: engineer, input: {} })).libraries.some((l) => l.slug === slug)).toBe(false);
    await expect(runUseCase(readLibrary, { actor: engineer, input: { slug } })).rejects.toMatchObject({ code: "not-found" });
  });

  it("an editor cannot save, submit or discard another's draft", async () => {
    const [alice, bruno] = await editors(["lead", "admin"]);
    const { draftId } = await runUseCase(createLibrary, {
      actor: alice,
      input: { slug: uniqueSlug("mine"), kind: "sections", title: "Mine" },
    });
    for (const [useCase, input] of [
      [saveLibraryDraft, { draftId, document: sections("Mine", []) }],
      [submitLibraryDraft, { draftId, changelog: "x" }],
      [discardLibraryDraft, { draftId }],
    ] as const) {
      await expectNoChangeFrom(() =>
        expect(runUseCase(useCase as never, { actor: bruno, input })).rejects.toMatchObject({
          code: expect.stringMatching(/forbidden|invalid-input/),
        }),
      );
    }
  });

  it("refuses a short name that is taken", async () => {
    const [alice] = await editors();
    const slug = uniqueSlug("taken");
    await runUseCase(createLibrary, { actor: alice, input: { slug, kind: "sections", title: "First" } });
    await expectNoChangeFrom(() =>
      expect(
        runUseCase(createLibrary, { actor: alice, input: { slug, kind: "materials", title: "Second" } }),
      ).rejects.toMatchObject({
        code: "conflict",
        fieldErrors: { slug: [expect.stringMatching(/taken/)] },
      }),
    );
  });
});

describe("the database itself", () => {
  /** The SQLSTATE the statement fails with, or "allowed". */
  async function attempt(text: string, values: unknown[] = []): Promise<string> {
    try {
      await pool.query(text, values);
      return "allowed";
    } catch (error) {
      return (error as { code?: string }).code ?? String(error);
    }
  }

  it("refuses to change or remove a published version, its entries, events or review comments, as the app's role", async () => {
    const [alice, bruno] = await editors();
    const published = await publishedLibrary(alice, bruno);
    await runUseCase(withdrawLibraryEntry, {
      actor: alice,
      input: { versionId: published.versionId, entryKey: "GT 168x6", reason: "Test withdrawal." },
    });
    const v = [published.versionId];
    const statements: [string, unknown[]][] = [
      ["update library_versions set content_hash = repeat('0', 64) where id = $1", v],
      ["update library_versions set document = '{}' where id = $1", v],
      ["delete from library_versions where id = $1", v],
      ["truncate library_versions cascade", []],
      ["update library_version_entries set entry_hash = repeat('0', 64) where version_id = $1", v],
      ["delete from library_version_entries where version_id = $1", v],
      ["truncate library_version_entries cascade", []],
      ["update library_version_events set kind = 'published' where version_id = $1", v],
      ["update library_version_events set entry_key = null where version_id = $1", v],
      ["delete from library_version_events where version_id = $1", v],
      ["update library_reviews set document = '{}' where id = $1", [published.reviewId]],
      ["update library_reviews set outcome = 'returned' where id = $1", [published.reviewId]],
      ["delete from library_reviews where id = $1", [published.reviewId]],
      ["update library_drafts set document = '{}' where id = $1", [published.draftId]],
      ["delete from library_drafts where id = $1", [published.draftId]],
    ];
    for (const [text, values] of statements) {
      // 42501 insufficient_privilege: from the grants (no UPDATE, DELETE or TRUNCATE there) or the triggers.
      await expectNoChangeFrom(async () => expect([text, await attempt(text, values)]).toEqual([text, "42501"]));
    }
  });

  it("refuses a decision by the submitter, a version reviewed by its author, and an entry withdrawal naming no entry", async () => {
    const [alice, bruno] = await editors();
    const published = await publishedLibrary(alice, bruno);
    const { draftId } = await runUseCase(startLibraryDraft, { actor: alice, input: { versionId: published.versionId } });
    await runUseCase(saveLibraryDraft, {
      actor: alice,
      input: { draftId, document: sections("Tubes", [tube("GT 168x6", 0.1683, 0.008)]) },
    });
    const { reviewId } = await runUseCase(submitLibraryDraft, { actor: alice, input: { draftId, changelog: "Thicker." } });
    const checks: [string, unknown[], string][] = [
      // Four eyes on a review: 23514 check_violation.
      [
        "update library_reviews set reviewer_id = $2, outcome = 'approved', decided_at = now() where id = $1",
        [reviewId, alice.id],
        "23514",
      ],
      [
        `insert into library_versions (library_id, number, kind, title, document, content_hash, changelog, author_id, reviewer_id)
           select library_id, 99, 'sections', 't', '{}', repeat('a', 64), 'l', $1, $1 from library_versions where id = $2`,
        [alice.id, published.versionId],
        "23514",
      ],
      // A withdrawal without a reason; an event naming a key the version does not have (23503 foreign_key_violation).
      ["insert into library_version_events (version_id, kind) values ($1, 'withdrawn')", [published.versionId], "23514"],
      [
        "insert into library_version_events (version_id, kind, entry_key, reason) values ($1, 'withdrawn', 'gt 999', 'x')",
        [published.versionId],
        "23503",
      ],
      [
        "insert into library_version_events (version_id, kind, entry_key) values ($1, 'superseded', 'gt 168x6')",
        [published.versionId],
        "23514",
      ],
      // Two entries of one version with the same normalised key: 23505 unique_violation.
      [
        "insert into library_version_entries (version_id, position, key, normalised_key, entry_hash) values ($1, 9, 'GT  168X6', 'gt 168x6', repeat('b', 64))",
        [published.versionId],
        "23505",
      ],
    ];
    for (const [text, values, code] of checks)
      await expectNoChangeFrom(async () => expect([text, await attempt(text, values)]).toEqual([text, code]));
  });
});
