"use client";
// A run's sign-off on its page: the calc revisions it is the design of record for, each with its steps, and the
// one step the person looking may take (issue it, check it, approve it). The server decides who may; the forms
// only show where a step is theirs to take.
import { startTransition, useActionState, useState } from "react";
import type { CalcDto, CalcRevisionDto } from "@/lib/data/calcs";
import { ISSUE_STATUS_IDS, ISSUE_STATUS_LABELS, type IssueStatusId } from "@/lib/domain/schemas/calcs";
import { Button } from "@/components/ui/button";
import { SelectField, TextField } from "@/components/ui/field";
import { FormError, Notice } from "@/components/ui/notice";
import { actionErrors } from "@/components/action-errors";
import { LocalTime } from "@/components/local-time";
import { approveRevisionAction, checkRevisionAction, createCalcAction, prepareRevisionAction } from "../actions";

type Revision = CalcRevisionDto & { calcNumber: string; calcTitle: string };
type Person = { id: string; name: string };

const STATE_WORDS: Record<CalcRevisionDto["state"], string> = {
  "awaiting-check": "waiting for its check",
  returned: "returned with comments",
  "awaiting-approval": "checked, waiting for approval",
  approved: "approved",
};
const EVENT_WORDS: Record<string, string> = {
  prepared: "Prepared",
  checked: "Checked",
  returned: "Returned",
  approved: "Approved",
  status: "Issue status changed",
  superseded: "Superseded",
};

export function RevisionSteps({ revision }: { revision: Revision }) {
  return (
    <div
      className="rounded-plate bg-paper-raised p-3 ring-1 ring-ink-200"
      data-testid="calc-revision"
      data-state={revision.state}
    >
      <p className="font-medium text-ink-900">
        {revision.calcNumber} rev {revision.letter} · {revision.calcTitle}
      </p>
      <p className="text-sm text-ink-700">
        {revision.issueStatus ? ISSUE_STATUS_LABELS[revision.issueStatus as IssueStatusId] : "—"}, {STATE_WORDS[revision.state]}.
        Checker: {revision.checkerName}.
      </p>
      <ol className="mt-2 space-y-1 text-sm" data-testid="calc-revision-steps">
        {revision.events.map((event, k) => (
          <li key={k} className="text-ink-700">
            <span className="font-medium text-ink-900">{EVENT_WORDS[event.kind] ?? event.kind}</span> by {event.actorName ?? "—"},{" "}
            <LocalTime iso={event.occurredAt} />
            {event.note ? <span className="block text-ink-500">“{event.note}”</span> : null}
            {event.reason ? <span className="block text-warn-700">Reason: {event.reason}</span> : null}
          </li>
        ))}
      </ol>
    </div>
  );
}

export function CheckForm({ revisionId }: { revisionId: string }) {
  const [state, check, pending] = useActionState(checkRevisionAction, null);
  const [note, setNote] = useState("");
  const server = actionErrors(state, ["note"]);
  if (state?.ok) return <Notice tone="pass">Recorded.</Notice>;
  const send = (decision: "approve" | "return") => startTransition(() => check({ revisionId, decision, note }));
  return (
    <form noValidate className="mt-3 max-w-xl space-y-3" data-testid="check-form" onSubmit={(e) => e.preventDefault()}>
      <FormError message={server.form} />
      <TextField
        label="Comments (needed to return it)"
        value={note}
        onChange={(e) => setNote(e.target.value)}
        error={server.field.note}
        data-testid="check-note"
      />
      <div className="flex gap-2">
        <Button type="button" pending={pending} onClick={() => send("approve")} data-testid="check-approve">
          Checked
        </Button>
        <Button type="button" variant="secondary" onClick={() => send("return")} data-testid="check-return">
          Return with comments
        </Button>
      </div>
    </form>
  );
}

export function ApproveForm({ revisionId, needsReason }: { revisionId: string; needsReason: string | null }) {
  const [state, approve, pending] = useActionState(approveRevisionAction, null);
  const [reason, setReason] = useState("");
  const server = actionErrors(state, ["reason"]);
  if (state?.ok) return <Notice tone="pass">Approved.</Notice>;
  return (
    <form
      noValidate
      className="mt-3 max-w-xl space-y-3"
      data-testid="approve-form"
      onSubmit={(e) => {
        e.preventDefault();
        startTransition(() => approve({ revisionId, ...(reason ? { reason } : {}) }));
      }}
    >
      <FormError message={server.form} />
      {needsReason ? <Notice tone="warn">A reason is needed: {needsReason}.</Notice> : null}
      <TextField
        label={needsReason ? "Reason for approving" : "Reason (optional)"}
        value={reason}
        onChange={(e) => setReason(e.target.value)}
        error={server.field.reason}
        data-testid="approve-reason"
      />
      <Button type="submit" pending={pending} pendingLabel="Approving…" data-testid="approve-submit">
        Approve as responsible engineer
      </Button>
    </form>
  );
}

export function IssueForm({ jobId, runId, calcs, people }: { jobId: string; runId: string; calcs: CalcDto[]; people: Person[] }) {
  const [calcState, newCalc, creating] = useActionState(createCalcAction, null);
  const [state, issue, pending] = useActionState(prepareRevisionAction, null);
  const [calcId, setCalcId] = useState(calcs[0]?.id ?? "");
  const [checkerId, setCheckerId] = useState("");
  const [issueStatus, setIssueStatus] = useState("for-approval");
  const [number, setNumber] = useState("");
  const [title, setTitle] = useState("");
  const server = actionErrors(state, ["calcId", "checkerId", "issueStatus"]);
  const calcErrors = actionErrors(calcState, ["number", "title"]);
  if (state?.ok)
    return (
      <Notice tone="pass" testId="issued">
        Issued as {state.data.calc} rev {state.data.letter}, for {state.data.checkerName} to check.
      </Notice>
    );
  return (
    <div className="space-y-6">
      {calcs.length > 0 ? (
        <form
          noValidate
          className="max-w-xl space-y-3"
          data-testid="issue-form"
          onSubmit={(e) => {
            e.preventDefault();
            startTransition(() =>
              issue({ calcId: calcId || calcs[0]?.id || "", runId, checkerId, issueStatus: issueStatus as "for-approval" }),
            );
          }}
        >
          <FormError message={server.form} />
          <SelectField
            label="Calc"
            value={calcId}
            onChange={(e) => setCalcId(e.target.value)}
            error={server.field.calcId}
            data-testid="issue-calc"
          >
            {calcs.map((calc) => (
              <option key={calc.id} value={calc.id}>
                {calc.number} · {calc.title}
              </option>
            ))}
          </SelectField>
          <SelectField
            label="Checker"
            hint="An engineer or lead other than you."
            value={checkerId}
            onChange={(e) => setCheckerId(e.target.value)}
            error={server.field.checkerId}
            data-testid="issue-checker"
          >
            <option value="">Choose…</option>
            {people.map((person) => (
              <option key={person.id} value={person.id}>
                {person.name}
              </option>
            ))}
          </SelectField>
          <SelectField
            label="Issue status"
            value={issueStatus}
            onChange={(e) => setIssueStatus(e.target.value)}
            data-testid="issue-status"
          >
            {ISSUE_STATUS_IDS.filter((s) => s !== "superseded").map((s) => (
              <option key={s} value={s}>
                {ISSUE_STATUS_LABELS[s]}
              </option>
            ))}
          </SelectField>
          <Button type="submit" pending={pending} pendingLabel="Issuing…" data-testid="issue-submit">
            Issue for checking
          </Button>
        </form>
      ) : null}
      <form
        noValidate
        className="max-w-xl space-y-3"
        data-testid="new-calc-form"
        onSubmit={(e) => {
          e.preventDefault();
          startTransition(() => newCalc({ jobId, number, title }));
        }}
      >
        <p className="text-sm text-ink-700">
          {calcs.length > 0 ? "Or number a new calc for this job:" : "Number a calc for this job first:"}
        </p>
        <FormError message={calcErrors.form} />
        <div className="grid gap-3 sm:grid-cols-[8rem_minmax(0,1fr)]">
          <TextField
            label="Calc number"
            value={number}
            onChange={(e) => setNumber(e.target.value)}
            error={calcErrors.field.number}
            data-testid="calc-number"
          />
          <TextField
            label="What it covers"
            value={title}
            onChange={(e) => setTitle(e.target.value)}
            error={calcErrors.field.title}
            data-testid="calc-title"
          />
        </div>
        <Button type="submit" variant="secondary" pending={creating} pendingLabel="Saving…" data-testid="calc-submit">
          Number the calc
        </Button>
      </form>
    </div>
  );
}
