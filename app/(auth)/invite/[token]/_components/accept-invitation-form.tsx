"use client";

import { startTransition, useActionState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { acceptInvitationSchema, type AcceptInvitationInput } from "@/lib/domain/schemas/invitations";
import { Button } from "@/components/ui/button";
import { FormError } from "@/components/ui/notice";
import { NewPasswordFields } from "@/components/new-password-fields";
import { actionErrors } from "@/components/action-errors";
import { acceptInvitationAction } from "../actions";

export function AcceptInvitationForm({ token }: { token: string }) {
  const [state, accept, pending] = useActionState(acceptInvitationAction, null);
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<AcceptInvitationInput>({
    resolver: zodResolver(acceptInvitationSchema),
    defaultValues: { token, password: "", confirmPassword: "" },
  });
  const server = actionErrors(state, ["password", "confirmPassword"]);

  return (
    <form
      noValidate
      className="space-y-5"
      data-testid="accept-invitation-form"
      onSubmit={handleSubmit((values) => startTransition(() => accept(values)))}
    >
      <FormError message={server.form ?? errors.token?.message} />
      <input type="hidden" {...register("token")} />
      <NewPasswordFields
        register={register}
        errors={{
          password: errors.password?.message ?? server.field.password,
          confirmPassword: errors.confirmPassword?.message ?? server.field.confirmPassword,
        }}
      />
      <Button
        type="submit"
        className="w-full"
        pending={pending}
        pendingLabel="Setting up your account…"
        data-testid="accept-invitation-submit"
      >
        Set password and sign in
      </Button>
    </form>
  );
}
