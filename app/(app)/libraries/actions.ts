"use server";
// The libraries' lifecycle as forms. Each action is a use case (lib/use-cases/libraries.ts); the pages
// concerned are refreshed, or the person is taken to where the next step happens, once the change has
// committed.
import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { serverAction } from "@/lib/use-cases/next";
import {
  approveAndPublishLibrary,
  createLibrary,
  discardLibraryDraft,
  returnLibraryDraft,
  saveLibraryDraft,
  startLibraryDraft,
  submitLibraryDraft,
  withdrawLibraryEntry,
  withdrawLibraryVersion,
} from "@/lib/use-cases/libraries";

const refreshLibraries = () => revalidatePath("/libraries", "layout");
const toDraft = ({ draftId }: { draftId: string }) => redirect(`/libraries/drafts/${draftId}`);

export const createLibraryAction = serverAction(createLibrary, { then: toDraft });

export const startLibraryDraftAction = serverAction(startLibraryDraft, { then: toDraft });

export const saveLibraryDraftAction = serverAction(saveLibraryDraft, { then: refreshLibraries });

export const submitLibraryDraftAction = serverAction(submitLibraryDraft, { then: refreshLibraries });

export const discardLibraryDraftAction = serverAction(discardLibraryDraft, {
  then: () => {
    refreshLibraries();
    redirect("/libraries");
  },
});

export const returnLibraryDraftAction = serverAction(returnLibraryDraft, { then: refreshLibraries });

export const approveAndPublishLibraryAction = serverAction(approveAndPublishLibrary, {
  then: ({ slug, number }) => {
    refreshLibraries();
    redirect(`/libraries/${slug}/versions/${number}`);
  },
});

export const withdrawLibraryVersionAction = serverAction(withdrawLibraryVersion, { then: refreshLibraries });

export const withdrawLibraryEntryAction = serverAction(withdrawLibraryEntry, { then: refreshLibraries });
