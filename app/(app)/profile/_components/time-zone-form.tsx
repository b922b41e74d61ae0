"use client";

import { startTransition, useActionState, useMemo, useSyncExternalStore } from "react";
import { Button } from "@/components/ui/button";
import { SelectField } from "@/components/ui/field";
import { FormError, Notice } from "@/components/ui/notice";
import { actionErrors } from "@/components/action-errors";
import { setTimeZoneAction } from "../actions";

/** "Europe/London" → "Europe/London (GMT+01:00)" at this moment, so a person can check the offset. */
function describeZone(zone: string, now: Date): string {
  try {
    const offset = new Intl.DateTimeFormat("en-GB", { timeZone: zone, timeZoneName: "longOffset" })
      .formatToParts(now)
      .find((part) => part.type === "timeZoneName")?.value;
    return offset ? `${zone.replace(/_/g, " ")} (${offset})` : zone;
  } catch {
    return zone;
  }
}

const subscribeToNothing = () => () => undefined;

// The zones come from the server's list (the one it validates against), so every choice here is accepted.
export function TimeZoneForm({ current, zones }: { current: string | null; zones: string[] }) {
  const [state, save, pending] = useActionState(setTimeZoneAction, null);
  // The browser's own zone and each zone's offset now are known only in the browser (its clock, its
  // time-zone data): filled in after the first render, so the server's HTML and the browser's agree.
  const inBrowser = useSyncExternalStore(
    subscribeToNothing,
    () => true,
    () => false,
  );
  const browserZone = inBrowser ? Intl.DateTimeFormat().resolvedOptions().timeZone : null;
  const labels = useMemo(() => {
    if (!inBrowser) return null;
    const now = new Date();
    return new Map(zones.map((zone) => [zone, describeZone(zone, now)]));
  }, [inBrowser, zones]);
  const server = actionErrors(state, ["timeZone"]);
  const saved = state?.ok ? state.data.timeZone : undefined;

  return (
    <form
      noValidate
      className="max-w-md space-y-4"
      data-testid="time-zone-form"
      onSubmit={(event) => {
        event.preventDefault();
        // Read from the form, not from state: a choice made before the page hydrated is kept.
        const timeZone = String(new FormData(event.currentTarget).get("timeZone") ?? "");
        startTransition(() => save({ timeZone }));
      }}
    >
      <FormError message={server.form} />
      <SelectField
        label="Show times in"
        name="timeZone"
        defaultValue={current ?? ""}
        data-testid="time-zone"
        errorTestId="time-zone-error"
        error={server.field.timeZone}
        hint={browserZone ? `Your browser is set to ${browserZone.replace(/_/g, " ")}.` : undefined}
      >
        <option value="">Your browser&apos;s time zone{browserZone ? ` (${browserZone.replace(/_/g, " ")})` : ""}</option>
        {zones.map((zone) => (
          <option key={zone} value={zone}>
            {labels?.get(zone) ?? zone.replace(/_/g, " ")}
          </option>
        ))}
      </SelectField>
      <Button type="submit" variant="secondary" pending={pending} pendingLabel="Saving…" data-testid="time-zone-submit">
        Save time zone
      </Button>
      {saved !== undefined ? (
        <Notice tone="pass" testId="time-zone-saved">
          {saved === null
            ? "Saved. Times are shown in your browser's time zone."
            : `Saved. Times are shown in ${saved.replace(/_/g, " ")}.`}
        </Notice>
      ) : null}
    </form>
  );
}
