"use client";

import { startTransition, useActionState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { createLibrarySchema } from "@/lib/domain/schemas/libraries";
import { LIBRARY_KIND_NAMES, LIBRARY_KINDS } from "@/lib/libraries";
import { Button } from "@/components/ui/button";
import { SelectField, TextField } from "@/components/ui/field";
import { FormError } from "@/components/ui/notice";
import { actionErrors } from "@/components/action-errors";
import { createLibraryAction } from "../actions";

type Values = z.input<typeof createLibrarySchema>;

export function NewLibraryForm() {
  const [state, create, pending] = useActionState(createLibraryAction, null);
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<Values>({ resolver: zodResolver(createLibrarySchema), defaultValues: { kind: "sections", slug: "", title: "" } });
  const server = actionErrors(state, ["kind", "slug", "title"]);
  return (
    <form
      noValidate
      className="max-w-xl space-y-4"
      data-testid="new-library-form"
      onSubmit={handleSubmit((values) => startTransition(() => create(values)))}
    >
      <FormError message={server.form} />
      <SelectField
        label="Kind"
        data-testid="new-library-kind"
        error={errors.kind?.message ?? server.field.kind}
        {...register("kind")}
      >
        {LIBRARY_KINDS.map((kind) => (
          <option key={kind} value={kind}>
            {LIBRARY_KIND_NAMES[kind].many}
          </option>
        ))}
      </SelectField>
      <TextField
        label="Title"
        data-testid="new-library-title"
        error={errors.title?.message ?? server.field.title}
        {...register("title")}
      />
      <TextField
        label="Short name (used by standards and in addresses, e.g. firm-timber)"
        data-testid="new-library-slug"
        error={errors.slug?.message ?? server.field.slug}
        {...register("slug")}
      />
      <Button type="submit" pending={pending} pendingLabel="Creating…" data-testid="new-library-submit">
        Create draft
      </Button>
    </form>
  );
}
