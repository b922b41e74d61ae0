import "server-only";
// Who may change a draft: its author, while it is being edited. Shared by the standards' use cases, the hand
// calculations attached to a draft's standard, and the libraries' drafts (lib/use-cases/library-check.ts).
import type { Actor } from "@/lib/domain/actor";
import { AppError } from "@/lib/domain/errors";
import { lockDraftOrThrow } from "@/lib/data/standards";

/** Refused to anyone but the author: the words every such refusal uses. */
export const NOT_THE_AUTHOR = "Only the draft's author edits it; start your own draft from the version instead.";

/** Throws, saying why, unless `actor` wrote the draft and it is still being edited. */
export function refuseUnlessOwnEditable(draft: { authorId: string; state: string }, actor: Actor): void {
  if (draft.authorId !== actor.id) throw new AppError("forbidden", NOT_THE_AUTHOR);
  if (draft.state !== "editing")
    throw new AppError(
      "conflict",
      draft.state === "in-review"
        ? "This draft is in review; it can be edited again if the reviewer returns it."
        : `This draft is ${draft.state} and can no longer be edited.`,
    );
}

/** The draft, locked, if `actor` wrote it and it is still being edited; else a refusal that says why. */
export async function ownEditableDraft(draftId: string, actor: Actor) {
  const draft = await lockDraftOrThrow(draftId);
  refuseUnlessOwnEditable(draft, actor);
  return draft;
}
