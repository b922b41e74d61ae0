// The firm's starting libraries, published into an empty libraries table as version 1 each: "Firm sections"
// from the demo catalogue (its CSV read by the catalogue import, as a firm's own table would be) and every
// document under content/libraries/ (materials, load-combination sets). Each is written by one demo lead and
// approved by the other, passed through the same check and hashing as a submission, with a row and a hash per
// entry. Run by scripts/seed.ts after the standards; a second run changes nothing.
import { count, eq } from "drizzle-orm";
import type { NodePgDatabase } from "drizzle-orm/node-postgres";
import * as schema from "@/db/schema";
import { DEMO_USERS } from "@/db/demo-users";
import { demoSectionsDocument } from "@/lib/libraries";
import { checkLibraryDraftDocument, type LibraryCheck } from "@/lib/use-cases/library-check";
import { startingLibraries } from "./starting-libraries";

export type LibrariesSeedResult = { seeded: false; reason: string } | { seeded: true; libraries: number; entries: number };

// Kept in lib/libraries so that tests with no database can hash what the seed publishes.
export { DEMO_CATALOGUE_FILE, demoSectionsDocument } from "@/lib/libraries";

type Starting = { slug: string; document: unknown; check: LibraryCheck };

async function startingDocuments(): Promise<Starting[]> {
  const sections = demoSectionsDocument();
  const found: Starting[] = [
    { slug: "firm-sections", document: sections, check: await checkLibraryDraftDocument(sections, "sections") },
  ];
  for (const { name, document } of startingLibraries())
    found.push({
      slug: name,
      document,
      check: await checkLibraryDraftDocument(document, document.kind),
    });
  for (const { slug, check } of found)
    if (!check.checked)
      throw new Error(`the starting library ${slug} cannot be published: ${check.problems.map((p) => p.message).join("; ")}`);
  return found;
}

export async function seedStartingLibraries(database: NodePgDatabase<typeof schema>): Promise<LibrariesSeedResult> {
  // Checked and hashed before the transaction: CPU work, not database work.
  const starting = await startingDocuments();
  return database.transaction(async (tx) => {
    await tx.execute("select pg_advisory_xact_lock(22912)");
    const [{ n }] = await tx.select({ n: count() }).from(schema.libraries);
    if (n > 0) return { seeded: false, reason: "libraries exist" };
    const leads = [];
    for (const demo of DEMO_USERS.filter((user) => user.role === "lead")) {
      const [row] = await tx.select({ id: schema.user.id }).from(schema.user).where(eq(schema.user.email, demo.email));
      if (row) leads.push(row.id);
    }
    if (leads.length < 2) return { seeded: false, reason: "the demo's two standards leads are not there" };

    let entries = 0;
    for (const [index, { slug, document, check }] of starting.entries()) {
      const checked = check.checked!;
      // The leads take turns, so the history shows both as author and reviewer.
      const [author, reviewer] = index % 2 === 0 ? [leads[0], leads[1]] : [leads[1], leads[0]];
      const changelog = "First version, from the firm's starting library.";
      const [library] = await tx
        .insert(schema.libraries)
        .values({ slug, kind: checked.document.kind, createdById: author })
        .returning();
      const [draft] = await tx
        .insert(schema.libraryDrafts)
        .values({ libraryId: library.id, authorId: author, document, state: "in-review" })
        .returning();
      const [review] = await tx
        .insert(schema.libraryReviews)
        .values({ draftId: draft.id, round: 1, document, contentHash: checked.contentHash, changelog, submittedById: author })
        .returning();
      await tx
        .update(schema.libraryReviews)
        .set({ reviewerId: reviewer, outcome: "approved", note: "Imported with the starting library.", decidedAt: new Date() })
        .where(eq(schema.libraryReviews.id, review.id));
      const [version] = await tx
        .insert(schema.libraryVersions)
        .values({
          libraryId: library.id,
          number: 1,
          kind: checked.document.kind,
          title: checked.document.title,
          document: checked.document,
          contentHash: checked.contentHash,
          changelog,
          authorId: author,
          reviewerId: reviewer,
          draftId: draft.id,
          reviewId: review.id,
        })
        .returning();
      await tx
        .insert(schema.libraryVersionEntries)
        .values(checked.entries.map((entry, position) => ({ ...entry, versionId: version.id, position })));
      await tx
        .update(schema.libraryDrafts)
        .set({ state: "published", publishedVersionId: version.id })
        .where(eq(schema.libraryDrafts.id, draft.id));
      await tx.insert(schema.libraryVersionEvents).values({ versionId: version.id, kind: "published", actorId: reviewer });
      await tx.insert(schema.auditEvents).values({
        action: "libraries.import",
        subject: `library-version:${version.id}`,
        details: { slug, kind: checked.document.kind, number: 1, hash: checked.contentHash, entries: checked.entries.length },
      });
      entries += checked.entries.length;
    }
    return { seeded: true, libraries: starting.length, entries };
  });
}
