/** The firm's starting libraries: every document under content/libraries, read and checked. */
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { checkLibraryDocument, type LibraryDocument } from "@/lib/libraries";

export const LIBRARIES_DIR = path.resolve(import.meta.dirname, "../../content/libraries");

export interface StartingLibrary {
  /** The file's name: "materials.json". */
  file: string;
  /** The file's name without ".json" ("materials", "load-combinations"), for the seed to name the library by. */
  name: string;
  document: LibraryDocument;
}

/**
 * Each content/libraries/*.json (or `dir`'s) as a checked document, in file-name order. Throws on a file
 * that is not JSON or that checkLibraryDocument refuses, naming the file and every problem: the starting
 * content is ours, so a fault in it is a bug to fix before the seed runs.
 */
export function startingLibraries(dir: string = LIBRARIES_DIR): StartingLibrary[] {
  return readdirSync(dir, { encoding: "utf8" })
    .filter((f) => f.endsWith(".json"))
    .sort()
    .map((file) => {
      const text = readFileSync(path.join(dir, file), "utf8");
      let json: unknown;
      try {
        json = JSON.parse(text);
      } catch (error) {
        throw new Error(`content/libraries/${file} is not JSON: ${(error as Error).message}`, { cause: error });
      }
      const checked = checkLibraryDocument(json);
      if (!checked.ok)
        throw new Error(
          `content/libraries/${file} is not a library document:\n` +
            checked.problems.map((p) => `  ${p.path}${p.entry ? ` (${p.entry})` : ""}: ${p.message}`).join("\n"),
        );
      return { file, name: file.slice(0, -".json".length), document: checked.document };
    });
}
