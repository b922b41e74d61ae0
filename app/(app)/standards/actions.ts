"use server";
// The standards' lifecycle as forms. Each action is a use case (lib/use-cases/standards.ts); the pages
// concerned are refreshed, or the person is taken to where the next step happens, once the change has
// committed.
import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { serverAction } from "@/lib/use-cases/next";
import {
  approveAndPublish,
  createStandard,
  discardDraft,
  returnDraft,
  saveDraft,
  startDraft,
  submitDraft,
  withdrawVersion,
} from "@/lib/use-cases/standards";

const refreshStandards = () => revalidatePath("/standards", "layout");

export const createStandardAction = serverAction(createStandard, {
  then: ({ draftId }) => redirect(`/standards/drafts/${draftId}`),
});

export const startDraftAction = serverAction(startDraft, {
  then: ({ draftId }) => redirect(`/standards/drafts/${draftId}`),
});

export const saveDraftAction = serverAction(saveDraft, { then: refreshStandards });

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

export const withdrawVersionAction = serverAction(withdrawVersion, { then: refreshStandards });
