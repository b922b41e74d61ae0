// The trade's words on screen: a job (not a project), standards (not a library of templates), an
// invitation is cancelled (withdrawing is for a template version), a date column says when something
// was created. Checks the text people read — JSX text and string literals in app/ and components/,
// and the role summaries — not identifiers (the database still says projects until jobs are reshaped).
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { ROLE_SUMMARIES } from "@/lib/domain/roles";
import { inviteUserSchema } from "@/lib/domain/schemas/users";

const root = path.resolve(import.meta.dirname, "..", "..");
// "Library" names the firm's libraries of sections, materials and load-combination sets, and appears in
// "library of calculation standards" (the product's own description); standards themselves are never a
// "template library", a "library of templates" or "the standards library".
const NOT_YET: string[] = [];
const WRONG = [
  /\bprojects?\b/i,
  /\b(templates?|standards?) library\b|\blibrary of (templates|standards)\b/i,
  /\bwithdraw(n|ing|s)?\b.*\binvitation|\binvitation.*\bwithdraw/i,
  /\bset up\b/i,
];

/** The text a person reads in a .tsx/.ts file: JSX text and the contents of string literals. */
function visibleText(source: string): string[] {
  const withoutImports = source.replace(/^import .*$/gm, "").replace(/\/\/.*$|\/\*[\s\S]*?\*\//gm, "");
  const jsxText = [...withoutImports.matchAll(/>([^<>{}]*[A-Za-z][^<>{}]*)</g)].map((m) => m[1]);
  const literals = [...withoutImports.matchAll(/"([^"\n]*)"|`([^`]*)`/g)].map((m) => m[1] ?? m[2]);
  // A permission or a test id ("jobs.read", "nav-projects") is not read by anyone.
  return [...jsxText, ...literals].filter((text) => !/^[a-z-]+\.[a-z-]+$/.test(text) && !/^[a-z0-9-]+$/.test(text));
}

function files(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    if (NOT_YET.some((skip) => full.endsWith(skip))) return [];
    if (entry.isDirectory()) return files(full);
    return /\.tsx?$/.test(entry.name) ? [full] : [];
  });
}

describe("words on screen", () => {
  it("app/ and components/ say jobs and standards, cancel invitations, and head dates 'Created'", () => {
    const found = [...files(path.join(root, "app")), ...files(path.join(root, "components"))].flatMap((file) =>
      visibleText(fs.readFileSync(file, "utf8"))
        .filter((text) => WRONG.some((word) => word.test(text)))
        .map((text) => `${path.relative(root, file)}: ${text.trim()}`),
    );
    expect(found).toEqual([]);
  });

  it("the check finds the old words (so it can fail)", () => {
    expect(
      visibleText('<EmptyState title="No projects yet">Set up a project</EmptyState>').filter((t) =>
        WRONG.some((w) => w.test(t)),
      ),
    ).toHaveLength(2);
  });

  it("finds standards called a library, and lets the firm's libraries of sections be", () => {
    const wrong = (text: string) => WRONG.some((w) => w.test(text));
    expect(["Open the template library", "the standards library", "A library of templates"].filter(wrong)).toHaveLength(3);
    expect(["Firm sections library", "Back to the library", "Libraries"].filter(wrong)).toEqual([]);
  });

  it("the role summaries use them too", () => {
    for (const summary of Object.values(ROLE_SUMMARIES)) expect(summary).not.toMatch(/\bprojects?\b/i);
  });

  it("the invitation form asks for 'an' e-mail address, not 'your'", () => {
    const result = inviteUserSchema.safeParse({ email: "", name: "Someone", role: "engineer" });
    expect(result.success).toBe(false);
    expect(result.error?.issues.map((issue) => issue.message)).toContain("Enter an e-mail address.");
  });
});
