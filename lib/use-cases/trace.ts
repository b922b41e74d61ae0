import "server-only";
// A run's trace: everything an auditor needs to defend one of its numbers — the version that made it (who wrote and
// approved it, when, its changelog and content hash, checked against its stored text), the engine and bundle, the
// record's inputs and outputs, the sign-off, the files with their sha256 and every audit event about the run and
// its calc revisions. Whoever may read the run may read its trace. From a version: every run of it, a page at a time.
// Reproductions are in reproduce.ts.
import { AppError } from "@/lib/domain/errors";
import { can } from "@/lib/domain/permissions";
import { runRefSchema } from "@/lib/domain/schemas/jobs";
import { versionRunsSchema } from "@/lib/domain/schemas/trace";
import { contentHash } from "@/lib/standards/content-hash";
import { readRunRecord } from "@/lib/standards/run-record";
import { getRun, type RunDto, type RunSummaryDto } from "@/lib/data/runs";
import { listRuns } from "@/lib/data/run-list";
import { getStandardBySlug, getVersion, listVersionsOf, type VersionDto } from "@/lib/data/standards";
import { revisionsOfRun } from "@/lib/data/calcs";
import { listAttachments, listSheetPdfs, type AttachmentDto, type SheetPdfDto } from "@/lib/data/files";
import { listAuditEventsAbout, type AuditEventDto } from "@/lib/data/audit";
import { defineUseCase } from "./use-case";

/** Audit events shown on one trace; a run with more shows the newest and says so. */
export const TRACE_EVENT_LIMIT = 500;

export type TraceVersion = Omit<VersionDto, "source" | "verification"> & {
  /** The version's stored text hashes to the content hash the run recorded. */
  contentHashMatches: boolean;
  /** The versions before and after it, for the diffs; null at either end. */
  previous: number | null;
  next: number | null;
};

export type RunTrace = {
  run: RunDto;
  version: TraceVersion;
  revisions: Awaited<ReturnType<typeof revisionsOfRun>>;
  attachments: AttachmentDto[];
  sheetPdfs: SheetPdfDto[];
  /** Oldest first; the client address only for those who read the audit trail. */
  events: AuditEventDto[];
  /** More events than TRACE_EVENT_LIMIT: the oldest are left out. */
  moreEvents: boolean;
};

export const readRunTrace = defineUseCase({
  name: "runs.trace",
  permission: "runs.read",
  input: runRefSchema,
  run: async ({ id }, { actor }): Promise<RunTrace> => {
    const run = await getRun(id);
    if (!run) throw new AppError("not-found", "There is no run with that id.");
    const record = readRunRecord(run.record);
    const version = (await getVersion({ id: run.versionId }))!;
    const numbers = (await listVersionsOf(version.standardId)).map((v) => v.number);
    const earlier = numbers.filter((n) => n < version.number);
    const later = numbers.filter((n) => n > version.number);
    const hashed = await contentHash(version.source);
    const revisions = await revisionsOfRun(run.id);
    const [attachments, sheetPdfs, about] = await Promise.all([
      listAttachments({ jobId: run.jobId, runId: run.id }),
      listSheetPdfs(run.id),
      listAuditEventsAbout([`run:${run.id}`, ...revisions.map((r) => `calc-revision:${r.id}`)], TRACE_EVENT_LIMIT),
    ]);
    const { source: _source, verification: _verification, ...shown } = version;
    const readsTrail = can(actor.role, "audit.read");
    return {
      run,
      version: {
        ...shown,
        contentHashMatches:
          hashed.ok && hashed.hash === record.standard.contentHash && version.contentHash === record.standard.contentHash,
        previous: earlier.length > 0 ? Math.max(...earlier) : null,
        next: later.length > 0 ? Math.min(...later) : null,
      },
      revisions,
      attachments,
      sheetPdfs,
      events: about.events.map((event) => (readsTrail ? event : { ...event, ipAddress: null })),
      moreEvents: about.more,
    };
  },
  audit: null,
});

export type VersionRuns = {
  version: { slug: string; title: string; number: number; contentHash: string; status: VersionDto["status"] };
  runs: RunSummaryDto[];
  nextCursor: string | null;
};

/** Every run of one published version, newest first, keyset-paginated by (time, id). */
export const readVersionRuns = defineUseCase({
  name: "runs.of-version",
  permission: "runs.read",
  input: versionRunsSchema,
  run: async ({ slug, number, cursor, limit }): Promise<VersionRuns> => {
    const standard = await getStandardBySlug(slug);
    const version = standard ? await getVersion({ standardId: standard.id, number }) : null;
    if (!version) throw new AppError("not-found", `“${slug}” has no version ${number}.`);
    const at = cursor?.indexOf("_") ?? -1;
    const after = cursor ? { sort: "date" as const, createdAt: cursor.slice(0, at), id: cursor.slice(at + 1) } : undefined;
    const rows = await listRuns({ versionId: version.id, after, limit: limit + 1 });
    const runs = rows.slice(0, limit);
    const last = runs.at(-1);
    return {
      version: {
        slug,
        title: version.title,
        number: version.number,
        contentHash: version.contentHash,
        status: version.status,
      },
      runs,
      nextCursor: rows.length > limit && last ? `${last.createdAt}_${last.id}` : null,
    };
  },
  audit: null,
});
