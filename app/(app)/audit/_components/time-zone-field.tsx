"use client";
// The zone the filter's dates are days in, sent with the form: the person's own zone when one is given,
// else the browser's once hydrated; UTC without JavaScript (and the hint says which).
import { useBrowserTimeZone } from "@/components/local-time";

export function TimeZoneField({ timeZone }: { timeZone?: string }) {
  const browserZone = useBrowserTimeZone();
  const zone = timeZone ?? browserZone ?? "UTC";
  return (
    <>
      <input type="hidden" name="tz" value={zone} data-testid="audit-filter-tz" />
      <p className="basis-full text-xs text-ink-500" data-testid="audit-filter-zone">
        Days run midnight to midnight in {zone === "UTC" ? "UTC" : `your time zone, ${zone}`}.
      </p>
    </>
  );
}
