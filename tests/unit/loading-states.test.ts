// Every section of the signed-in app has a loading.tsx, and each renders the busy skeleton: aria-busy,
// a status line "Loading …" for screen readers, and the page header's shape.
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
  standards: () => import("@/app/(app)/standards/loading"),
  jobs: () => import("@/app/(app)/jobs/loading"),
  runs: () => import("@/app/(app)/runs/loading"),
  audit: () => import("@/app/(app)/audit/loading"),
  "admin/users": () => import("@/app/(app)/admin/users/loading"),
  "admin/mailbox": () => import("@/app/(app)/admin/mailbox/loading"),
};
const SECTIONS = Object.keys(LOADING);

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
  it("every section with a page has one", () => {
    expect(sectionsWithPages().sort()).toEqual([...SECTIONS].sort());
  });

  it.each(SECTIONS)("%s renders a busy skeleton with a hidden 'Loading …' line", async (section) => {
    const { default: Loading } = await LOADING[section]();
    const html = renderToStaticMarkup(createElement(Loading));
    expect(html).toMatch(/^<div aria-busy="true" data-testid="page-loading"/);
    expect(html).toMatch(/<p role="status" class="sr-only">Loading [^<]+…<\/p>/);
    expect(html).toContain('aria-hidden="true"');
  });
});
