// Reads a PDF's text with pdftotext (Debian's poppler-utils, installed by `npm test`): one string per page.
import { execFileSync } from "node:child_process";

export function pdfPages(body: Uint8Array): string[] {
  const text = execFileSync("pdftotext", ["-layout", "-enc", "UTF-8", "-", "-"], {
    input: body,
    maxBuffer: 64 * 1024 * 1024,
  }).toString("utf8");
  // pdftotext ends every page with a form feed.
  const pages = text.split("\f");
  if (pages.at(-1)?.trim() === "") pages.pop();
  return pages;
}
