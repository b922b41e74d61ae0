import "server-only";
// Reproducing a stored run: its version's stored text (checked against the content hash the run recorded) and its
// inputs as typed, with the library entries it used (the versions its record names, withdrawn since or not),
// evaluated again in a worker thread and compared with the record (lib/standards/reproduction.ts).
//
//   as-issued  with the evaluation bundle that made the run: its sha256 is in the run's record (identity), and the
//              bytes are read from object storage (evaluation-bundles.ts) and checked against it before they run.
//              A run whose bundle was never kept (made by a release before bundles were kept, and not the server's
//              own bundle) is refused, saying so; one made by the server's own bundle has it kept on this first need.
//   current    with the server's bundle of today: each output identical or with its relative difference.
//
// The evaluation is slow work, so it runs in `prepare`, before any transaction; `run` only hands the result on, and
// the reproduction is recorded as an audit event (a refusal too, when the bundle is missing or altered). Nothing
// else is written: an auditor reproduces and changes nothing.
import { AppError } from "@/lib/domain/errors";
import { reproduceRunSchema, type ReproductionMode } from "@/lib/domain/schemas/trace";
import { contentHash } from "@/lib/standards/content-hash";
import { readRunRecord, type RunRecord } from "@/lib/standards/run-record";
import { compareReproduction, type ReproductionComparison } from "@/lib/standards/reproduction";
import { evaluationPool, type PoolOutcome } from "@/lib/evaluation/pool";
import { runWithBundleBytes, sha256Hex } from "@/lib/evaluation/archived-bundle";
import type { RunResult } from "@/lib/evaluation/protocol";
import { getRun } from "@/lib/data/runs";
import { getVersion } from "@/lib/data/standards";
import { libraryEntriesFor, libraryPinsOf, pinnedVersions } from "./library-resolution";
import { keepCurrentEvaluationBundle, readKeptEvaluationBundle } from "./evaluation-bundles";
import { defineUseCase } from "./use-case";

export type Reproduction = {
  runId: string;
  mode: ReproductionMode;
  /** The bundle that evaluated it again. */
  bundleSha256: string;
  comparison: ReproductionComparison;
};

/** A reproduction that could not be made; audited with its reason (a missing or altered bundle is evidence too). */
export class ReproductionRefused extends AppError {
  constructor(
    message: string,
    readonly refused: { runId: string; mode: ReproductionMode; bundleSha256: string; reason: string },
  ) {
    super("conflict", message);
  }
}

const short = (sha256: string) => `${sha256.slice(0, 12)}…`;

/** The library versions the run used, by slug, as its record names them. */
const libraryVersionsOf = (record: RunRecord) =>
  Object.fromEntries(record.libraries.map((entry) => [entry.library, entry.version]));

/** The entry names the run's inputs picked, by library slug (the others took the version's defaults). */
function picksOf(record: RunRecord): Record<string, string[]> {
  const picks: Record<string, string[]> = {};
  for (const entry of record.libraries) (picks[entry.library] ??= []).push(entry.key);
  return picks;
}

async function asIssued(record: RunRecord, task: Parameters<typeof runWithBundleBytes>[2]): Promise<PoolOutcome<RunResult>> {
  const wanted = record.identity.bundleSha256;
  const refuse = (reason: string, message: string) =>
    new ReproductionRefused(message, { runId: record.id, mode: "as-issued", bundleSha256: wanted, reason });
  // On first need: the server's own bundle is kept now if nothing kept it before (a run made before bundles were kept).
  if (evaluationPool().bundle().sha256 === wanted) await keepCurrentEvaluationBundle();
  const bytes = await readKeptEvaluationBundle(wanted);
  if (!bytes)
    throw refuse(
      "the bundle is not kept",
      `The evaluation bundle that made this run (sha256 ${short(wanted)}) is not kept in file storage: the run was made ` +
        "by a release of Gusset before bundles were kept. It cannot be reproduced as issued; reproduce it with today's bundle instead.",
    );
  const found = sha256Hex(bytes);
  if (found !== wanted)
    throw refuse(
      "the stored bundle's bytes do not match its sha256",
      `The evaluation bundle kept under sha256 ${short(wanted)} no longer has those bytes (they hash to ${short(found)}): ` +
        "it was altered in file storage, so the run was not evaluated with it. Tell the firm's admin; the run's record itself is unchanged.",
    );
  return runWithBundleBytes(bytes, wanted, task);
}

export const reproduceRun = defineUseCase({
  name: "runs.reproduce",
  permission: "runs.reproduce",
  input: reproduceRunSchema,
  prepare: async ({ id, mode }): Promise<Reproduction> => {
    const run = await getRun(id);
    if (!run) throw new AppError("not-found", "There is no run with that id.");
    const record = readRunRecord(run.record);
    const version = (await getVersion({ id: run.versionId }))!;
    const hashed = await contentHash(version.source);
    if (!hashed.ok || hashed.hash !== record.standard.contentHash)
      throw new ReproductionRefused(
        `The stored text of version ${version.number} of ${version.title} no longer hashes to the content hash the run ` +
          "recorded, so the run was not evaluated again. Tell the firm's admin.",
        {
          runId: run.id,
          mode,
          bundleSha256: mode === "as-issued" ? record.identity.bundleSha256 : evaluationPool().bundle().sha256,
          reason: "the version's text does not match its content hash",
        },
      );
    // The versions the record names; a library it names none of (a failed run) at the version's pin.
    const pinned = pinnedVersions(await libraryPinsOf(version)).pinned;
    const libraries = await libraryEntriesFor(version.source, picksOf(record), {
      asRun: { ...pinned, ...libraryVersionsOf(record) },
    });
    const task = { source: version.source, inputs: record.typed, libraries };
    const pool = evaluationPool();
    const answer = mode === "as-issued" ? await asIssued(record, task) : await pool.run(task.source, task.inputs, libraries);
    if (!answer.ok) throw new AppError("unavailable", answer.message);
    return {
      runId: run.id,
      mode,
      bundleSha256: mode === "as-issued" ? record.identity.bundleSha256 : pool.bundle().sha256,
      comparison: compareReproduction(record, answer.result),
    };
  },
  run: async (_input, { prepared }) => prepared,
  audit: ({ result }) => ({
    action: "runs.reproduce",
    subject: `run:${result.runId}`,
    details: {
      runId: result.runId,
      mode: result.mode,
      bundleSha256: result.bundleSha256,
      identical: result.comparison.identical,
      differing: result.comparison.differing,
    },
  }),
  auditFailure: ({ error }) =>
    error instanceof ReproductionRefused
      ? { action: "runs.reproduce.refused", subject: `run:${error.refused.runId}`, details: error.refused }
      : null,
});
