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

type FocusTarget = "role" | "deactivate" | "confirm" | "reactivate";

// One person in the people table, with the controls the viewer's role allows. The server checks
// again on every action; an error it returns is shown on this row, next to what caused it. After each
// action focus moves to the control that now stands where the used one was (a button that disappears
// would otherwise drop focus to the top of the page), and a status line says what happened.
export function UserRow({ person, controls, isSelf }: { person: UserDto; controls: RowControls; isSelf: boolean }) {
  const [roleState, changeRole, changingRole] = useActionState(setUserRoleAction, null);
  const [deactivateState, deactivate, deactivating] = useActionState(deactivateUserAction, null);
  const [reactivateState, reactivate, reactivating] = useActionState(reactivateUserAction, null);
  const [role, setRole] = useState<Role>(person.role);
  const [confirming, setConfirming] = useState(false);
  const [done, setDone] = useState<string | null>(null);
  const active = person.status === "active";
  const unsaved = role !== person.role;

  const roleRef = useRef<HTMLSelectElement>(null);
  const deactivateRef = useRef<HTMLButtonElement>(null);
  const confirmRef = useRef<HTMLButtonElement>(null);
  const reactivateRef = useRef<HTMLButtonElement>(null);
  // Where focus goes once the control it names is drawn (after a click, or after the page's refresh).
  const focusNext = useRef<FocusTarget | null>(null);
  useEffect(() => {
    const targets = { role: roleRef, deactivate: deactivateRef, confirm: confirmRef, reactivate: reactivateRef };
    const target = focusNext.current ? targets[focusNext.current].current : null;
    if (target) {
      target.focus();
      focusNext.current = null;
    }
  });
  const moveFocusTo = (target: FocusTarget) => (focusNext.current = target);

  // Only the answer to the latest action is shown, so an old refusal does not linger after a success.
  const [error, setError] = useState<string | null>(null);
  useLatestAnswer(roleState, (message) => {
    setError(message);
    if (!message) setDone("Role saved.");
  });
  useLatestAnswer(reactivateState, (message) => {
    setError(message);
    if (!message) setDone(`${person.name} can sign in again.`);
  });
  useLatestAnswer(deactivateState, (message) => {
    setError(message);
    if (!message) {
      setConfirming(false);
      setDone(`${person.name} is deactivated; their sessions have ended.`);
    }
  });

  return (
    <tr
      data-testid="user-row"
      data-email={person.email}
      data-status={person.status}
      data-role={person.role}
      data-unsaved={unsaved ? "true" : undefined}
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
            className="flex flex-wrap items-center gap-2"
            onSubmit={(event) => {
              event.preventDefault();
              moveFocusTo("role");
              startTransition(() => changeRole({ userId: person.id, role }));
            }}
          >
            <label className="sr-only" htmlFor={`role-${person.id}`}>
              Role of {person.name}
            </label>
            <select
              ref={roleRef}
              id={`role-${person.id}`}
              data-testid="user-role-select"
              value={role}
              aria-describedby={unsaved ? `role-${person.id}-unsaved` : undefined}
              onChange={(event) => {
                setRole(event.target.value as Role);
                setDone(null);
              }}
              className={`rounded-plate bg-paper-raised py-1.5 pr-8 pl-2 text-sm ring-1 ring-inset focus:ring-2 focus:ring-plate-500 focus:outline-none ${
                unsaved ? "ring-warn-700" : "ring-ink-300"
              }`}
            >
              {ROLES.map((value) => (
                <option key={value} value={value}>
                  {ROLE_LABELS[value]}
                </option>
              ))}
            </select>
            {unsaved ? (
              <>
                <span id={`role-${person.id}-unsaved`} data-testid="user-role-unsaved">
                  <Badge tone="warn">Unsaved: was {ROLE_LABELS[person.role]}</Badge>
                </span>
                <Button type="submit" size="sm" pending={changingRole} pendingLabel="Saving…" data-testid="user-role-save">
                  Save role
                </Button>
                <Button
                  type="button"
                  variant="quiet"
                  size="sm"
                  data-testid="user-role-reset"
                  onClick={() => {
                    moveFocusTo("role");
                    setRole(person.role);
                  }}
                >
                  Reset
                </Button>
              </>
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
          <Button
            ref={deactivateRef}
            variant="danger"
            size="sm"
            onClick={() => {
              moveFocusTo("confirm");
              setConfirming(true);
              setDone(null);
            }}
            data-testid="user-deactivate"
          >
            Deactivate
          </Button>
        ) : null}
        {controls.deactivate && active && confirming ? (
          <div className="flex flex-wrap items-center justify-end gap-2">
            <span className="text-xs text-ink-500" id={`deactivate-${person.id}-note`}>
              Ends their sessions now.
            </span>
            <Button
              ref={confirmRef}
              variant="danger"
              size="sm"
              pending={deactivating}
              pendingLabel="Deactivating…"
              data-testid="user-deactivate-confirm"
              aria-describedby={`deactivate-${person.id}-note`}
              onClick={() => {
                moveFocusTo("reactivate");
                startTransition(() => deactivate({ userId: person.id }));
              }}
            >
              Deactivate {person.name.split(" ")[0]}
            </Button>
            <Button
              variant="quiet"
              size="sm"
              data-testid="user-deactivate-cancel"
              onClick={() => {
                moveFocusTo("deactivate");
                setConfirming(false);
              }}
            >
              Cancel
            </Button>
          </div>
        ) : null}
        {controls.deactivate && !active ? (
          <Button
            ref={reactivateRef}
            variant="secondary"
            size="sm"
            pending={reactivating}
            pendingLabel="Reactivating…"
            data-testid="user-reactivate"
            onClick={() => {
              moveFocusTo("deactivate");
              startTransition(() => reactivate({ userId: person.id }));
            }}
          >
            Reactivate
          </Button>
        ) : null}
        <p
          role="status"
          data-testid="user-row-status"
          className={done ? "mt-2 max-w-xs text-left text-xs text-pass-700" : "sr-only"}
        >
          {done}
        </p>
        {error ? (
          <p role="alert" data-testid="user-row-error" className="mt-2 max-w-xs text-left text-sm text-fault-700">
            {error}
          </p>
        ) : null}
      </td>
    </tr>
  );
}

/**
 * Asks before a person leaves the page with a role chosen but not saved: on a link in the app, and on
 * reloading or closing the tab (the browser's own question). Rows mark themselves with data-unsaved.
 */
export function UnsavedRolesGuard() {
  useEffect(() => {
    const unsaved = () => document.querySelectorAll('[data-testid="user-row"][data-unsaved="true"]').length;
    const onClick = (event: MouseEvent) => {
      const link = (event.target as Element | null)?.closest?.("a[href]");
      if (!link || event.defaultPrevented || !unsaved()) return;
      const count = unsaved();
      const question = `You have chosen ${count === 1 ? "a new role" : `${count} new roles`} without saving. Leave this page and discard ${count === 1 ? "it" : "them"}?`;
      if (!window.confirm(question)) {
        event.preventDefault();
        event.stopPropagation();
      }
    };
    const onBeforeUnload = (event: BeforeUnloadEvent) => {
      if (unsaved()) event.preventDefault();
    };
    document.addEventListener("click", onClick, true);
    window.addEventListener("beforeunload", onBeforeUnload);
    return () => {
      document.removeEventListener("click", onClick, true);
      window.removeEventListener("beforeunload", onBeforeUnload);
    };
  }, []);
  return null;
}
