"use client";

import { startTransition, useActionState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { createStandardSchema } from "@/lib/domain/schemas/standards";
import { Button } from "@/components/ui/button";
import { TextField } from "@/components/ui/field";
import { FormError } from "@/components/ui/notice";
import { actionErrors } from "@/components/action-errors";
import { createStandardAction } from "../actions";

type Values = z.input<typeof createStandardSchema>;

export function NewStandardForm() {
  const [state, create, pending] = useActionState(createStandardAction, null);
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<Values>({ resolver: zodResolver(createStandardSchema), defaultValues: { slug: "", title: "" } });
  const server = actionErrors(state, ["slug", "title"]);
  return (
    <form
      noValidate
      className="max-w-xl space-y-4"
      data-testid="new-standard-form"
      onSubmit={handleSubmit((values) => startTransition(() => create(values)))}
    >
      <FormError message={server.form} />
      <TextField
        label="Title"
        data-testid="new-standard-title"
        error={errors.title?.message ?? server.field.title}
        {...register("title")}
      />
      <TextField
        label="Short name (used in addresses, e.g. fixed-end-beam)"
        data-testid="new-standard-slug"
        error={errors.slug?.message ?? server.field.slug}
        {...register("slug")}
      />
      <Button type="submit" pending={pending} pendingLabel="Creating…" data-testid="new-standard-submit">
        Create draft
      </Button>
    </form>
  );
}
