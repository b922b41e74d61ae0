/** The firm's starting standards: every version file under content/standards, by path. */
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";

export const STANDARDS_DIR = path.resolve(import.meta.dirname, "../../content/standards");

export function startingStandardFiles(): { file: string; source: string }[] {
  return readdirSync(STANDARDS_DIR, { recursive: true, encoding: "utf8" })
    .filter((f) => f.endsWith(".mdx"))
    .sort()
    .map((file) => ({ file, source: readFileSync(path.join(STANDARDS_DIR, file), "utf8") }));
}
