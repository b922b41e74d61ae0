"use client";
// SI or US customary: how this person reads results. Two buttons, the chosen one pressed; remembered on the
// server (lib/use-cases/profile.ts), so every run page and calc sheet they open follows it.
import { startTransition, useActionState } from "react";
import { DISPLAY_UNIT_LABELS, DISPLAY_UNIT_SYSTEMS, type DisplayUnits } from "@/lib/standards/display-units";
import { FormError } from "@/components/ui/notice";
import { actionErrors } from "@/components/action-errors";
import { setDisplayUnitsAction } from "../actions";

export function DisplayUnitsForm({ current, compact = false }: { current: DisplayUnits; compact?: boolean }) {
  const [state, save, pending] = useActionState(setDisplayUnitsAction, null);
  const shown = state?.ok ? state.data.displayUnits : current;
  const server = actionErrors(state, ["displayUnits"]);
  return (
    <div data-testid="display-units-form">
      <div role="group" aria-label="Show results in" className="inline-flex flex-wrap items-center gap-2 text-sm">
        <span className="text-ink-700">{compact ? "Units:" : "Show results in"}</span>
        {DISPLAY_UNIT_SYSTEMS.map((units) => (
          <button
            key={units}
            type="button"
            aria-pressed={shown === units}
            disabled={pending}
            onClick={() => startTransition(() => save({ displayUnits: units }))}
            className={`rounded-full px-3 py-1 ring-1 ${shown === units ? "bg-plate-700 text-white ring-plate-700" : "text-plate-800 ring-ink-300 hover:ring-plate-500"}`}
            data-testid={`display-units-${units}`}
          >
            {compact ? (units === "si" ? "SI" : "US customary") : DISPLAY_UNIT_LABELS[units]}
          </button>
        ))}
      </div>
      <FormError message={server.form ?? server.field.displayUnits} />
    </div>
  );
}
