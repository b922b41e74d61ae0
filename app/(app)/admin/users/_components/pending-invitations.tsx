"use client";

import { useRef, useState, useTransition } from "react";
import { ROLE_LABELS } from "@/lib/domain/roles";
import type { InvitationDto } from "@/lib/data/invitations";
import { Button } from "@/components/ui/button";
import { formatDate } from "@/components/format-date";
import { revokeInvitationAction } from "../actions";

// A cancelled invitation's row goes away with the refreshed page, and focus with it; the list keeps a
// message saying what happened and takes focus there, so keyboard and screen-reader users are not
// dropped at the top of the page.
export function PendingInvitations({ invitations, canCancel }: { invitations: InvitationDto[]; canCancel: boolean }) {
  const [cancelled, setCancelled] = useState<string | null>(null);
  const messageRef = useRef<HTMLParagraphElement>(null);
  const onCancelled = (email: string) => {
    setCancelled(email);
    // After React has drawn the message (and the refreshed list without the row).
    requestAnimationFrame(() => messageRef.current?.focus());
  };
  return (
    <div className="space-y-3">
      <p
        ref={messageRef}
        tabIndex={-1}
        role="status"
        data-testid="invitation-cancelled"
        className={cancelled ? "text-sm text-pass-700" : "sr-only"}
      >
        {cancelled ? `Invitation to ${cancelled} cancelled. The link in it no longer works.` : ""}
      </p>
      {invitations.length === 0 ? (
        <p className="text-sm text-ink-500" data-testid="no-pending-invitations">
          No invitations are waiting to be accepted.
        </p>
      ) : (
        <ul
          className="divide-y divide-ink-100 rounded-plate bg-paper-raised shadow-sheet ring-1 ring-ink-200"
          data-testid="pending-invitations"
        >
          {invitations.map((invitation) => (
            <PendingInvitation key={invitation.id} invitation={invitation} canCancel={canCancel} onCancelled={onCancelled} />
          ))}
        </ul>
      )}
    </div>
  );
}

function PendingInvitation({
  invitation,
  canCancel,
  onCancelled,
}: {
  invitation: InvitationDto;
  canCancel: boolean;
  onCancelled: (email: string) => void;
}) {
  const [pending, startTransition] = useTransition();
  const [error, setError] = useState<string | null>(null);
  const cancel = () =>
    startTransition(async () => {
      const answer = await revokeInvitationAction(null, { invitationId: invitation.id });
      if (answer?.ok) onCancelled(invitation.email);
      else setError(answer ? answer.error.message : null);
    });
  return (
    <li
      className="flex flex-wrap items-center justify-between gap-3 px-4 py-3"
      data-testid="pending-invitation"
      data-email={invitation.email}
    >
      <div className="min-w-0">
        <p className="text-sm font-medium text-ink-900">
          {invitation.name} <span className="font-normal text-ink-500">· {ROLE_LABELS[invitation.role]}</span>
        </p>
        <p className="text-xs break-all text-ink-500">
          {invitation.email} · sent {formatDate(invitation.createdAt)} · expires {formatDate(invitation.expiresAt)}
        </p>
        {error ? (
          <p role="alert" className="mt-1 text-sm text-fault-700">
            {error}
          </p>
        ) : null}
      </div>
      {canCancel ? (
        <Button
          variant="quiet"
          size="sm"
          pending={pending}
          pendingLabel="Cancelling…"
          data-testid="invitation-cancel"
          aria-label={`Cancel invitation to ${invitation.email}`}
          onClick={cancel}
        >
          Cancel invitation
        </Button>
      ) : null}
    </li>
  );
}
