"use server";
// The standards' lifecycle as forms. Each action is a use case (lib/use-cases/standards.ts); the pages
// concerned are refreshed, or the person is taken to where the next step happens, once the change has
// committed.
import { createElement, type ReactNode } from "react";
import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import type { ActionState } from "@/lib/domain/action-state";
import type { SourceProblem } from "@/lib/standards/source";
import { serverAction } from "@/lib/use-cases/next";
import {
  approveAndPublish,
  createStandard,
  discardDraft,
  previewSource,
  returnDraft,
  saveDraft,
  startDraft,
  submitDraft,
  withdrawVersion,
} from "@/lib/use-cases/standards";
import { PreviewContent } from "./drafts/[draftId]/_components/draft-preview";

const refreshStandards = () => revalidatePath("/standards", "layout");

export const createStandardAction = serverAction(createStandard, {
  then: ({ draftId }) => redirect(`/standards/drafts/${draftId}`),
});

export const startDraftAction = serverAction(startDraft, {
  then: ({ draftId }) => redirect(`/standards/drafts/${draftId}`),
});

export const saveDraftAction = serverAction(saveDraft, { then: refreshStandards });

const checkText = serverAction(previewSource);

/**
 * The editor's text, not saved: its problems (for the editor to place at their lines) and the preview rendered
 * on the server, as the saved draft's is. Nothing is stored.
 */
export const previewSourceAction = async (
  _previous: ActionState<{ problems: SourceProblem[]; preview: ReactNode }>,
  payload: { draftId: string; source: string },
): Promise<ActionState<{ problems: SourceProblem[]; preview: ReactNode }>> => {
  const state = await checkText(null, payload);
  if (!state?.ok) return state;
  const { check, preview } = state.data;
  return {
    ok: true,
    data: { problems: check.problems, preview: createElement(PreviewContent, { check, preview, which: "text" }) },
  };
};

export const submitDraftAction = serverAction(submitDraft, { then: refreshStandards });

export const discardDraftAction = serverAction(discardDraft, {
  then: () => {
    refreshStandards();
    redirect("/standards");
  },
});

export const returnDraftAction = serverAction(returnDraft, { then: refreshStandards });

export const approveAndPublishAction = serverAction(approveAndPublish, {
  then: ({ slug, number }) => {
    refreshStandards();
    redirect(`/standards/${slug}/versions/${number}`);
  },
});

// Withdrawn: to its impact report, where the affected runs, calcs and people are listed.
export const withdrawVersionAction = serverAction(withdrawVersion, {
  then: ({ withdrawalId }) => {
    refreshStandards();
    revalidatePath("/runs", "layout");
    redirect(`/withdrawals/${withdrawalId}`);
  },
});
