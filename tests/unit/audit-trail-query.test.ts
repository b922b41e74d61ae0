// The audit trail's filters as the address carries them (issue 9, item 1): blanks are no filter, bad
// values give a message per field (never a 500), paging keeps the filters, and dates are whole days in
// the reader's time zone.
import { describe, expect, it } from "vitest";
import { auditTrailHref, auditTrailQuerySchema } from "@/lib/domain/schemas/audit";
import { formatInTimeZone, formatUtc, isTimeZone, nextDay, startOfDayInTimeZone } from "@/lib/domain/zoned-time";

function errorsOf(input: unknown): Record<string, string> {
  const parsed = auditTrailQuerySchema.safeParse(input);
  if (parsed.success) return {};
  // The first message per field, as the page shows it.
  const errors: Record<string, string> = {};
  for (const issue of parsed.error.issues) errors[String(issue.path[0])] ??= issue.message;
  return errors;
}

describe("auditTrailQuerySchema", () => {
  it("reads an empty form as no filter: sign-ins hidden, UTC days, the first page of 50", () => {
    for (const input of [{}, { actor: "", action: "", from: "", to: "", tz: "" }]) {
      expect(auditTrailQuerySchema.parse(input)).toEqual({ signIns: false, tz: "UTC", limit: 50 });
    }
  });

  it("reads every filter the form sends", () => {
    const query = auditTrailQuerySchema.parse({
      actor: "Xy12_ab-C",
      action: "users.set-role",
      from: "2026-03-01",
      to: "2026-03-14",
      signIns: "1",
      tz: "Europe/London",
      before: "120",
    });
    expect(query).toEqual({
      actor: "Xy12_ab-C",
      action: "users.set-role",
      from: "2026-03-01",
      to: "2026-03-14",
      signIns: true,
      tz: "Europe/London",
      limit: 50,
      before: 120,
    });
    // The page checks the address, then hands the result to the runner, which parses it again.
    expect(auditTrailQuerySchema.parse(query)).toEqual(query);
  });

  it.each<[string, Record<string, unknown>, Record<string, string>]>([
    ["an action no version knows", { action: "users.delete-everything" }, { action: "Choose an action from the list." }],
    ["a person id with odd characters", { actor: "x' or 1=1" }, { actor: "Choose a person from the list." }],
    ["two actions at once", { action: ["users.invite", "users.set-role"] }, { action: "Choose one action from the list." }],
    ["a date in another format", { from: "14/03/2026" }, { from: "Enter a date as YYYY-MM-DD." }],
    ["a day that does not exist", { to: "2026-02-30" }, { to: "That date does not exist." }],
    ["a last day before the first", { from: "2026-03-14", to: "2026-03-01" }, { to: "The last day is before the first day." }],
    ["a time zone that does not exist", { tz: "Mars/Olympus_Mons" }, { tz: "Unknown time zone." }],
    ["an offset instead of a zone", { tz: "+05:00" }, { tz: "Unknown time zone." }],
    ["a checkbox with another value", { signIns: "yes please" }, { signIns: 'Tick "Show sign-ins" or leave it empty.' }],
    ["a page marker that is not a number", { before: "abc" }, { before: "That page of the audit trail does not exist." }],
    ["a page size too large", { limit: "500" }, { limit: "Show between 1 and 200 events a page." }],
  ])("refuses %s with a message for that field", (_name, input, expected) => {
    expect(errorsOf(input)).toEqual(expected);
  });

  it("accepts a leap day and the sign-in checkbox as browsers send it", () => {
    expect(auditTrailQuerySchema.parse({ from: "2028-02-29", signIns: "on" })).toMatchObject({
      from: "2028-02-29",
      signIns: true,
    });
  });
});

describe("auditTrailHref", () => {
  it("keeps every filter when paging, and leaves defaults out", () => {
    const form = {
      actor: "abc",
      action: "users.deactivate",
      from: "2026-03-01",
      to: "2026-03-02",
      signIns: "1",
      tz: "Asia/Tokyo",
    };
    const query = auditTrailQuerySchema.parse(form);
    const href = new URL(auditTrailHref(query, { before: 77 }), "http://x");
    expect(href.pathname).toBe("/audit");
    expect(Object.fromEntries(href.searchParams)).toEqual({ ...form, before: "77" });
    // What the address gives back is the same query, one page on.
    expect(auditTrailQuerySchema.parse(Object.fromEntries(href.searchParams))).toEqual({ ...query, before: 77 });
    expect(auditTrailHref(auditTrailQuerySchema.parse({}))).toBe("/audit");
    expect(auditTrailHref(auditTrailQuerySchema.parse({}), { before: 5 })).toBe("/audit?before=5");
  });
});

describe("zoned time", () => {
  it("writes an instant to the second, in UTC and in a named zone", () => {
    const instant = new Date("2026-03-14T09:32:05.678Z");
    expect(formatUtc(instant)).toBe("2026-03-14 09:32:05 UTC");
    // Tokyo is UTC+9 all year (no daylight saving time): common practice.
    expect(formatInTimeZone(instant, "Asia/Tokyo")).toBe("2026-03-14 18:32:05 GMT+9");
    expect(formatInTimeZone(instant, "UTC")).toBe("2026-03-14 09:32:05 UTC");
  });

  it("finds where a day begins in a zone, across a change of offset", () => {
    expect(startOfDayInTimeZone("2026-03-14", "UTC").toISOString()).toBe("2026-03-14T00:00:00.000Z");
    expect(startOfDayInTimeZone("2026-03-14", "Asia/Tokyo").toISOString()).toBe("2026-03-13T15:00:00.000Z");
    // New York: EST (UTC−5) until 2026-03-08 02:00, EDT (UTC−4) after; common practice (US DST rules since 2007).
    expect(startOfDayInTimeZone("2026-03-08", "America/New_York").toISOString()).toBe("2026-03-08T05:00:00.000Z");
    expect(startOfDayInTimeZone("2026-03-09", "America/New_York").toISOString()).toBe("2026-03-09T04:00:00.000Z");
    // Auckland is UTC+13 in its summer: a day begins on the previous UTC day.
    expect(startOfDayInTimeZone("2026-01-15", "Pacific/Auckland").toISOString()).toBe("2026-01-14T11:00:00.000Z");
    expect(nextDay("2026-02-28")).toBe("2026-03-01");
    expect(nextDay("2028-02-28")).toBe("2028-02-29");
    expect(nextDay("2026-12-31")).toBe("2027-01-01");
  });

  it("knows zone names and refuses anything else", () => {
    expect(isTimeZone("Europe/London")).toBe(true);
    expect(isTimeZone("UTC")).toBe(true);
    expect(isTimeZone("America/Argentina/Buenos_Aires")).toBe(true);
    expect(isTimeZone("Nowhere/Special")).toBe(false);
    expect(isTimeZone("+01:00")).toBe(false);
    expect(isTimeZone("")).toBe(false);
  });
});
