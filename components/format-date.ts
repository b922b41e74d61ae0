// Dates as an engineering office writes them: 2026-03-14 09:32 — unambiguous across regions.
// Rendered on the server in UTC so that the same record reads the same for everyone.
export function formatDateTime(iso: string | Date): string {
  const date = typeof iso === "string" ? new Date(iso) : iso;
  return `${date.toISOString().slice(0, 10)} ${date.toISOString().slice(11, 16)} UTC`;
}

export function formatDate(iso: string | Date): string {
  const date = typeof iso === "string" ? new Date(iso) : iso;
  return date.toISOString().slice(0, 10);
}
