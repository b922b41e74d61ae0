// The firm's starting standards (content/standards/<slug>/<n>.mdx), imported into an empty standards
// table as published versions: each written by one demo lead and approved by the other, passed through the
// same gate as a lead's submission (it compiles, it has verification cases, every case passes on this
// engine), numbered as its file, and the earlier versions of a standard superseded. The hand calculations
// its cases cite (content/standards/<slug>/hand-calculations/) are stored in S3 and attached, as a lead's
// upload would be. Run by scripts/seed.ts after the demo firm; a second run changes nothing.
import path from "node:path";
import { count, eq } from "drizzle-orm";
import type { NodePgDatabase } from "drizzle-orm/node-postgres";
import * as schema from "@/db/schema";
import { DEMO_USERS } from "@/db/demo-users";
import { checkSource, gateRefusals } from "@/lib/use-cases/standard-gate";
import { handCalculationKey } from "@/lib/use-cases/standard-attachments";
import { putObject } from "@/lib/storage/s3";
import { citedHandCalculations, startingStandardFiles } from "./starting-standards";

export type StandardsSeedResult = { seeded: false; reason: string } | { seeded: true; standards: number; versions: number };

export async function seedStartingStandards(database: NodePgDatabase<typeof schema>): Promise<StandardsSeedResult> {
  // Checked before the transaction: compiling and verifying is CPU work, not database work.
  const files = await Promise.all(
    startingStandardFiles().map(async ({ file, source }) => {
      const slug = path.dirname(file);
      const number = Number(path.basename(file, ".mdx"));
      const check = await checkSource(source, { inProcess: true });
      const refusals = gateRefusals(check);
      if (refusals.length > 0) throw new Error(`content/standards/${file} cannot be published: ${refusals.join(" ")}`);
      return { slug, number, source, check, cited: citedHandCalculations(slug, check) };
    }),
  );
  // Stored before the transaction, as an upload is (nothing slow inside one); stored again, the same bytes.
  for (const { cited } of files)
    for (const { sha256, body, contentType } of cited) await putObject({ key: handCalculationKey(sha256), body, contentType });
  return database.transaction(async (tx) => {
    await tx.execute("select pg_advisory_xact_lock(22911)");
    const [{ n }] = await tx.select({ n: count() }).from(schema.standards);
    if (n > 0) return { seeded: false, reason: "standards exist" };
    const leads = [];
    for (const demo of DEMO_USERS.filter((user) => user.role === "lead")) {
      const [row] = await tx.select({ id: schema.user.id }).from(schema.user).where(eq(schema.user.email, demo.email));
      if (row) leads.push(row.id);
    }
    if (leads.length < 2) return { seeded: false, reason: "the demo's two standards leads are not there" };

    const slugs = [...new Set(files.map((f) => f.slug))];
    for (const slug of slugs) {
      const [standard] = await tx.insert(schema.standards).values({ slug, createdById: leads[0] }).returning();
      const versions = files.filter((f) => f.slug === slug).sort((a, b) => a.number - b.number);
      const attached = new Set<string>();
      for (const { cited } of versions)
        for (const { file, sha256, body, contentType } of cited) {
          if (attached.has(sha256)) continue;
          attached.add(sha256);
          await tx.insert(schema.standardAttachments).values({
            standardId: standard.id,
            sha256,
            fileName: file,
            contentType,
            bytes: body.length,
            uploadedById: leads[0],
          });
        }
      let previous: string | null = null;
      for (const [index, { number, source, check }] of versions.entries()) {
        if (number !== index + 1)
          throw new Error(`content/standards/${slug}: versions must be numbered 1, 2, … (found ${number})`);
        // The leads take turns, so the history shows both as author and reviewer.
        const [author, reviewer] = index % 2 === 0 ? [leads[0], leads[1]] : [leads[1], leads[0]];
        const [draft]: schema.StandardDraft[] = await tx
          .insert(schema.standardDrafts)
          .values({ standardId: standard.id, authorId: author, source, basedOnVersionId: previous, state: "in-review" })
          .returning();
        const changelog =
          number === 1 ? "First version, from the firm's starting library." : `Version ${number} of the starting library.`;
        const [review] = await tx
          .insert(schema.standardReviews)
          .values({ draftId: draft.id, round: 1, source, changelog, submittedById: author })
          .returning();
        await tx
          .update(schema.standardReviews)
          .set({ reviewerId: reviewer, outcome: "approved", note: "Imported with the starting library.", decidedAt: new Date() })
          .where(eq(schema.standardReviews.id, review.id));
        const [version]: schema.StandardVersion[] = await tx
          .insert(schema.standardVersions)
          .values({
            standardId: standard.id,
            number,
            source,
            contentHash: check.hash!,
            ...check.metadata!,
            changelog,
            authorId: author,
            reviewerId: reviewer,
            basedOnVersionId: previous,
            draftId: draft.id,
            reviewId: review.id,
            verifiedWith: check.verifiedWith,
            verification: check.verification,
          })
          .returning();
        await tx
          .update(schema.standardDrafts)
          .set({ state: "published", publishedVersionId: version.id })
          .where(eq(schema.standardDrafts.id, draft.id));
        await tx.insert(schema.standardVersionEvents).values({ versionId: version.id, kind: "published", actorId: reviewer });
        if (previous)
          await tx
            .insert(schema.standardVersionEvents)
            .values({ versionId: previous, kind: "superseded", reason: `by version ${number}`, actorId: reviewer });
        await tx.insert(schema.auditEvents).values({
          action: "standards.import",
          subject: `standard-version:${version.id}`,
          details: { slug, number, hash: check.hash! },
        });
        previous = version.id;
      }
    }
    return { seeded: true, standards: slugs.length, versions: files.length };
  });
}
