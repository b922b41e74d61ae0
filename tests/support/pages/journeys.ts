// Steps several journeys share, each made of the page objects so that they go through the UI.
import type { Browser, BrowserContext, Page } from "playwright-core";
import type { Role } from "@/lib/domain/roles";
import { firstLink, waitForMessage } from "../mailbox";
import { InvitationPage } from "./invitation-page";
import { PeoplePage } from "./people-page";
import { demoSession, toBrowserCookies } from "./sessions";

/** A browser context signed in as the demo admin, on the people page. */
export async function openPeopleAsAdmin(browser: Browser): Promise<{ context: BrowserContext; people: PeoplePage }> {
  const context = await browser.newContext();
  await context.addCookies(toBrowserCookies(await demoSession("admin")));
  const people = new PeoplePage(await context.newPage());
  await people.goto();
  return { context, people };
}

/**
 * A new person, made the way a firm makes one: the admin invites them, the e-mail arrives, and they
 * choose a password from the link. Returns their own browser context, signed in on their home page.
 */
export async function invitePersonAndAccept(
  browser: Browser,
  people: PeoplePage,
  person: { name: string; email: string; role: Role; password: string },
): Promise<{ context: BrowserContext; page: Page }> {
  await people.invite(person);
  const mail = await waitForMessage({ to: person.email, subjectIncludes: "invited", timeoutMs: 15_000 });
  const context = await browser.newContext();
  const page = await context.newPage();
  const invitation = new InvitationPage(page);
  await invitation.open(firstLink(mail));
  await invitation.accept(person.password);
  return { context, page };
}
