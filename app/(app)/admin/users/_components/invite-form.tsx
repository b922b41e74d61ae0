"use client";

import { startTransition, useActionState, useEffect, useRef } from "react";
import { useForm, useWatch } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { ROLES, ROLE_LABELS, ROLE_SUMMARIES } from "@/lib/domain/roles";
import { inviteUserSchema, type InviteUserInput } from "@/lib/domain/schemas/users";
import { EARLIER_INVITATION_CANCELLED_MESSAGE } from "@/lib/domain/schemas/invitations";
import { Button } from "@/components/ui/button";
import { EmailField, SelectField, TextField } from "@/components/ui/field";
import { FormError, Notice } from "@/components/ui/notice";
import { actionErrors } from "@/components/action-errors";
import { inviteUserAction } from "../actions";

export function InviteForm() {
  const [state, invite, pending] = useActionState(inviteUserAction, null);
  const {
    register,
    handleSubmit,
    reset,
    control,
    setFocus,
    formState: { errors },
  } = useForm<InviteUserInput>({
    resolver: zodResolver(inviteUserSchema),
    defaultValues: { email: "", name: "", role: "engineer" },
  });

  // A sent invitation clears the form for the next one and takes focus to the confirmation (the button
  // pressed is still there, but the form it sent is now empty); a refused one keeps what was typed, and
  // the first field in error takes focus (react-hook-form's shouldFocusError for its own checks).
  const sentRef = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (state?.ok) {
      reset();
      sentRef.current?.focus();
    } else if (state && !state.ok) {
      const field = (["name", "email", "role"] as const).find((name) => state.error.fieldErrors?.[name]);
      if (field) setFocus(field);
    }
  }, [state, reset, setFocus]);

  const server = actionErrors(state, ["email", "name", "role"]);
  const role = useWatch({ control, name: "role" });

  return (
    <form
      noValidate
      data-testid="invite-form"
      className="space-y-4"
      onSubmit={handleSubmit((values) => startTransition(() => invite(values)))}
    >
      <div className="grid items-start gap-4 md:grid-cols-[minmax(0,1fr)_minmax(0,1fr)_13rem_auto]">
        <TextField
          label="Name"
          autoComplete="off"
          data-testid="invite-name"
          errorTestId="invite-name-error"
          error={errors.name?.message ?? server.field.name}
          {...register("name")}
        />
        <EmailField
          autoComplete="off"
          data-testid="invite-email"
          errorTestId="invite-email-error"
          error={errors.email?.message ?? server.field.email}
          {...register("email")}
        />
        <SelectField
          label="Role"
          data-testid="invite-role"
          error={errors.role?.message ?? server.field.role}
          {...register("role")}
        >
          {ROLES.map((value) => (
            <option key={value} value={value}>
              {ROLE_LABELS[value]}
            </option>
          ))}
        </SelectField>
        <Button type="submit" className="md:mt-6" pending={pending} pendingLabel="Sending…" data-testid="invite-submit">
          Send invitation
        </Button>
      </div>
      <p className="text-sm text-ink-500" data-testid="invite-role-summary">
        <span className="font-medium text-ink-700">{ROLE_LABELS[role]}:</span> {ROLE_SUMMARIES[role]}
      </p>
      <FormError message={server.form} />
      {state?.ok ? (
        <div ref={sentRef} tabIndex={-1}>
          <Notice tone="pass" testId="invite-sent">
            Invitation sent to <strong>{state.data.email}</strong> as {ROLE_LABELS[state.data.role]}. The link works for seven
            days.
            {state.data.replacedInvitations.length > 0 ? (
              <span data-testid="invite-replaced"> {EARLIER_INVITATION_CANCELLED_MESSAGE}</span>
            ) : null}
          </Notice>
        </div>
      ) : null}
    </form>
  );
}
