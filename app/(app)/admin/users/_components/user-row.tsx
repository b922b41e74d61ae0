"use client";

import { startTransition, useActionState, useEffect, useRef, useState } from "react";
import { ROLES, ROLE_LABELS, type Role } from "@/lib/domain/roles";
import type { ActionState } from "@/lib/domain/action-state";
import type { UserDto } from "@/lib/data/users";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { deactivateUserAction, reactivateUserAction, setUserRoleAction } from "../actions";

/** Calls onAnswer once per new answer from the server (onAnswer is a fresh closure on every render). */
function useLatestAnswer(state: ActionState<unknown>, onAnswer: (errorMessage: string | null) => void) {
  const callback = useRef(onAnswer);
  useEffect(() => {
    callback.current = onAnswer;
  });
  useEffect(() => {
    if (state) callback.current(state.ok ? null : state.error.message);
  }, [state]);
}

export type RowControls = { setRole: boolean; deactivate: boolean };

// One person in the people table, with the controls the viewer's role allows. The server checks
// again on every action; an error it returns is shown on this row, next to what caused it.
export function UserRow({ person, controls, isSelf }: { person: UserDto; controls: RowControls; isSelf: boolean }) {
  const [roleState, changeRole, changingRole] = useActionState(setUserRoleAction, null);
  const [deactivateState, deactivate, deactivating] = useActionState(deactivateUserAction, null);
  const [reactivateState, reactivate, reactivating] = useActionState(reactivateUserAction, null);
  const [role, setRole] = useState<Role>(person.role);
  const [confirming, setConfirming] = useState(false);

  // Only the answer to the latest action is shown, so an old refusal does not linger after a success.
  const [error, setError] = useState<string | null>(null);
  useLatestAnswer(roleState, setError);
  useLatestAnswer(reactivateState, setError);
  useLatestAnswer(deactivateState, (message) => {
    setError(message);
    if (!message) setConfirming(false);
  });
  const active = person.status === "active";

  return (
    <tr
      data-testid="user-row"
      data-email={person.email}
      data-status={person.status}
      data-role={person.role}
      className="align-top"
    >
      <td className="px-4 py-3">
        <span className="font-medium whitespace-nowrap text-ink-900">{person.name}</span>
        {isSelf ? <span className="ml-2 text-xs text-ink-400">(you)</span> : null}
      </td>
      <td className="px-4 py-3 whitespace-nowrap text-ink-700">{person.email}</td>
      <td className="px-4 py-3">
        {controls.setRole ? (
          <form
            className="flex items-center gap-2"
            onSubmit={(event) => {
              event.preventDefault();
              startTransition(() => changeRole({ userId: person.id, role }));
            }}
          >
            <label className="sr-only" htmlFor={`role-${person.id}`}>
              Role of {person.name}
            </label>
            <select
              id={`role-${person.id}`}
              data-testid="user-role-select"
              value={role}
              onChange={(event) => setRole(event.target.value as Role)}
              className="rounded-plate bg-paper-raised py-1.5 pr-8 pl-2 text-sm ring-1 ring-ink-300 ring-inset focus:ring-2 focus:ring-plate-500 focus:outline-none"
            >
              {ROLES.map((value) => (
                <option key={value} value={value}>
                  {ROLE_LABELS[value]}
                </option>
              ))}
            </select>
            {role !== person.role ? (
              <Button type="submit" size="sm" pending={changingRole} pendingLabel="Saving…" data-testid="user-role-save">
                Save role
              </Button>
            ) : null}
          </form>
        ) : (
          <span className="text-ink-700">{ROLE_LABELS[person.role]}</span>
        )}
      </td>
      <td className="px-4 py-3">
        <Badge tone={active ? "pass" : "neutral"} testId="user-status">
          {active ? "Active" : "Deactivated"}
        </Badge>
      </td>
      <td className="px-4 py-3 text-right">
        {controls.deactivate && active && !confirming ? (
          <Button variant="danger" size="sm" onClick={() => setConfirming(true)} data-testid="user-deactivate">
            Deactivate
          </Button>
        ) : null}
        {controls.deactivate && active && confirming ? (
          <div className="flex flex-wrap items-center justify-end gap-2">
            <span className="text-xs text-ink-500">Ends their sessions now.</span>
            <Button
              variant="danger"
              size="sm"
              pending={deactivating}
              pendingLabel="Deactivating…"
              data-testid="user-deactivate-confirm"
              onClick={() => startTransition(() => deactivate({ userId: person.id }))}
            >
              Deactivate {person.name.split(" ")[0]}
            </Button>
            <Button variant="quiet" size="sm" onClick={() => setConfirming(false)}>
              Cancel
            </Button>
          </div>
        ) : null}
        {controls.deactivate && !active ? (
          <Button
            variant="secondary"
            size="sm"
            pending={reactivating}
            pendingLabel="Reactivating…"
            data-testid="user-reactivate"
            onClick={() => startTransition(() => reactivate({ userId: person.id }))}
          >
            Reactivate
          </Button>
        ) : null}
        {error ? (
          <p role="alert" data-testid="user-row-error" className="mt-2 max-w-xs text-left text-sm text-fault-700">
            {error}
          </p>
        ) : null}
      </td>
    </tr>
  );
}
