import "server-only";
// A calc sheet's key: what the sheet shows, told from the database without drawing it, so that a PDF kept for it can
// be served without opening Chromium (lib/use-cases/files.ts).
//
// The sheet page draws from three things only: the run's record, its version's definition and narrative, and the
// sheet's facts (SheetFacts: the run's summary as lists show it, the firm's name, the withdrawals that touch it and
// their banner's words, every sign-off event of every revision that issues it, and its seal — the first tree head that
// holds its leaf, the inclusion proof and the log's key, or the words shown while it waits for the sealer). The record
// and the version are append-only, named in the facts by the record's sha256 and the version's id. The key is the
// sha256 of the facts, whole, with the app's build that draws them: anything the facts hold that changes (a sign-off,
// a withdrawal, a seal, a person's or the job's name) or a new build gives a new key. Nothing of the person asking is
// in it: the sheet shows nobody's own preferences.
//
// The sheet page computes the same key from the very facts it drew and prints it on the page, outside the sheet, so
// a PDF is kept under the key of what it shows, never of what the database held a moment before or after. A key
// the server cannot compute (no build id: next dev, a script) is no key, and the sheet is opened in Chromium.
import { createHash } from "node:crypto";
import canonicalize from "canonicalize";
import { serverEnv } from "@/lib/server-env";

/** Names what the key covers; changed when it covers something else, so that no old key can match. */
const SHEET_KEY_SCHEME = "gusset-sheet-key/1";

/** sha256 (hex) of a sheet's facts with the build that draws them; null when the build is not known. */
export function sheetKeyOf(facts: unknown): string | null {
  const build = serverEnv().GUSSET_BUILD_ID;
  if (!build) return null;
  const text = canonicalize({ scheme: SHEET_KEY_SCHEME, build, facts });
  if (text === undefined) return null;
  return createHash("sha256").update(text).digest("hex");
}

/** A key as the page prints it and the renderer reads it back: 64 hex digits, or nothing. */
export const isSheetKey = (value: unknown): value is string => typeof value === "string" && /^[0-9a-f]{64}$/.test(value);
