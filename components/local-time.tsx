"use client";
// An instant as the reader's wall clock shows it, to the second, with UTC on hover. The server does not
// know the browser's zone, so without `timeZone` it renders UTC and the browser re-renders in its own
// zone once hydrated (useSyncExternalStore's server snapshot keeps hydration exact). With `timeZone`
// (a person's chosen zone) server and browser render the same text.
import { useSyncExternalStore } from "react";
import { formatInTimeZone, formatUtc, isTimeZone } from "@/lib/domain/zoned-time";

const subscribeToNothing = () => () => {};
const browserTimeZone = () => Intl.DateTimeFormat().resolvedOptions().timeZone;
const noZoneOnServer = () => null;

/** The browser's time zone, or null while rendering on the server and hydrating. */
export function useBrowserTimeZone(): string | null {
  return useSyncExternalStore(subscribeToNothing, browserTimeZone, noZoneOnServer);
}

export function LocalTime({ iso, timeZone, className }: { iso: string; timeZone?: string; className?: string }) {
  const browserZone = useBrowserTimeZone();
  const instant = new Date(iso);
  const utc = formatUtc(instant);
  const zone = timeZone && isTimeZone(timeZone) ? timeZone : browserZone;
  const text = zone ? formatInTimeZone(instant, zone) : utc;
  // Day and time each kept whole, so a narrow column wraps between them and nowhere else.
  const split = text.indexOf(" ");
  return (
    <time dateTime={instant.toISOString()} title={utc} className={className} data-testid="local-time">
      <span className="whitespace-nowrap">{text.slice(0, split)}</span>{" "}
      <span className="whitespace-nowrap">{text.slice(split + 1)}</span>
    </time>
  );
}
