// The inputs and proofs of work for the server actions after a withdrawal (app/(app)/withdrawals/actions.ts), for
// both access matrices: each call gets a standard of its own (two versions, by two leads made for it), a job whose
// responsible engineer is made for it, a run of v1 issued and checked as a calc revision, and v1 withdrawn with v2
// as its successor. The caller is never the job's responsible engineer.
import { expect } from "vitest";
import { eq } from "drizzle-orm";
import { db } from "@/db";
import * as schema from "@/db/schema";
import { runUseCase } from "@/lib/use-cases/run";
import { withdrawVersion } from "@/lib/use-cases/standards";
import { checkRevision, createCalc, prepareRevision } from "@/lib/use-cases/calcs";
import { createTestUser } from "./people";
import { jobFor, runIn, standardWithTwoVersions } from "./withdrawal-fixtures";
import type { ActionFixture } from "./action-fixtures";

const file = "app/(app)/withdrawals/actions.ts";

/** v1 withdrawn with v2 named, one run of it issued as C-001 rev A and checked. */
export async function matrixWithdrawal() {
  const { v1, v2, author } = await standardWithTwoVersions("matrix-wd");
  const [{ actor: engineer }, { actor: checker }, { actor: responsible }] = await Promise.all([
    createTestUser({ role: "engineer", label: "matrix-wd-eng" }),
    createTestUser({ role: "engineer", label: "matrix-wd-checker" }),
    createTestUser({ role: "engineer", label: "matrix-wd-resp" }),
  ]);
  const job = await jobFor(engineer, responsible);
  const run = await runIn(engineer, job.jobId, v1);
  const { calcId } = await runUseCase(createCalc, {
    actor: engineer,
    input: { jobId: job.jobId, number: "C-001", title: "Beam" },
  });
  const { revisionId } = await runUseCase(prepareRevision, {
    actor: engineer,
    input: { calcId, runId: run.id, checkerId: checker.id, issueStatus: "for-construction" },
  });
  await runUseCase(checkRevision, { actor: checker, input: { revisionId, decision: "approve" } });
  const { withdrawalId } = await runUseCase(withdrawVersion, {
    actor: author,
    input: {
      versionId: v1,
      reason: "For the matrix.",
      successorVersionId: v2,
      mapping: { rename: { w: "q" }, values: { w_add: "0 kN/m" } },
    },
  });
  return { withdrawalId, revisionId, run, job, responsible };
}

export const WITHDRAWAL_ACTION_FIXTURES: Record<string, () => Promise<ActionFixture>> = {
  [`${file}#declareSuccessorAction`]: async () => {
    const { v1, v2, author } = await standardWithTwoVersions("matrix-wd-later");
    const { withdrawalId } = await runUseCase(withdrawVersion, {
      actor: author,
      input: { versionId: v1, reason: "For the matrix." },
    });
    return {
      input: { withdrawalId, successorVersionId: v2, mapping: { rename: { w: "q" }, values: { w_add: "0 kN/m" } } },
      succeeded: async (answer) => {
        expect(answer).toEqual({
          state: { ok: true, data: { withdrawalId, label: expect.stringMatching(/ v1$/), successor: 2 } },
        });
        const rows = await db
          .select()
          .from(schema.withdrawalMappings)
          .where(eq(schema.withdrawalMappings.withdrawalId, withdrawalId));
        expect(rows.map((r) => [r.successorVersionId, r.mapping])).toEqual([
          [v2, { rename: { w: "q" }, values: { w_add: "0 kN/m" }, drop: [] }],
        ]);
      },
    };
  },
  [`${file}#startBatchAction`]: async () => {
    const { withdrawalId, run } = await matrixWithdrawal();
    return {
      input: { withdrawalId },
      succeeded: async (answer) => {
        expect(answer).toMatchObject({ state: { ok: true, data: { withdrawalId, runs: 1 } } });
        const batches = await db.select().from(schema.rerunBatches).where(eq(schema.rerunBatches.withdrawalId, withdrawalId));
        expect(batches.map((b) => b.total)).toEqual([1]);
        // The worker re-runs it; wait, so that no later cell sees its rows arrive.
        const deadline = Date.now() + 30_000;
        for (;;) {
          const items = await db.select().from(schema.rerunBatchItems).where(eq(schema.rerunBatchItems.batchId, batches[0].id));
          if (items.length === 1) {
            expect(items[0]).toMatchObject({ originalRunId: run.id, status: "succeeded" });
            break;
          }
          if (Date.now() > deadline) throw new Error("the batch's one re-run did not finish in 30 s");
          await new Promise((resolve) => setTimeout(resolve, 200));
        }
      },
    };
  },
  [`${file}#recordOutcomeAction`]: async () => {
    const { withdrawalId, revisionId, job } = await matrixWithdrawal();
    return {
      input: { withdrawalId, revisionId, outcome: "no-action", reason: "Signed by the access matrix." },
      // A lead signs any; an engineer only for a job they are responsible engineer of, which no matrix caller is.
      succeeded: async (answer) => {
        const rows = await db
          .select()
          .from(schema.withdrawalOutcomes)
          .where(eq(schema.withdrawalOutcomes.revisionId, revisionId));
        if ("state" in answer && answer.state?.ok) {
          expect(answer).toMatchObject({ state: { ok: true, data: { withdrawalId, revisionId, outcome: "no-action" } } });
          expect(rows.map((r) => [r.kind, r.reason])).toEqual([["no-action", "Signed by the access matrix."]]);
          return;
        }
        expect(answer).toEqual({
          state: {
            ok: false,
            error: {
              code: "forbidden",
              message: `Only a standards lead or the responsible engineer of job ${job.jobNumber} records the outcome for C-001.`,
            },
          },
        });
        expect(rows).toEqual([]);
      },
    };
  },
};
