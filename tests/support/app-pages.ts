// Every page a person can reach, who reaches it and what they get: the one list page-walk.test.ts walks
// through (the policy, axe, 390 px). One visitor per page is enough where the page is the same for every role that
// reaches it (who may reach what is the access matrices' job); pages that differ by role (home, people) keep several. A new page is one more line here, e.g.
//   { name: "profile", entry: "/(app)/profile/page", path: "/profile", visitors: SIGNED_IN },
// and the walk fails until every page the build contains (its app-paths manifest) has a line.
import type { Browser, BrowserContext, Page, Response } from "playwright-core";
import type { Role } from "@/lib/domain/roles";
import { appUrl } from "./env";
import { demoSession, toBrowserCookies } from "./pages/sessions";

export type Visitor = "anonymous" | Role;

export type AppPage = {
  name: string;
  /** The build's app-paths-manifest entry the address is served by. */
  entry: string;
  path: string;
  /** What the visitors get (after any redirect); 200 unless said. */
  status?: number;
  visitors: Visitor[];
  /** Only while the app runs with the fake SMTP server (else it answers 404). */
  mailbox?: true;
};

export const SIGNED_IN: Role[] = ["admin", "lead", "engineer", "auditor"];

export const APP_PAGES: AppPage[] = [
  { name: "the bare address", entry: "/page", path: "/", visitors: ["anonymous", "engineer"] }, // sign-in or home
  { name: "sign-in", entry: "/(auth)/sign-in/page", path: "/sign-in", visitors: ["anonymous"] },
  { name: "forgot password", entry: "/(auth)/forgot-password/page", path: "/forgot-password", visitors: ["anonymous"] },
  {
    name: "reset password, bad link",
    entry: "/(auth)/reset-password/page",
    path: "/reset-password?token=not-a-real-token",
    visitors: ["anonymous"],
  },
  {
    name: "invitation, bad link",
    entry: "/(auth)/invite/[token]/page",
    path: "/invite/not-a-real-token",
    visitors: ["anonymous"],
  },
  { name: "home", entry: "/(app)/home/page", path: "/home", visitors: SIGNED_IN },
  { name: "profile", entry: "/(app)/profile/page", path: "/profile", visitors: ["engineer"] },
  { name: "standards", entry: "/(app)/standards/(list)/page", path: "/standards", visitors: ["lead"] },
  // A starting standard the seed publishes, in its two versions.
  { name: "a standard", entry: "/(app)/standards/[slug]/page", path: "/standards/simply-supported-beam", visitors: ["engineer"] },
  {
    name: "a standard's version",
    entry: "/(app)/standards/[slug]/versions/[number]/page",
    path: "/standards/portal-frame/versions/1",
    visitors: ["auditor"],
  },
  {
    name: "a version's runs",
    entry: "/(app)/standards/[slug]/versions/[number]/runs/page",
    path: "/standards/portal-frame/versions/1/runs",
    visitors: ["auditor"],
  },
  {
    name: "two versions compared",
    entry: "/(app)/standards/[slug]/diff/page",
    path: "/standards/simply-supported-beam/diff?from=1&to=2",
    visitors: ["lead"],
  },
  { name: "new standard", entry: "/(app)/standards/new/page", path: "/standards/new", visitors: ["lead"] },
  { name: "libraries", entry: "/(app)/libraries/(list)/page", path: "/libraries", visitors: ["admin"] },
  // The starting libraries the seed publishes (scripts/lib/seed-libraries.ts), each kind once.
  {
    name: "a section library",
    entry: "/(app)/libraries/[slug]/page",
    path: "/libraries/firm-sections",
    visitors: ["engineer"],
  },
  {
    name: "a material library's version",
    entry: "/(app)/libraries/[slug]/versions/[number]/page",
    path: "/libraries/materials/versions/1",
    visitors: ["auditor"],
  },
  {
    name: "a combination-set library",
    entry: "/(app)/libraries/[slug]/page",
    path: "/libraries/load-combinations",
    visitors: ["lead"],
  },
  {
    name: "a library section",
    entry: "/(app)/libraries/[slug]/versions/[number]/entry/page",
    path: "/libraries/firm-sections/versions/1/entry?key=GI+300x150x10.5",
    visitors: ["engineer"],
  },
  // A difference to a version that does not exist is a 404 (the library journey publishes firm-sections' version 2).
  {
    name: "a library difference",
    entry: "/(app)/libraries/[slug]/diff/page",
    path: "/libraries/firm-sections/diff?from=1&to=999",
    status: 404,
    visitors: ["lead"],
  },
  {
    name: "section builder",
    entry: "/(app)/libraries/builder/page",
    path: "/libraries/builder",
    visitors: ["admin"],
  },
  { name: "new library", entry: "/(app)/libraries/new/page", path: "/libraries/new", visitors: ["lead"] },
  // A real library draft is opened by the library journey (tests/browser/library-journey.test.ts), with axe.
  {
    name: "a library draft that does not exist",
    entry: "/(app)/libraries/drafts/[draftId]/page",
    path: "/libraries/drafts/not-a-real-draft",
    status: 404,
    visitors: ["admin"],
  },
  // A real draft is opened by the standards journey (tests/browser/standards-journey.test.ts), with axe.
  {
    name: "a draft that does not exist",
    entry: "/(app)/standards/drafts/[draftId]/page",
    path: "/standards/drafts/not-a-real-draft",
    status: 404,
    visitors: ["lead"],
  },
  { name: "jobs", entry: "/(app)/jobs/(list)/page", path: "/jobs", visitors: ["engineer"] },
  { name: "runs", entry: "/(app)/runs/(list)/page", path: "/runs", visitors: ["auditor"] },
  // A demo job the seed makes, and a starting standard run in it. A real run's page is opened, with axe, by the
  // run journey (tests/browser/run-journey.test.ts).
  { name: "new job", entry: "/(app)/jobs/new/page", path: "/jobs/new", visitors: ["engineer"] },
  { name: "a job", entry: "/(app)/jobs/[jobNumber]/page", path: "/jobs/MF-2291", visitors: ["lead"] },
  { name: "a job's details", entry: "/(app)/jobs/[jobNumber]/edit/page", path: "/jobs/MF-2291/edit", visitors: ["lead"] },
  {
    name: "the run form",
    entry: "/(app)/jobs/[jobNumber]/run/[slug]/page",
    path: "/jobs/MF-2291/run/fixed-end-beam",
    visitors: ["engineer"],
  },
  {
    name: "the calc sheet of a run that does not exist",
    entry: "/(sheet)/runs/[id]/sheet/page",
    path: "/runs/00000000-0000-4000-8000-000000000000/sheet",
    status: 404,
    visitors: ["engineer"],
  },
  {
    name: "a run that does not exist",
    entry: "/(app)/runs/[id]/page",
    path: "/runs/00000000-0000-4000-8000-000000000000",
    status: 404,
    visitors: ["auditor"],
  },
  // A real run's trace is opened, with axe, by the trace journey (tests/browser/trace-journey.test.ts).
  {
    name: "the trace of a run that does not exist",
    entry: "/(app)/runs/[id]/trace/page",
    path: "/runs/00000000-0000-4000-8000-000000000000/trace",
    status: 404,
    visitors: ["auditor"],
  },
  { name: "withdrawals", entry: "/(app)/withdrawals/(list)/page", path: "/withdrawals", visitors: ["auditor", "engineer"] },
  // The impact report of a withdrawal; a real one is walked by the withdrawal journey (tests/browser).
  {
    name: "the impact report of a withdrawal that does not exist",
    entry: "/(app)/withdrawals/[id]/page",
    path: "/withdrawals/00000000-0000-4000-8000-000000000000",
    status: 404,
    visitors: ["auditor"],
  },
  // Without two runs chosen, the comparison says what to do; two real runs are compared by the run journey.
  { name: "compare runs, none chosen", entry: "/(app)/runs/compare/page", path: "/runs/compare", visitors: ["auditor"] },
  { name: "audit trail", entry: "/(app)/audit/(trail)/page", path: "/audit", visitors: ["auditor"] },
  // The run log differs by role: an admin reads it without links to runs and jobs, an auditor may download it.
  { name: "run log", entry: "/(app)/audit/runs/page", path: "/audit/runs", visitors: ["auditor", "admin"] },
  {
    name: "run log, filtered and sorted",
    entry: "/(app)/audit/runs/page",
    path: "/audit/runs?outcome=succeeded&pass=true&sort=utilisation",
    visitors: ["lead"],
  },
  { name: "integrity", entry: "/(app)/audit/integrity/page", path: "/audit/integrity", visitors: ["auditor"] },
  { name: "people", entry: "/(app)/admin/users/page", path: "/admin/users", visitors: ["admin", "auditor"] },
  { name: "demo mailbox", entry: "/(app)/admin/mailbox/page", path: "/admin/mailbox", visitors: ["admin"], mailbox: true },
  { name: "403, not part of the role", entry: "/(app)/runs/(list)/page", path: "/runs", status: 403, visitors: ["admin"] },
  { name: "403, not part of the role", entry: "/(app)/audit/(trail)/page", path: "/audit", status: 403, visitors: ["lead"] },
  {
    name: "403, not part of the role",
    entry: "/(app)/audit/runs/page",
    path: "/audit/runs",
    status: 403,
    visitors: ["engineer"],
  },
  {
    name: "403, not part of the role",
    entry: "/(app)/admin/mailbox/page",
    path: "/admin/mailbox",
    status: 403,
    visitors: ["auditor"],
  },
  { name: "404", entry: "/_not-found/page", path: "/no-such-page-here", status: 404, visitors: ["anonymous", "engineer"] },
  // Shown only while the database is down (tests/integration/database-outage.test.ts); 404 otherwise.
  { name: "unavailable, database up", entry: "/unavailable/page", path: "/unavailable", status: 404, visitors: ["anonymous"] },
];

/** Framework entries with no address of their own. */
export const NOT_PAGES = new Set(["/_global-error/page"]);

/** Every (page, visitor) pair, flattened, for it.each. */
export function pageVisits({ mailboxInUse }: { mailboxInUse: boolean }): { page: AppPage; visitor: Visitor; label: string }[] {
  return APP_PAGES.filter((page) => !page.mailbox || mailboxInUse).flatMap((page) =>
    page.visitors.map((visitor) => ({ page, visitor, label: `${page.name} (${page.path}) as ${visitor}` })),
  );
}

/**
 * One browser context per visitor and viewport, signed in as that demo person (or nobody), reused across
 * a test file; close them with closeAll().
 */
export function visitorContexts(browser: () => Browser, options: { width: number; height: number }) {
  const contexts = new Map<Visitor, Promise<BrowserContext>>();
  const contextFor = (visitor: Visitor) => {
    if (!contexts.has(visitor)) {
      contexts.set(
        visitor,
        (async () => {
          const context = await browser().newContext({ viewport: { width: options.width, height: options.height } });
          if (visitor !== "anonymous") await context.addCookies(toBrowserCookies(await demoSession(visitor)));
          return context;
        })(),
      );
    }
    return contexts.get(visitor)!;
  };
  return {
    /** A new page for the visitor, opened at `path` with the page's scripts run and the network quiet. */
    async open(visitor: Visitor, path: string): Promise<Page> {
      return (await this.visit(visitor, path)).page;
    },
    /** As open(), with the response, and `prepare` run on the page before it navigates. */
    async visit(
      visitor: Visitor,
      path: string,
      prepare?: (page: Page) => Promise<void>,
    ): Promise<{ page: Page; response: Response | null }> {
      const page = await (await contextFor(visitor)).newPage();
      await prepare?.(page);
      const response = await page.goto(appUrl(path), { waitUntil: "load" });
      await page.waitForFunction(() => (window as unknown as { next?: { appDir?: boolean } }).next?.appDir === true);
      await page.waitForLoadState("networkidle");
      return { page, response };
    },
    async closeAll(): Promise<void> {
      for (const context of contexts.values()) await (await context).close();
    },
  };
}

export const PHONE = { width: 390, height: 844 };

/** How wide the document is against the window's width, and the elements that reach past its right edge. */
export function measureWidth(page: Page) {
  return page.evaluate(() => {
    const root = document.documentElement;
    const escaping = [...document.querySelectorAll<HTMLElement>("body *")]
      .filter((element) => element.getBoundingClientRect().right > root.clientWidth + 1)
      // Inside a box that scrolls sideways is fine: that box is what scrolls, not the page.
      .filter((element) => !element.parentElement?.closest('[class*="overflow-x-auto"]'))
      .slice(0, 5)
      .map(
        (element) =>
          `${element.tagName.toLowerCase()}${element.dataset.testid ? `[${element.dataset.testid}]` : ""}.${element.className}`,
      );
    return { scrollWidth: root.scrollWidth, clientWidth: root.clientWidth, escaping };
  });
}
