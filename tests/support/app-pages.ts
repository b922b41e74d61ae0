// Every page a person can reach, and who reaches it: the one list the page-by-page browser checks
// (accessibility.test.ts with axe, phone-width.test.ts at 390 px) walk through. A new page is one more
// line here, e.g. { name: "profile", path: "/profile", visitors: SIGNED_IN }.
import type { Browser, BrowserContext, Page } from "playwright-core";
import type { Role } from "@/lib/domain/roles";
import { appUrl } from "./env";
import { demoSession, toBrowserCookies } from "./pages/sessions";

export type Visitor = "anonymous" | Role;

export type AppPage = {
  name: string;
  path: string;
  visitors: Visitor[];
  /** Only while the app runs with the fake SMTP server (else it answers 404). */
  mailbox?: true;
};

export const SIGNED_IN: Role[] = ["admin", "lead", "engineer", "auditor"];
const WORK: Role[] = ["lead", "engineer", "auditor"];

export const APP_PAGES: AppPage[] = [
  { name: "sign-in", path: "/sign-in", visitors: ["anonymous"] },
  { name: "forgot password", path: "/forgot-password", visitors: ["anonymous"] },
  { name: "reset password, bad link", path: "/reset-password?token=not-a-real-token", visitors: ["anonymous"] },
  { name: "invitation, bad link", path: "/invite/not-a-real-token", visitors: ["anonymous"] },
  { name: "home", path: "/home", visitors: SIGNED_IN },
  { name: "profile", path: "/profile", visitors: SIGNED_IN },
  { name: "standards", path: "/standards", visitors: WORK },
  { name: "jobs", path: "/jobs", visitors: WORK },
  { name: "runs", path: "/runs", visitors: WORK },
  { name: "audit trail", path: "/audit", visitors: ["admin", "auditor"] },
  { name: "people", path: "/admin/users", visitors: ["admin", "auditor"] },
  { name: "demo mailbox", path: "/admin/mailbox", visitors: ["admin"], mailbox: true },
  { name: "403, not part of the role", path: "/runs", visitors: ["admin"] },
  { name: "403, not part of the role", path: "/audit", visitors: ["lead", "engineer"] },
  { name: "403, not part of the role", path: "/admin/mailbox", visitors: ["auditor"] },
  { name: "404", path: "/no-such-page-here", visitors: ["anonymous", ...SIGNED_IN] },
];

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
export function visitorContexts(browser: () => Browser, options: { width: number; height: number; bypassCSP?: boolean }) {
  const contexts = new Map<Visitor, Promise<BrowserContext>>();
  const contextFor = (visitor: Visitor) => {
    if (!contexts.has(visitor)) {
      contexts.set(
        visitor,
        (async () => {
          const context = await browser().newContext({
            viewport: { width: options.width, height: options.height },
            bypassCSP: options.bypassCSP ?? false,
          });
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
      const page = await (await contextFor(visitor)).newPage();
      await page.goto(appUrl(path), { waitUntil: "load" });
      await page.waitForFunction(() => (window as unknown as { next?: { appDir?: boolean } }).next?.appDir === true);
      await page.waitForLoadState("networkidle");
      return page;
    },
    async closeAll(): Promise<void> {
      for (const context of contexts.values()) await (await context).close();
    },
  };
}
