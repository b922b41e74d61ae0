/**
 * The content hash is sha256 over RFC 8785 canonical JSON of the parsed definition and the narrative: the
 * same content written differently hashes the same, any change of meaning changes it, and it can be
 * recomputed with nothing but a YAML reader, a JCS implementation and sha256 (here: node:crypto).
 */
import { describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import path from "node:path";
import { parse } from "yaml";
import { canonicalContent, contentHash } from "@/lib/standards/content-hash";

const file = path.resolve(import.meta.dirname, "../../content/standards/simply-supported-beam/1.mdx");
const source = readFileSync(file, "utf8");

async function hashOf(text: string): Promise<string> {
  const out = await contentHash(text);
  if (!out.ok) throw new Error(JSON.stringify(out.problems));
  return out.hash;
}

describe("content hash", () => {
  it("is recomputable from the file by anyone: sha256 of JCS({definition, narrative})", async () => {
    const [, header, ...rest] = source.split(/^---$/m);
    const narrative = rest.join("---").replace(/^\n/, "");
    const definition = parse(header);
    // RFC 8785 for this data: keys sorted by UTF-16 code units, JSON.stringify's numbers and strings.
    const jcs = (v: unknown): string =>
      v === null || typeof v !== "object"
        ? JSON.stringify(v)
        : Array.isArray(v)
          ? `[${v.map(jcs).join(",")}]`
          : `{${Object.keys(v)
              .sort()
              .map((k) => `${JSON.stringify(k)}:${jcs((v as Record<string, unknown>)[k])}`)
              .join(",")}}`;
    const expected = createHash("sha256").update(jcs({ definition, narrative })).digest("hex");
    expect(await hashOf(source)).toBe(expected);
  });

  it("does not change with key order, quoting, comments or line endings", async () => {
    const reordered = source
      .replace(
        "title: Simply supported steel beam\ncategory: beams\n",
        "category: beams   # moved\ntitle: 'Simply supported steel beam'\n",
      )
      .replace(/\n/g, "\r\n");
    expect(reordered).not.toBe(source);
    expect(await hashOf(reordered)).toBe(await hashOf(source));
  });

  it("changes with any change of meaning, in the definition or in the narrative", async () => {
    const base = await hashOf(source);
    expect(await hashOf(source.replace("default: 6 m", "default: 7 m"))).not.toBe(base);
    expect(await hashOf(source.replace("# Simply supported steel beam", "# Simply supported beam"))).not.toBe(base);
    expect(await hashOf(source.replace("clause: IBC 2015 Table 1604.3", "clause: IBC 2018 Table 1604.3"))).not.toBe(base);
  });

  it("is 64 hex digits, and the canonical text has no white space between tokens", async () => {
    expect(await hashOf(source)).toMatch(/^[0-9a-f]{64}$/);
    const canonical = canonicalContent(source);
    expect(canonical.ok && canonical.text.startsWith('{"definition":{"assumptions":')).toBe(true);
  });
});
