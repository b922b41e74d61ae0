// The run list's query in the address and its CSV, as pure code: a cursor read back is the cursor written (each order
// its own form, and the one GET /api/runs has always given for newest first); addresses leave out blanks and defaults;
// a CSV field is quoted as RFC 4180 says and a text that would be a formula is neutralised (common practice).
import { describe, expect, it } from "vitest";
import { csvField, csvRecord, parseCsv } from "@/lib/domain/csv";
import {
  readRunCursor,
  runExportHref,
  runListQuerySchema,
  runLogHref,
  writeRunCursor,
  type RunCursor,
} from "@/lib/domain/schemas/run-log";

const ID = "0b9d6a3e-52c1-4f0e-9c1d-2a3b4c5d6e7f";
const AT = "2026-03-14T09:32:05.123Z";

describe("page cursors", () => {
  const cursors: RunCursor[] = [
    { sort: "date", createdAt: AT, id: ID },
    { sort: "utilisation", key: 0.8125, createdAt: AT, id: ID },
    { sort: "utilisation", key: 1.0000000000000002, createdAt: AT, id: ID },
    { sort: "utilisation", key: 3e-7, createdAt: AT, id: ID },
    { sort: "utilisation", key: null, createdAt: AT, id: ID },
    { sort: "job", key: "MF-2291.B", createdAt: AT, id: ID },
  ];
  it.each(cursors)("reads back what it wrote: %o", (cursor) => {
    expect(readRunCursor(writeRunCursor(cursor), cursor.sort)).toEqual(cursor);
  });
  it("keeps the form GET /api/runs has always given for newest first", () => {
    expect(writeRunCursor({ sort: "date", createdAt: AT, id: ID })).toBe(`${AT}_${ID}`);
  });
  it("refuses a cursor written for another order, or not written by Gusset", () => {
    expect(readRunCursor(`${AT}_${ID}`, "job")).toBeNull();
    expect(readRunCursor(`u0.5_${AT}_${ID}`, "date")).toBeNull();
    expect(readRunCursor(`uNaN_${AT}_${ID}`, "utilisation")).toBeNull();
    expect(readRunCursor(`uInfinity_${AT}_${ID}`, "utilisation")).toBeNull();
    expect(readRunCursor(`j_${AT}_${ID}`, "job")).toBeNull();
    expect(readRunCursor(`2026-02-30T00:00:00Z_${ID}`, "date")).toBeNull();
    expect(readRunCursor(`${AT}_not-a-uuid`, "date")).toBeNull();
  });
});

describe("the query in the address", () => {
  it("treats blank fields as no filter, and leaves defaults out of addresses", () => {
    const query = runListQuerySchema.parse({ job: "", standard: "fixed-end-beam", pass: "false", sort: "date", dir: "", tz: "" });
    expect(query).toMatchObject({ standard: "fixed-end-beam", pass: "false", sort: "date", tz: "UTC", limit: 50 });
    expect(query.job).toBeUndefined();
    // As the form hands them over, blanks and all.
    expect(runLogHref({ job: "MF-2291", sort: "" as "date", dir: "" as "asc", version: "" as unknown as number })).toBe(
      "/audit/runs?job=MF-2291",
    );
    expect(runLogHref(query)).toBe("/audit/runs?standard=fixed-end-beam&pass=false");
    expect(runLogHref({ ...query, sort: "job", dir: "asc" }, { cursor: `jA_${AT}_${ID}` })).toBe(
      `/audit/runs?standard=fixed-end-beam&pass=false&sort=job&cursor=jA_${encodeURIComponent(AT)}_${ID}`.replace(/%3A/g, "%3A"),
    );
    expect(runExportHref({ ...query, from: "2026-01-01", tz: "Europe/London", cursor: "x", limit: 10 })).toBe(
      "/api/runs/export?standard=fixed-end-beam&pass=false&from=2026-01-01&tz=Europe%2FLondon",
    );
  });
  it("parses its own output again to the same value", () => {
    const query = runListQuerySchema.parse({
      job: "MF-2291",
      version: "2",
      from: "2026-01-01",
      to: "2026-01-31",
      sort: "utilisation",
    });
    expect(runListQuerySchema.parse(query)).toEqual(query);
  });
});

describe("CSV", () => {
  it("quotes a field with a comma, a quote or a line break, doubling its quotes", () => {
    expect(csvField("plain")).toBe("plain");
    expect(csvField("a, b")).toBe('"a, b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField("two\nlines")).toBe('"two\nlines"');
    expect(csvRecord(["a", 1.5, true, null])).toBe("a,1.5,true,\r\n");
  });
  it("writes a text a spreadsheet would run as a formula with an apostrophe first", () => {
    for (const start of ["=", "+", "-", "@", "\t", "\r"]) expect(csvField(`${start}1+1`)).toMatch(/^"?'/);
    expect(csvField("=SUM(A1,A2)")).toBe(`"'=SUM(A1,A2)"`);
    expect(csvField(-0.5)).toBe("-0.5"); // a number is a number
  });
  it("reads back what it writes", () => {
    const rows = [
      ["=cmd", 'q"uote', "a,b", ""],
      ["x", "line\r\nbreak", "@home", "+1"],
    ];
    expect(parseCsv(rows.map((r) => csvRecord(r)).join(""))).toEqual(
      rows.map((r) => r.map((v) => (/^[=+\-@]/.test(v) ? `'${v}` : v))),
    );
  });
});
