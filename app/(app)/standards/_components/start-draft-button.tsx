"use client";

import { StartDraftButton as StartFrom } from "@/components/drafts/start-draft-button";
import { startDraftAction } from "../actions";

/** Starts a draft with this version's source; the draft opens in the editor. */
export function StartDraftButton({ versionId, number }: { versionId: string; number: number }) {
  return (
    <StartFrom action={startDraftAction} versionId={versionId} label={`Start a draft from v${number}`} testId="start-draft" />
  );
}
