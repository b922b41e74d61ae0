// The standards' lifecycle through the real use cases and data layer: draft → in review → published →
// superseded or withdrawn, the four-eyes rule, the publication gate (it compiles, it has verification cases,
// every case passes on the current engine), numbering under concurrent publication, and what each role may
// do. Every refusal is shown to change no row (tests/support/snapshot.ts).
import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { pool } from "@/db";
import type { Actor } from "@/lib/domain/actor";
import type { Role } from "@/lib/domain/roles";
import { contentHash } from "@/lib/standards/content-hash";
import { starterSource } from "@/lib/standards/starter";
import { runUseCase } from "@/lib/use-cases/run";
import {
  approveAndPublish,
  createStandard,
  discardDraft,
  listStandards,
  previewSource,
  readDraft,
  readStandard,
  readVersion,
  returnDraft,
  saveDraft,
  startDraft,
  submitDraft,
  withdrawVersion,
} from "@/lib/use-cases/standards";
import { attachHandCalculation, handCalculationKey, readHandCalculation } from "@/lib/use-cases/standard-attachments";
import { getObject } from "@/lib/storage/s3";
import { POST as postHandCalculation } from "@/app/api/standards/drafts/[draftId]/hand-calculations/route";
import { expectNoChangeFrom, refusalAudited } from "../support/snapshot";
import { auditEventsFor, createTestUser } from "./helpers/people";

let counter = 0;
const uniqueSlug = (label: string) => `${label}-${Date.now().toString(36)}-${(counter++).toString(36)}`;

async function leads(): Promise<[Actor, Actor]> {
  const [a, b] = await Promise.all([
    createTestUser({ role: "lead", label: "lead-a" }),
    createTestUser({ role: "lead", label: "lead-b" }),
  ]);
  return [a.actor, b.actor];
}

/** A new standard, its first draft submitted by `author` and published by `reviewer`. */
async function publishedStandard(author: Actor, reviewer: Actor, title = "Test beam") {
  const slug = uniqueSlug("beam");
  const { draftId } = await runUseCase(createStandard, { actor: author, input: { slug, title } });
  const { reviewId } = await runUseCase(submitDraft, { actor: author, input: { draftId, changelog: "First version." } });
  const published = await runUseCase(approveAndPublish, { actor: reviewer, input: { reviewId } });
  return { draftId, reviewId, ...published, slug };
}

describe("a standard from first draft to withdrawal", () => {
  it("is written, returned with comments, fixed, approved by a second lead and published as version 1", async () => {
    const [alice, bruno] = await leads();
    const slug = uniqueSlug("beam");
    const { draftId } = await runUseCase(createStandard, { actor: alice, input: { slug, title: "Cantilever check" } });

    // A draft with problems is saved (nothing is lost), but cannot be submitted.
    const broken = starterSource("Cantilever check").replace('expr: "0.9 * F_y * Z_x"', 'expr: "0.9 * F_y + Z_x"');
    const saved = await runUseCase(saveDraft, { actor: alice, input: { draftId, source: broken } });
    expect(saved.check.problems.length).toBeGreaterThan(0);
    expect(saved.check.problems[0]).toMatchObject({ path: "derived.phi_M_n.expr", line: expect.any(Number) });
    await expectNoChangeFrom(() =>
      expect(runUseCase(submitDraft, { actor: alice, input: { draftId, changelog: "First version." } })).rejects.toMatchObject({
        code: "invalid-input",
        message: expect.stringMatching(/problem.*derived\.phi_M_n\.expr/),
      }),
    );

    const fixed = starterSource("Cantilever check");
    await runUseCase(saveDraft, { actor: alice, input: { draftId, source: fixed } });
    const first = await runUseCase(submitDraft, { actor: alice, input: { draftId, changelog: "First version." } });
    expect(first.round).toBe(1);

    // Four eyes: the author neither approves nor returns their own submission, and cannot edit it in review.
    for (const [useCase, input] of [
      [approveAndPublish, { reviewId: first.reviewId }],
      [returnDraft, { reviewId: first.reviewId, note: "Looks fine to me." }],
    ] as const) {
      await expectNoChangeFrom(() =>
        expect(runUseCase(useCase as never, { actor: alice, input })).rejects.toMatchObject({
          code: "forbidden",
          message: expect.stringMatching(/nobody approves or returns their own/),
        }),
      );
    }
    await expectNoChangeFrom(() =>
      expect(runUseCase(saveDraft, { actor: alice, input: { draftId, source: fixed + "\n" } })).rejects.toMatchObject({
        code: "conflict",
        message: expect.stringMatching(/in review/),
      }),
    );

    // The second lead returns it, with a comment on line 3 of what was submitted.
    const returned = await runUseCase(returnDraft, {
      actor: bruno,
      input: {
        reviewId: first.reviewId,
        note: "Please say what the standard covers.",
        comments: [{ line: 5, body: "Summary is a placeholder." }],
      },
    });
    expect(returned).toMatchObject({ round: 1, comments: 1, authorName: alice.name });
    const view = await runUseCase(readDraft, { actor: alice, input: { draftId } });
    expect(view.draft.state).toBe("editing");
    expect(view.reviews).toHaveLength(1);
    expect(view.reviews[0]).toMatchObject({
      outcome: "returned",
      reviewerName: bruno.name,
      note: "Please say what the standard covers.",
      comments: [{ line: 5, body: "Summary is a placeholder.", authorName: bruno.name }],
    });
    expect(view.reviews[0].source.split("\n")[4]).toMatch(/^summary: /);

    // A decided submission stays decided.
    await expectNoChangeFrom(() =>
      expect(runUseCase(approveAndPublish, { actor: bruno, input: { reviewId: first.reviewId } })).rejects.toMatchObject({
        code: "conflict",
        message: "This submission was already returned.",
      }),
    );

    const final = fixed.replace(/^summary: .*$/m, "summary: A cantilever under a uniform load, checked in bending.");
    await runUseCase(saveDraft, { actor: alice, input: { draftId, source: final } });
    const second = await runUseCase(submitDraft, { actor: alice, input: { draftId, changelog: "First version." } });
    expect(second.round).toBe(2);
    const published = await runUseCase(approveAndPublish, {
      actor: bruno,
      input: { reviewId: second.reviewId, note: "Checked." },
    });
    const expectedHash = await contentHash(final);
    expect(published).toMatchObject({
      number: 1,
      title: "Cantilever check",
      authorName: alice.name,
      supersedes: [],
      cases: 1,
      hash: expectedHash.ok ? expectedHash.hash : "unreadable",
    });

    const version = await runUseCase(readVersion, { actor: bruno, input: { slug, number: 1 } });
    expect(version).toMatchObject({
      number: 1,
      status: "published",
      source: final,
      authorName: alice.name,
      reviewerName: bruno.name,
      changelog: "First version.",
      summary: "A cantilever under a uniform load, checked in bending.",
      verifiedWith: expect.stringMatching(/^engine \d+\.\d+\.\d+\+sha256:[0-9a-f]{12} · evaluation \d+\.\d+\.\d+$/),
    });
    expect(version.events.map((event) => event.kind)).toEqual(["published"]);
    expect((await runUseCase(readDraft, { actor: alice, input: { draftId } })).draft).toMatchObject({
      state: "published",
      publishedVersionId: version.id,
    });

    // Every step is in the audit trail.
    const actions = async (action: string) =>
      (await auditEventsFor({ action })).filter((e) => (e.details as { slug?: string }).slug === slug);
    expect((await actions("standards.create")).map((e) => e.actorId)).toEqual([alice.id]);
    expect((await actions("standards.draft.save")).map((e) => (e.details as { problems: number }).problems > 0)).toEqual([
      true,
      false,
      false,
    ]);
    expect((await actions("standards.draft.submit")).map((e) => (e.details as { round: number }).round)).toEqual([1, 2]);
    expect((await actions("standards.draft.return")).map((e) => e.actorId)).toEqual([bruno.id]);
    expect((await actions("standards.publish")).map((e) => [e.actorId, (e.details as { number: number }).number])).toEqual([
      [bruno.id, 1],
    ]);
  });

  it("publishes a second version that supersedes the first; withdrawing it leaves the first runnable", async () => {
    const [alice, bruno] = await leads();
    const v1 = await publishedStandard(alice, bruno);
    const { draftId } = await runUseCase(startDraft, { actor: bruno, input: { versionId: v1.versionId } });
    const v1Source = (await runUseCase(readVersion, { actor: bruno, input: { slug: v1.slug, number: 1 } })).source;
    expect((await runUseCase(readDraft, { actor: bruno, input: { draftId } })).draft).toMatchObject({
      source: v1Source,
      basedOnNumber: 1,
    });
    await runUseCase(saveDraft, { actor: bruno, input: { draftId, source: v1Source.replace("max: 30 m", "max: 25 m") } });
    const { reviewId } = await runUseCase(submitDraft, { actor: bruno, input: { draftId, changelog: "Span limited to 25 m." } });
    const v2 = await runUseCase(approveAndPublish, { actor: alice, input: { reviewId } });
    expect(v2).toMatchObject({ number: 2, supersedes: [1] });

    const standard = await runUseCase(readStandard, { actor: alice, input: { slug: v1.slug } });
    expect(standard.versions.map((v) => [v.number, v.status, v.authorName, v.reviewerName])).toEqual([
      [2, "published", bruno.name, alice.name],
      [1, "superseded", alice.name, bruno.name],
    ]);
    const listed = () => runUseCase(listStandards, { actor: alice, input: {} });
    expect((await listed()).standards.find((s) => s.slug === v1.slug)).toMatchObject({ current: { number: 2 }, versions: 2 });

    // Withdrawal needs a reason, is an event (the version row is not touched), and happens once.
    await expectNoChangeFrom(() =>
      expect(
        runUseCase(withdrawVersion, { actor: alice, input: { versionId: v2.versionId, reason: "  " } }),
      ).rejects.toMatchObject({
        code: "invalid-input",
      }),
    );
    await runUseCase(withdrawVersion, { actor: alice, input: { versionId: v2.versionId, reason: "Wrong span limit." } });
    const withdrawn = await runUseCase(readVersion, { actor: alice, input: { slug: v1.slug, number: 2 } });
    expect(withdrawn.status).toBe("withdrawn");
    expect(withdrawn.events.map((e) => [e.kind, e.reason])).toEqual([
      ["published", null],
      ["withdrawn", "Wrong span limit."],
    ]);
    await expectNoChangeFrom(() =>
      expect(
        runUseCase(withdrawVersion, { actor: alice, input: { versionId: v2.versionId, reason: "Again." } }),
      ).rejects.toMatchObject({
        code: "conflict",
      }),
    );
    expect((await listed()).standards.find((s) => s.slug === v1.slug)).toMatchObject({
      current: { number: 1, status: "superseded" },
    });
  });

  it("gives two leads publishing at the same moment consecutive numbers, never the same one", async () => {
    const [alice, bruno] = await leads();
    const v1 = await publishedStandard(alice, bruno);
    const submissions = [];
    for (const [author, span] of [
      [alice, "26 m"],
      [bruno, "24 m"],
    ] as const) {
      const { draftId } = await runUseCase(startDraft, { actor: author, input: { versionId: v1.versionId } });
      const source = (await runUseCase(readDraft, { actor: author, input: { draftId } })).draft.source.replace(
        "max: 30 m",
        `max: ${span}`,
      );
      await runUseCase(saveDraft, { actor: author, input: { draftId, source } });
      submissions.push({
        author,
        ...(await runUseCase(submitDraft, { actor: author, input: { draftId, changelog: `Span ${span}.` } })),
      });
    }
    const results = await Promise.all(
      submissions.map(({ author, reviewId }) =>
        runUseCase(approveAndPublish, { actor: author.id === alice.id ? bruno : alice, input: { reviewId } }),
      ),
    );
    expect(results.map((r) => r.number).sort()).toEqual([2, 3]);
    const versions = (await runUseCase(readStandard, { actor: alice, input: { slug: v1.slug } })).versions;
    expect(versions.map((v) => [v.number, v.status])).toEqual([
      [3, "published"],
      [2, "superseded"],
      [1, "superseded"],
    ]);
  });
});

describe("the editor's preview of text not yet saved", () => {
  it("answers the author with the text's problems, or its preview at the default inputs, and stores nothing", async () => {
    const [alice, bruno] = await leads();
    const { draftId } = await runUseCase(createStandard, {
      actor: alice,
      input: { slug: uniqueSlug("preview"), title: "Preview beam" },
    });
    const broken = starterSource("Preview beam").replace('expr: "0.9 * F_y * Z_x"', 'expr: "0.9 * F_y + Z_x"');

    await expectNoChangeFrom(async () => {
      const withProblems = await runUseCase(previewSource, { actor: alice, input: { draftId, source: broken } });
      expect(withProblems.preview).toBeNull();
      expect(withProblems.check.problems[0]).toMatchObject({ path: "derived.phi_M_n.expr", line: expect.any(Number) });

      const retitled = starterSource("Preview beam, typed");
      const good = await runUseCase(previewSource, { actor: alice, input: { draftId, source: retitled } });
      expect(good.check.problems).toEqual([]);
      expect(good.preview).toMatchObject({ ok: true, definition: { title: "Preview beam, typed" } });
      if (!good.preview?.ok) throw new Error("no preview");
      expect(Object.keys(good.preview.evaluation.checks).length).toBeGreaterThan(0);
      expect(good.check.verification.length).toBeGreaterThan(0);
    });

    // Another lead may not use someone else's draft to preview text (and nothing changes either).
    await expectNoChangeFrom(() =>
      expect(
        runUseCase(previewSource, { actor: bruno, input: { draftId, source: starterSource("Preview beam") } }),
      ).rejects.toMatchObject({ code: "forbidden", message: expect.stringMatching(/Only the draft's author edits it/) }),
    );
  });
});

describe("hand calculations", () => {
  const pdf = (text: string) =>
    new File([new TextEncoder().encode(`%PDF-1.4\n% ${text} ${Date.now()}\n%%EOF\n`)], "tip-check.pdf", {
      type: "application/pdf",
    });
  const citing = (title: string, sha256: string) =>
    starterSource(title).replace(
      '    source: "AWC Design Aid No. 6 (2005), Fig. 1: M_max = wL²/8"',
      `    source: "Hand calculation, M = wL²/8 worked by hand"\n    hand_calculation: { checker: "Abena Harcastle", file: tip-check.pdf, sha256: "${sha256}" }`,
    );

  it("are stored under their sha256 and must be attached before a case citing one is submitted or published", async () => {
    const [alice, bruno] = await leads();
    const { draftId } = await runUseCase(createStandard, {
      actor: alice,
      input: { slug: uniqueSlug("hand"), title: "Hand beam" },
    });
    const file = pdf("tip deflection, checked");
    const sha256 = createHash("sha256")
      .update(new Uint8Array(await file.arrayBuffer()))
      .digest("hex");

    // Cited before it is attached: saved, but not submitted, and the refusal says which case and file.
    await runUseCase(saveDraft, { actor: alice, input: { draftId, source: citing("Hand beam", sha256) } });
    await expectNoChangeFrom(() =>
      expect(runUseCase(submitDraft, { actor: alice, input: { draftId, changelog: "First." } })).rejects.toMatchObject({
        code: "invalid-input",
        message: expect.stringMatching(
          /cites the hand calculation tip-check\.pdf by Abena Harcastle .* no file with that sha256 is attached/,
        ),
      }),
    );

    // Another lead may not attach files to Alice's draft; nothing is recorded.
    await expectNoChangeFrom(() =>
      expect(runUseCase(attachHandCalculation, { actor: bruno, input: { draftId, file } })).rejects.toMatchObject({
        code: "forbidden",
      }),
    );
    // A renamed file of another kind is refused by its contents.
    await expectNoChangeFrom(() =>
      expect(
        runUseCase(attachHandCalculation, {
          actor: alice,
          input: { draftId, file: new File(["not a pdf"], "fake.pdf", { type: "application/pdf" }) },
        }),
      ).rejects.toMatchObject({ code: "invalid-input", message: expect.stringMatching(/not a PDF file/) }),
    );

    const attached = await runUseCase(attachHandCalculation, { actor: alice, input: { draftId, file } });
    expect(attached).toMatchObject({ sha256, fileName: "tip-check.pdf", added: true });
    expect((await getObject({ key: handCalculationKey(sha256) }))?.body).toEqual(new Uint8Array(await file.arrayBuffer()));
    // The same bytes again: one row, no second audit event.
    expect(await runUseCase(attachHandCalculation, { actor: alice, input: { draftId, file } })).toMatchObject({ added: false });
    expect(await auditEventsFor({ action: "standards.attachment.add", actorEmail: alice.email })).toHaveLength(1);

    const { reviewId } = await runUseCase(submitDraft, { actor: alice, input: { draftId, changelog: "First." } });
    const published = await runUseCase(approveAndPublish, { actor: bruno, input: { reviewId } });
    const version = await runUseCase(readVersion, { actor: bruno, input: { slug: published.slug, number: 1 } });
    expect(version.verification).toEqual([
      expect.objectContaining({
        pass: true,
        handCalculation: { checker: "Abena Harcastle", file: "tip-check.pdf", sha256 },
      }),
    ]);
    // Anyone who reads standards downloads it by its sha256.
    const { actor: engineer } = await createTestUser({ role: "engineer", label: "hand-reader" });
    const read = await runUseCase(readHandCalculation, { actor: engineer, input: { sha256 } });
    expect(read).toMatchObject({ fileName: "tip-check.pdf", contentType: "application/pdf" });
    expect(read.body).toEqual(new Uint8Array(await file.arrayBuffer()));
    await expect(runUseCase(readHandCalculation, { actor: engineer, input: { sha256: "0".repeat(64) } })).rejects.toMatchObject({
      code: "not-found",
    });
    // A body announced as over the limit is refused before it is read, with the sentence beside the field.
    const tooLarge = await postHandCalculation(
      new Request(`http://127.0.0.1/api/standards/drafts/${draftId}/hand-calculations`, {
        method: "POST",
        headers: { "content-length": String(11 * 1024 * 1024) },
        body: "x",
      }),
      { params: Promise.resolve({ draftId }) },
    );
    expect(tooLarge.status).toBe(422);
    expect(await tooLarge.json()).toMatchObject({ error: { fieldErrors: { file: [expect.stringMatching(/over 10 MB/)] } } });
  });
});

describe("the publication gate", () => {
  it("refuses a draft whose verification case fails on the current engine, naming the case", async () => {
    const [alice] = await leads();
    const slug = uniqueSlug("gate");
    const { draftId } = await runUseCase(createStandard, { actor: alice, input: { slug, title: "Gate test" } });
    const wrong = starterSource("Gate test").replace('value: "1.6 * 10 kN/m', 'value: "1.7 * 10 kN/m');
    await runUseCase(saveDraft, { actor: alice, input: { draftId, source: wrong } });
    await expectNoChangeFrom(() =>
      expect(runUseCase(submitDraft, { actor: alice, input: { draftId, changelog: "First." } })).rejects.toMatchObject({
        code: "invalid-input",
        message: expect.stringMatching(
          /Verification case “Uniform load, closed form” fails on the current engine: M_u: expected 76500, got 72000 \(SI units\)/,
        ),
      }),
    );
  });

  it("refuses a draft with no verification case", async () => {
    const [alice] = await leads();
    const { draftId } = await runUseCase(createStandard, {
      actor: alice,
      input: { slug: uniqueSlug("gate"), title: "No cases" },
    });
    const none = starterSource("No cases").replace(/verification:[\s\S]*?\n---/, "---");
    const saved = await runUseCase(saveDraft, { actor: alice, input: { draftId, source: none } });
    expect(saved.check).toMatchObject({ problems: [], verification: [] });
    await expectNoChangeFrom(() =>
      expect(runUseCase(submitDraft, { actor: alice, input: { draftId, changelog: "First." } })).rejects.toMatchObject({
        code: "invalid-input",
        message: expect.stringMatching(/at least one verification case/),
      }),
    );
  });

  it("refuses a short name that is taken, and one that is not kebab-case, saying how to write it", async () => {
    const [alice] = await leads();
    const slug = uniqueSlug("taken");
    await runUseCase(createStandard, { actor: alice, input: { slug, title: "First" } });
    await expectNoChangeFrom(() =>
      expect(runUseCase(createStandard, { actor: alice, input: { slug, title: "Second" } })).rejects.toMatchObject({
        code: "conflict",
        fieldErrors: { slug: [expect.stringMatching(/taken/)] },
      }),
    );
    // Two leads creating the same short name at the same moment: one gets it, the other a 409 (never a 500).
    const [bruno] = await leads();
    const raced = uniqueSlug("raced");
    const outcomes = await Promise.allSettled(
      [alice, bruno].map((actor) => runUseCase(createStandard, { actor, input: { slug: raced, title: "Raced" } })),
    );
    expect(outcomes.map((o) => o.status).sort()).toEqual(["fulfilled", "rejected"]);
    expect(outcomes.find((o) => o.status === "rejected")).toMatchObject({ reason: { code: "conflict" } });
    await expectNoChangeFrom(() =>
      expect(runUseCase(createStandard, { actor: alice, input: { slug: "Fixed_End", title: "x" } })).rejects.toMatchObject({
        code: "invalid-input",
        fieldErrors: { slug: [expect.stringMatching(/lower-case letters, digits and single hyphens/)] },
      }),
    );
  });
});

describe("who may do what", () => {
  // From product.md's roles, written out here rather than read from the permission table: standards leads
  // write, review, publish and withdraw; engineers and auditors read what is published; admins manage
  // people and see no engineering content.
  const READS: Record<Role, boolean> = { lead: true, engineer: true, auditor: true, admin: false };
  const WRITES: Record<Role, boolean> = { lead: true, engineer: false, auditor: false, admin: false };

  it.each(["engineer", "auditor", "admin"] as const)(
    "a %s cannot start, save, submit, review, publish or withdraw",
    async (role) => {
      expect(WRITES[role]).toBe(false);
      const [alice, bruno] = await leads();
      const published = await publishedStandard(alice, bruno);
      const { draftId } = await runUseCase(startDraft, { actor: alice, input: { versionId: published.versionId } });
      const { reviewId } = await runUseCase(submitDraft, {
        actor: alice,
        input: { draftId, changelog: "Resubmitted unchanged." },
      });
      const { actor } = await createTestUser({ role });
      const attempts = [
        [createStandard, { slug: uniqueSlug("nope"), title: "Not mine" }],
        [startDraft, { versionId: published.versionId }],
        [saveDraft, { draftId, source: "x" }],
        [submitDraft, { draftId, changelog: "x" }],
        [discardDraft, { draftId }],
        [returnDraft, { reviewId, note: "x" }],
        [approveAndPublish, { reviewId }],
        [withdrawVersion, { versionId: published.versionId, reason: "x" }],
        [readDraft, { draftId }],
      ] as const;
      for (const [useCase, input] of attempts) {
        await expectNoChangeFrom(
          () => expect(runUseCase(useCase as never, { actor, input })).rejects.toMatchObject({ code: "forbidden" }),
          { except: [refusalAudited(actor.id, useCase.name)] },
        );
      }
    },
  );

  it.each(["lead", "engineer", "auditor", "admin"] as const)(
    "a %s reads published standards only if the role reads the library",
    async (role) => {
      const [alice, bruno] = await leads();
      const published = await publishedStandard(alice, bruno);
      const { actor } = await createTestUser({ role });
      const read = () => runUseCase(readVersion, { actor, input: { slug: published.slug, number: 1 } });
      if (READS[role]) {
        expect((await read()).number).toBe(1);
        const listed = await runUseCase(listStandards, { actor, input: {} });
        expect(listed.standards.some((s) => s.slug === published.slug)).toBe(true);
        // Drafts are the leads' working space.
        if (role !== "lead") expect(listed.drafts).toEqual([]);
      } else {
        await expectNoChangeFrom(() => expect(read()).rejects.toMatchObject({ code: "forbidden" }), {
          except: [refusalAudited(actor.id, readVersion.name)],
        });
      }
    },
  );

  it("a lead cannot save, submit or discard another lead's draft", async () => {
    const [alice, bruno] = await leads();
    const { draftId } = await runUseCase(createStandard, { actor: alice, input: { slug: uniqueSlug("mine"), title: "Mine" } });
    for (const [useCase, input] of [
      [saveDraft, { draftId, source: "changed" }],
      [submitDraft, { draftId, changelog: "x" }],
      [discardDraft, { draftId }],
    ] as const) {
      await expectNoChangeFrom(() =>
        expect(runUseCase(useCase as never, { actor: bruno, input })).rejects.toMatchObject({
          code: expect.stringMatching(/forbidden|conflict/),
          message: expect.stringMatching(/Only the draft's author/),
        }),
      );
    }
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

  it("refuses to change or remove a published version, its events or review comments, as the app's role", async () => {
    const [alice, bruno] = await leads();
    const published = await publishedStandard(alice, bruno);
    const v = [published.versionId];
    const statements: [string, unknown[]][] = [
      ["update standard_versions set source = 'changed' where id = $1", v],
      ["update standard_versions set number = 99 where id = $1", v],
      ["delete from standard_versions where id = $1", v],
      ["update standard_version_events set kind = 'withdrawn' where version_id = $1", v],
      ["delete from standard_version_events where version_id = $1", v],
      ["truncate standard_versions cascade", []],
      ["update standard_reviews set source = 'changed' where id = $1", [published.reviewId]],
      ["update standard_reviews set outcome = 'returned' where id = $1", [published.reviewId]],
      ["delete from standard_reviews where id = $1", [published.reviewId]],
      ["update standard_drafts set source = 'changed' where id = $1", [published.draftId]],
      ["delete from standard_drafts where id = $1", [published.draftId]],
    ];
    for (const [text, values] of statements) {
      // 42501 insufficient_privilege: from the grants (no UPDATE, DELETE or TRUNCATE there) or the triggers.
      await expectNoChangeFrom(async () => expect([text, await attempt(text, values)]).toEqual([text, "42501"]));
    }
  });

  it("refuses a version whose reviewer is its author (check constraint)", async () => {
    const [alice] = await leads();
    const { draftId } = await runUseCase(createStandard, { actor: alice, input: { slug: uniqueSlug("solo"), title: "Solo" } });
    const draft = (await runUseCase(readDraft, { actor: alice, input: { draftId } })).draft;
    const insert = `insert into standard_versions
        (standard_id, number, source, content_hash, title, category, summary, changelog, author_id, reviewer_id, verified_with, verification)
        values ($1, 1, 'x', $2, 't', 'c', 's', 'l', $3, $3, 'e', '[]')`;
    await expectNoChangeFrom(async () =>
      expect(await attempt(insert, [draft.standardId, "a".repeat(64), alice.id])).toBe("23514"),
    );
  });
});
