/**
 * The content hash of a standard's version: sha256 over the canonical form of what its file says — the
 * definition as parsed from the YAML (RFC 8785 JSON canonicalisation: keys sorted, numbers in their
 * shortest form, no white space) and the narrative's text exactly as written:
 *
 *   sha256( JCS({ "definition": <the YAML header as JSON>, "narrative": <the text after the second ---> }) )
 *
 * so key order, quoting style, comments and spacing in the YAML do not change it, and anyone can recompute it
 * from an exported file (content/README.md shows how). Line endings are normalised to \n first.
 */
import canonicalize from "canonicalize";
import { parseSource, type SourceProblem } from "./source";

/** The canonical text that is hashed, or the problems that stop the file being read. */
export function canonicalContent(source: string): { ok: true; text: string } | { ok: false; problems: SourceProblem[] } {
  const read = parseSource(source);
  if (!read.ok) return read;
  const text = canonicalize({ definition: read.parsed.data, narrative: read.parsed.narrative });
  if (text === undefined) return { ok: false, problems: [{ path: "", message: "The definition has no JSON form" }] };
  return { ok: true, text };
}

/** Lower-case hex sha256 of the canonical content. Web Crypto: the same code runs on the server and in the browser. */
export async function contentHash(
  source: string,
): Promise<{ ok: true; hash: string } | { ok: false; problems: SourceProblem[] }> {
  const canonical = canonicalContent(source);
  if (!canonical.ok) return canonical;
  const digest = await globalThis.crypto.subtle.digest("SHA-256", new TextEncoder().encode(canonical.text));
  return { ok: true, hash: Array.from(new Uint8Array(digest), (b) => b.toString(16).padStart(2, "0")).join("") };
}
