"use client";

import { startTransition, useActionState } from "react";
import { ROLE_LABELS } from "@/lib/domain/roles";
import type { InvitationDto } from "@/lib/data/invitations";
import { Button } from "@/components/ui/button";
import { formatDate } from "@/components/format-date";
import { revokeInvitationAction } from "../actions";

export function PendingInvitations({ invitations, canRevoke }: { invitations: InvitationDto[]; canRevoke: boolean }) {
  if (invitations.length === 0) {
    return (
      <p className="text-sm text-ink-500" data-testid="no-pending-invitations">
        No invitations are waiting to be accepted.
      </p>
    );
  }
  return (
    <ul
      className="divide-y divide-ink-100 rounded-plate bg-paper-raised shadow-sheet ring-1 ring-ink-200"
      data-testid="pending-invitations"
    >
      {invitations.map((invitation) => (
        <PendingInvitation key={invitation.id} invitation={invitation} canRevoke={canRevoke} />
      ))}
    </ul>
  );
}

function PendingInvitation({ invitation, canRevoke }: { invitation: InvitationDto; canRevoke: boolean }) {
  const [state, revoke, pending] = useActionState(revokeInvitationAction, null);
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
        <p className="truncate text-xs text-ink-500">
          {invitation.email} · sent {formatDate(invitation.createdAt)} · expires {formatDate(invitation.expiresAt)}
        </p>
        {state && !state.ok ? (
          <p role="alert" className="mt-1 text-sm text-fault-700">
            {state.error.message}
          </p>
        ) : null}
      </div>
      {canRevoke ? (
        <Button
          variant="quiet"
          size="sm"
          pending={pending}
          pendingLabel="Withdrawing…"
          data-testid="invitation-revoke"
          onClick={() => startTransition(() => revoke({ invitationId: invitation.id }))}
        >
          Withdraw
        </Button>
      ) : null}
    </li>
  );
}
