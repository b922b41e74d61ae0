"use server";
// The calc package's sign-off as forms (lib/use-cases/calcs.ts): numbering a calc, issuing a run as its next
// revision, checking it, approving it. The run's page (and its job's) are refreshed once the step has committed.
// Reproducing a run (lib/use-cases/reproduce.ts) from its trace, whose audit events then show the reproduction.
import { revalidatePath } from "next/cache";
import { serverAction } from "@/lib/use-cases/next";
import { approveRevision, checkRevision, createCalc, prepareRevision } from "@/lib/use-cases/calcs";
import { reproduceRun } from "@/lib/use-cases/reproduce";

const refresh = ({ runId }: { runId: string }) => {
  revalidatePath(`/runs/${runId}`);
  revalidatePath("/jobs", "layout");
};

export const createCalcAction = serverAction(createCalc, { then: () => revalidatePath("/runs", "layout") });
export const prepareRevisionAction = serverAction(prepareRevision, { then: refresh });
export const checkRevisionAction = serverAction(checkRevision, { then: refresh });
export const approveRevisionAction = serverAction(approveRevision, { then: refresh });
export const reproduceRunAction = serverAction(reproduceRun, {
  then: ({ runId }) => revalidatePath(`/runs/${runId}/trace`),
});
