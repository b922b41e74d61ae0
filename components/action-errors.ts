import type { ActionState } from "@/lib/domain/action-state";

// Where a server action's error goes on the page: beside a field when the server named one that the
// form shows, otherwise above the form.
export function actionErrors<T>(state: ActionState<T>, fields: readonly string[]) {
  if (!state || state.ok) return { field: {} as Record<string, string | undefined>, form: null };
  const field: Record<string, string | undefined> = {};
  for (const name of fields) field[name] = state.error.fieldErrors?.[name]?.[0];
  const placed = fields.some((name) => field[name]);
  return { field, form: placed ? null : state.error.message };
}
