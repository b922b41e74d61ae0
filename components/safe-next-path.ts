// Where to send someone after signing in. Only a path on this site is accepted: "//host" and
// "https://…" would turn the sign-in page into an open redirect.
export function safeNextPath(value: string | string[] | undefined | null, fallback = "/home"): string {
  const candidate = Array.isArray(value) ? value[0] : value;
  if (!candidate || !candidate.startsWith("/") || candidate.startsWith("//") || candidate.startsWith("/\\")) {
    return fallback;
  }
  if (candidate.startsWith("/sign-in") || candidate.startsWith("/api/")) return fallback;
  return candidate;
}
