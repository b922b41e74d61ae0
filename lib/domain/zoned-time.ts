// Instants shown and days read in a named time zone (IANA, e.g. "Europe/London"), with Intl only, so the
// same code runs on the server and in the browser. Times are written as an engineering office writes
// them — 2026-03-14 09:32:05 — to the second, unambiguous across regions.

/** A zone name Intl knows. Offsets ("+05:00") are refused: they read differently in different tools. */
export function isTimeZone(value: string): boolean {
  if (!/^[A-Za-z][A-Za-z0-9_+-]*(\/[A-Za-z0-9_+-]+)*$/.test(value)) return false;
  try {
    new Intl.DateTimeFormat("en-GB", { timeZone: value });
    return true;
  } catch {
    return false;
  }
}

const formatters = new Map<string, Intl.DateTimeFormat>();

function formatterFor(timeZone: string): Intl.DateTimeFormat {
  let formatter = formatters.get(timeZone);
  if (!formatter) {
    formatter = new Intl.DateTimeFormat("en-GB", {
      timeZone,
      year: "numeric",
      month: "2-digit",
      day: "2-digit",
      hour: "2-digit",
      minute: "2-digit",
      second: "2-digit",
      hourCycle: "h23",
      timeZoneName: "short",
    });
    formatters.set(timeZone, formatter);
  }
  return formatter;
}

type Fields = { year: number; month: number; day: number; hour: number; minute: number; second: number; zone: string };

function fieldsIn(instant: Date, timeZone: string): Fields {
  const parts = formatterFor(timeZone).formatToParts(instant);
  const value = (type: Intl.DateTimeFormatPartTypes) => parts.find((part) => part.type === type)?.value ?? "";
  return {
    year: Number(value("year")),
    month: Number(value("month")),
    day: Number(value("day")),
    hour: Number(value("hour")),
    minute: Number(value("minute")),
    second: Number(value("second")),
    zone: value("timeZoneName"),
  };
}

const pad = (n: number, width = 2) => String(n).padStart(width, "0");

/** "2026-03-14 09:32:05 GMT+1": the wall-clock time in `timeZone`, to the second, with the zone's short name. */
export function formatInTimeZone(instant: Date, timeZone: string): string {
  const f = fieldsIn(instant, timeZone);
  return `${pad(f.year, 4)}-${pad(f.month)}-${pad(f.day)} ${pad(f.hour)}:${pad(f.minute)}:${pad(f.second)} ${f.zone}`;
}

/** "2026-03-14 08:32:05 UTC". */
export function formatUtc(instant: Date): string {
  const iso = instant.toISOString();
  return `${iso.slice(0, 10)} ${iso.slice(11, 19)} UTC`;
}

/** How far `timeZone`'s wall clock is ahead of UTC at `instant`, in milliseconds. */
function offsetMs(instant: Date, timeZone: string): number {
  const f = fieldsIn(instant, timeZone);
  const wall = new Date(0);
  wall.setUTCFullYear(f.year, f.month - 1, f.day);
  wall.setUTCHours(f.hour, f.minute, f.second, 0);
  return wall.getTime() - Math.floor(instant.getTime() / 1000) * 1000;
}

/**
 * The instant a calendar day (YYYY-MM-DD) begins in `timeZone`. Two passes settle a day on which the
 * offset changes; where midnight itself is skipped, the day begins at the first moment that exists.
 */
export function startOfDayInTimeZone(isoDate: string, timeZone: string): Date {
  const midnightUtc = new Date(`${isoDate}T00:00:00Z`).getTime();
  const first = new Date(midnightUtc - offsetMs(new Date(midnightUtc), timeZone));
  const second = new Date(midnightUtc - offsetMs(first, timeZone));
  // The second pass can land in the evening before when midnight does not exist; the first then is the start.
  const f = fieldsIn(second, timeZone);
  const sameDay = `${pad(f.year, 4)}-${pad(f.month)}-${pad(f.day)}` === isoDate;
  return sameDay ? second : first;
}

/** The calendar day after `isoDate`. */
export function nextDay(isoDate: string): string {
  return new Date(new Date(`${isoDate}T00:00:00Z`).getTime() + 24 * 60 * 60 * 1000).toISOString().slice(0, 10);
}
