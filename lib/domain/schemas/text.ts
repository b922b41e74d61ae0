// Text a person types (names, e-mail addresses, passwords, ids from links): no control characters and no
// bidirectional controls. A NUL byte cannot be stored in PostgreSQL text at all, and a right-to-left override
// in a name turns "Engineer · admin" into "reenignE · admin" wherever the name is shown.
import { z } from "../zod";

// C0 controls, DEL, C1 controls.
// eslint-disable-next-line no-control-regex -- control characters are exactly what is refused here
const CONTROL = /[\u0000-\u001f\u007f-\u009f]/;
// Embeddings, overrides and isolates (U+202A–U+202E, U+2066–U+2069), the marks U+200E, U+200F, U+061C.
const BIDI = /[\u202a-\u202e\u2066-\u2069\u200e\u200f\u061c]/;

export const PLAIN_TEXT_MESSAGE = "Remove the invisible control characters (they may have come with a copy and paste).";

/** True when `value` holds a control character (NUL, newline, tab, DEL, C1). */
export function hasControlCharacters(value: string): boolean {
  return CONTROL.test(value);
}

/** True when any string in a parsed JSON or form body holds a control character. */
export function bodyHasControlCharacters(value: unknown): boolean {
  if (typeof value === "string") return hasControlCharacters(value);
  if (Array.isArray(value)) return value.some(bodyHasControlCharacters);
  if (value && typeof value === "object") {
    return Object.entries(value).some(([key, item]) => hasControlCharacters(key) || bodyHasControlCharacters(item));
  }
  return false;
}

/** True when `value` holds a control or bidirectional-control character. */
export function hasHiddenCharacters(value: string): boolean {
  return CONTROL.test(value) || BIDI.test(value);
}

/** A string schema that refuses control and bidirectional-control characters. */
export function plainText(message = PLAIN_TEXT_MESSAGE) {
  return z.string().refine((value) => !hasHiddenCharacters(value), message);
}
