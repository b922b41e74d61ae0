import "server-only";
// What a standard's source must pass before it is submitted for review and again before it is published:
// it compiles (names, units, expressions, narrative, a probe evaluation), it has verification cases, and
// every case passes on the current engine. Pure CPU work, run by a use case's `prepare` step, outside the
// database transaction.
import { ENGINE_IDENTITY, engineIdentityLabel } from "@/lib/engine";
import { compileStandard } from "@/lib/standards/compile";
import { contentHash } from "@/lib/standards/content-hash";
import { EVALUATION_VERSION } from "@/lib/standards/evaluate";
import type { SourceProblem } from "@/lib/standards/source";
import { runVerification, type VerificationResult } from "@/lib/standards/verify";

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

export const VERIFIED_WITH = `${engineIdentityLabel(ENGINE_IDENTITY)} · evaluation ${EVALUATION_VERSION}`;

export async function checkSource(source: string): Promise<SourceCheck> {
  const hashed = await contentHash(source);
  const hash = hashed.ok ? hashed.hash : null;
  const compiled = compileStandard(source);
  if (!compiled.ok) return { problems: compiled.problems, metadata: null, verification: [], hash, verifiedWith: VERIFIED_WITH };
  const { definition } = compiled.standard;
  return {
    problems: [],
    metadata: { title: definition.title, category: definition.category, tags: [...definition.tags], summary: definition.summary },
    verification: runVerification(compiled.standard),
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
