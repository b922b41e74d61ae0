// Where to send someone after signing in (?next=): only a path on Gusset itself, anything else goes home.

const BASE = "http://gusset.invalid";

/**
 * `candidate` resolved against the app's own origin, accepted only when it stays there: it must start with
 * one "/", hold no control characters (a tab or newline in "/\t/evil.example" is dropped by browsers, which
 * then read "//evil.example") and no backslashes (read as "/" by browsers). Returns path, query and hash.
 */
export function safePath(candidate: string | null | undefined, fallback = "/home"): string {
  if (!candidate || candidate.length > 2000) return fallback;
  // eslint-disable-next-line no-control-regex -- control characters are exactly what is refused here
  if (/[\u0000-\u001f\u007f\\]/.test(candidate)) return fallback;
  if (!candidate.startsWith("/") || candidate.startsWith("//")) return fallback;
  let url: URL;
  try {
    url = new URL(candidate, BASE);
  } catch {
    return fallback;
  }
  if (url.origin !== BASE) return fallback;
  return `${url.pathname}${url.search}${url.hash}`;
}
