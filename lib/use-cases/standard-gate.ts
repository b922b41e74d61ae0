import "server-only";
// What a standard's source must pass before it is submitted for review and again before it is published:
// it compiles (names, units, expressions, narrative, a probe evaluation), it has verification cases, and
// every case passes on the current engine. CPU work on what a lead wrote, so it runs in the evaluation pool
// (lib/evaluation: worker threads with a hard timeout), from a use case's `prepare` step, outside the
// database transaction. The seed checks the repository's own starting standards in-process.
import { ENGINE_IDENTITY, engineIdentityLabel } from "@/lib/engine";
import { AppError } from "@/lib/domain/errors";
import { evaluationPool, type PoolFailure } from "@/lib/evaluation/pool";
import { compileTask, verifyTask } from "@/lib/evaluation/tasks";
import { contentHash } from "@/lib/standards/content-hash";
import { EVALUATION_VERSION } from "@/lib/standards/evaluate";
import type { SourceProblem } from "@/lib/standards/source";
import type { LibraryEntries } from "@/lib/standards/library-inputs";
import { libraryEntriesFor } from "./library-resolution";
import type { VerificationResult } from "@/lib/standards/verify";

export type SourceMetadata = { title: string; category: string; tags: string[]; summary: string };

export type SourceCheck = {
  /** Problems that stop the source compiling, each with its path, line and column. */
  problems: SourceProblem[];
  metadata: SourceMetadata | null;
  verification: VerificationResult[];
  /** sha256 of the canonical content; null when the file cannot be read. */
  hash: string | null;
  /** The engine and evaluation module the cases ran on. */
  verifiedWith: string;
};

export const VERIFIED_WITH = `engine ${engineIdentityLabel(ENGINE_IDENTITY)} · evaluation ${EVALUATION_VERSION}`;

/** A pool that could not finish: a sentence for the lead, with the status that fits. */
function poolRefusal(failure: PoolFailure): AppError {
  if (failure.reason === "busy") return new AppError("rate-limited", failure.message);
  return new AppError("invalid-input", failure.message, { fieldErrors: { source: [failure.message] } });
}

/** `libraries`: the entries the source's section and material inputs name; read from the firm's published libraries unless given. */
export async function checkSource(
  source: string,
  { inProcess = false, libraries }: { inProcess?: boolean; libraries?: LibraryEntries } = {},
): Promise<SourceCheck> {
  const hashed = await contentHash(source);
  const hash = hashed.ok ? hashed.hash : null;
  const pool = inProcess ? null : evaluationPool();
  const entries = libraries ?? (await libraryEntriesFor(source));
  const compiled = pool ? await pool.compile(source, entries) : { ok: true as const, result: compileTask(source, entries) };
  if (!compiled.ok) throw poolRefusal(compiled);
  if (!compiled.result.ok)
    return { problems: [...compiled.result.problems], metadata: null, verification: [], hash, verifiedWith: VERIFIED_WITH };
  const { summary } = compiled.result;
  const verified = pool ? await pool.verify(source, entries) : { ok: true as const, result: verifyTask(source, entries) };
  if (!verified.ok) throw poolRefusal(verified);
  if (!verified.result.ok)
    return { problems: [...verified.result.problems], metadata: null, verification: [], hash, verifiedWith: VERIFIED_WITH };
  return {
    problems: [],
    metadata: { title: summary.title, category: summary.category, tags: [...summary.tags], summary: summary.summary },
    verification: [...verified.result.results],
    hash,
    verifiedWith: VERIFIED_WITH,
  };
}

/** Why the source may not go forward (to review, or to publication), as sentences; empty when it may. */
export function gateRefusals(check: SourceCheck): string[] {
  if (check.problems.length > 0) {
    const first = check.problems[0];
    const where = first.line ? ` (line ${first.line}${first.column ? `, column ${first.column}` : ""})` : "";
    return [
      `The source has ${check.problems.length} problem${check.problems.length === 1 ? "" : "s"} to fix first, e.g. ${first.path ? `${first.path}: ` : ""}${first.message}${where}.`,
    ];
  }
  if (check.verification.length === 0)
    return ["Add at least one verification case (inputs, expected values and their published source) before submitting."];
  const failed = check.verification.filter((result) => !result.pass);
  return failed.map(
    (result) =>
      `Verification case “${result.name}” fails on the current engine: ${
        result.failure ??
        result.checks
          .filter((c) => !c.pass)
          .map((c) => `${c.target}: ${c.message ?? "outside tolerance"}`)
          .join("; ")
      }.`,
  );
}
