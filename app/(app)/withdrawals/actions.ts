"use server";
// After a withdrawal, from its impact report: a lead names the successor (when it was not named with the
// withdrawal) and starts the batch re-run; a lead or the job's responsible
// engineer signs the outcome of an affected calc revision. The report is refreshed once the change has committed.
import { revalidatePath } from "next/cache";
import { serverAction } from "@/lib/use-cases/next";
import { startBatch } from "@/lib/use-cases/batch-reruns";
import { declareSuccessor, recordOutcome } from "@/lib/use-cases/withdrawals";

const refresh = ({ withdrawalId }: { withdrawalId: string }) => revalidatePath(`/withdrawals/${withdrawalId}`);

export const startBatchAction = serverAction(startBatch, { then: refresh });
export const declareSuccessorAction = serverAction(declareSuccessor, { then: refresh });
export const recordOutcomeAction = serverAction(recordOutcome, { then: refresh });
