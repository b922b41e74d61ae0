"use client";
// What an admin or lead does from a published version: start a new draft from it, withdraw it (a reason is
// required; it stays on record, with every run made with it), or withdraw one entry of it (a wrong value), which
// leaves the rest of the version in use.
import Link from "next/link";
import { startTransition, useActionState, useState } from "react";
import { Button } from "@/components/ui/button";
import { SelectField, TextField } from "@/components/ui/field";
import { FormError, Notice } from "@/components/ui/notice";
import { actionErrors } from "@/components/action-errors";
import { StartDraftButton } from "@/components/drafts/start-draft-button";
import { startLibraryDraftAction, withdrawLibraryEntryAction, withdrawLibraryVersionAction } from "../actions";

/** Starts a draft holding this version's entries; the draft opens in the editor. */
export function StartLibraryDraftButton({ versionId, number }: { versionId: string; number: number }) {
  return (
    <StartDraftButton
      action={startLibraryDraftAction}
      versionId={versionId}
      label={`Start a new draft from version ${number}`}
      testId="start-library-draft"
    />
  );
}

/**
 * Withdraws the version, or one of its entries: chosen from `entryKeys`, or the one `entryKeys` names when it
 * holds one key only. No new run may use what is withdrawn; the impact report lists the runs that did.
 */
export function WithdrawLibraryForm({
  versionId,
  number,
  entryKeys,
  readsReports,
}: {
  versionId: string;
  number: number;
  /** Absent to withdraw the whole version. */
  entryKeys?: string[];
  /** Whether this person reads impact reports (those who read runs): else the report is named, not linked. */
  readsReports: boolean;
}) {
  const [versionState, withdrawVersion, versionPending] = useActionState(withdrawLibraryVersionAction, null);
  const [entryState, withdrawEntry, entryPending] = useActionState(withdrawLibraryEntryAction, null);
  const [reason, setReason] = useState("");
  const [replacementKey, setReplacementKey] = useState("");
  const [entryKey, setEntryKey] = useState(entryKeys?.[0] ?? "");
  const whole = entryKeys === undefined;
  const state = whole ? versionState : entryState;
  const server = actionErrors(state, ["reason", "entryKey", "replacementKey"]);
  const testId = whole ? "withdraw-version" : "withdraw-entry";
  const report = (withdrawalId: string) =>
    readsReports ? (
      <Link href={`/withdrawals/${withdrawalId}`} className="underline" data-testid="impact-report-link">
        Impact report
      </Link>
    ) : (
      <span data-testid="impact-report-note">Its impact report is read by the leads, engineers and auditors.</span>
    );
  if (versionState?.ok)
    return (
      <Notice tone="pass">
        Version {number} is withdrawn. {report(versionState.data.withdrawalId)}
      </Notice>
    );
  if (entryState?.ok)
    return (
      <Notice tone="pass" testId={`${testId}-done`}>
        {entryState.data.entryKey} is withdrawn from version {number}. {report(entryState.data.withdrawalId)}
      </Notice>
    );
  return (
    <form
      noValidate
      className="max-w-xl space-y-3"
      data-testid={`${testId}-form`}
      onSubmit={(event) => {
        event.preventDefault();
        startTransition(() =>
          whole
            ? withdrawVersion({ versionId, reason, replacementKey })
            : withdrawEntry({ versionId, entryKey, reason, replacementKey }),
        );
      }}
    >
      <p className="text-sm text-ink-700">
        {whole
          ? "A withdrawn version can no longer be used in a new run. It stays on record, with every run made with it."
          : "A withdrawn entry can no longer be used in a new run; the rest of the version stays in use."}
      </p>
      <FormError message={server.form} />
      {entryKeys && entryKeys.length > 1 ? (
        <SelectField
          label="Entry to withdraw"
          value={entryKey}
          onChange={(event) => setEntryKey(event.target.value)}
          error={server.field.entryKey}
          data-testid={`${testId}-key`}
        >
          {entryKeys.map((key) => (
            <option key={key} value={key}>
              {key}
            </option>
          ))}
        </SelectField>
      ) : null}
      <TextField
        label={whole ? "Why is the version withdrawn?" : "Why is the entry withdrawn (which value is wrong)?"}
        value={reason}
        onChange={(event) => setReason(event.target.value)}
        error={server.field.reason}
        data-testid={`${testId}-reason`}
      />
      <TextField
        label="Entry that replaces it (optional)"
        hint="A re-run of each affected run takes this entry instead; the impact report starts the batch."
        value={replacementKey}
        onChange={(event) => setReplacementKey(event.target.value)}
        error={server.field.replacementKey}
        data-testid={`${testId}-replacement`}
      />
      <Button
        type="submit"
        variant="danger"
        pending={whole ? versionPending : entryPending}
        pendingLabel="Withdrawing…"
        data-testid={`${testId}-submit`}
      >
        {whole ? `Withdraw version ${number}` : entryKeys.length === 1 ? `Withdraw ${entryKey}` : "Withdraw the entry"}
      </Button>
    </form>
  );
}
