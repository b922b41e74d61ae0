// Every page of the signed-in app shows a loading skeleton (a loading.tsx in its folder or above it), and
// each skeleton renders busy: aria-busy, a status line "Loading …" for screen readers, and the page
// header's shape. The exceptions are listed with why: pages that answer 403 or 404 themselves for what
// they show (a draft, a version) must not stream a skeleton first, or the status would already be 200.
import fs from "node:fs";
import path from "node:path";
import { createElement, type ComponentType } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";

const root = path.resolve(import.meta.dirname, "..", "..");
// Written out: the bundler resolves each import when the test is transformed.
const LOADING: Record<string, () => Promise<{ default: ComponentType }>> = {
  home: () => import("@/app/(app)/home/loading"),
  profile: () => import("@/app/(app)/profile/loading"),
  "standards/(list)": () => import("@/app/(app)/standards/(list)/loading"),
  "libraries/(list)": () => import("@/app/(app)/libraries/(list)/loading"),
  "jobs/(list)": () => import("@/app/(app)/jobs/(list)/loading"),
  "runs/(list)": () => import("@/app/(app)/runs/(list)/loading"),
  "withdrawals/(list)": () => import("@/app/(app)/withdrawals/(list)/loading"),
  "audit/(trail)": () => import("@/app/(app)/audit/(trail)/loading"),
  "audit/runs": () => import("@/app/(app)/audit/runs/loading"),
  "admin/users": () => import("@/app/(app)/admin/users/loading"),
  "admin/mailbox": () => import("@/app/(app)/admin/mailbox/loading"),
};
const SECTIONS = Object.keys(LOADING);

/** Pages without a skeleton, each because it answers its own 403 or 404. */
const NO_SKELETON: Record<string, string> = {
  "standards/[slug]": "404 for a standard that does not exist",
  "standards/[slug]/versions/[number]": "404 for a version that does not exist",
  "standards/[slug]/diff": "404 for versions that do not exist",
  "standards/new": "403 for roles that do not write standards",
  "standards/drafts/[draftId]": "403 for roles that do not write standards, 404 for a draft that does not exist",
  "libraries/[slug]": "404 for a library that does not exist",
  "libraries/[slug]/versions/[number]": "404 for a version that does not exist",
  "libraries/[slug]/versions/[number]/entry": "404 for an entry that does not exist",
  "libraries/[slug]/diff": "404 for versions that do not exist",
  "jobs/new": "403 for roles that do not create jobs",
  "jobs/[jobNumber]": "404 for a job that does not exist",
  "jobs/[jobNumber]/edit": "403 for roles that do not change jobs, 404 for a job that does not exist",
  "jobs/[jobNumber]/run/[slug]": "403 for roles that do not run, 404 for a job or standard that does not exist",
  "runs/[id]": "404 for a run that does not exist",
  "audit/integrity": "403 for roles that do not verify the log's integrity; the check itself runs on a button",
  "runs/[id]/trace": "404 for a run that does not exist",
  "standards/[slug]/versions/[number]/runs": "404 for a version that does not exist",
  "withdrawals/[id]": "404 for a withdrawal that does not exist",
  "runs/compare": "two stored records read at once; a refusal (runs of different standards) is shown in the page",
  "libraries/new": "403 for roles that do not maintain the libraries",
  "libraries/drafts/[draftId]": "403 for roles that do not maintain the libraries, 404 for a draft that does not exist",
  // Nothing to wait for: the builder works in the browser.
  "libraries/builder": "nothing loads on the server but the access check",
};
/** Folders under app/(app) that hold a page.tsx: each is a section someone can click to. */
function sectionsWithPages(dir = path.join(root, "app", "(app)"), prefix = ""): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    if (!entry.isDirectory() || entry.name.startsWith("_")) return [];
    const name = prefix ? `${prefix}/${entry.name}` : entry.name;
    const here = fs.existsSync(path.join(dir, entry.name, "page.tsx")) ? [name] : [];
    return [...here, ...sectionsWithPages(path.join(dir, entry.name), name)];
  });
}

describe("loading states", () => {
  it("every page has one in its folder or above it, or is listed with why it has none", () => {
    const covered = (page: string) => SECTIONS.some((section) => page === section || page.startsWith(`${section}/`));
    expect(sectionsWithPages().filter((page) => !covered(page) && !(page in NO_SKELETON))).toEqual([]);
    expect(Object.keys(NO_SKELETON).filter((page) => covered(page))).toEqual([]);
    for (const section of SECTIONS)
      expect(fs.existsSync(path.join(root, "app", "(app)", section, "loading.tsx")), section).toBe(true);
  });

  it.each(SECTIONS)("%s renders a busy skeleton with a hidden 'Loading …' line", async (section) => {
    const { default: Loading } = await LOADING[section]();
    const html = renderToStaticMarkup(createElement(Loading));
    expect(html).toMatch(/^<div aria-busy="true" data-testid="page-loading"/);
    expect(html).toMatch(/<p role="status" class="sr-only">Loading [^<]+…<\/p>/);
    expect(html).toContain('aria-hidden="true"');
  });
});
