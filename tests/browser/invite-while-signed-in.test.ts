// The demo mailbox's invitation links, opened where the admin is signed in: the page warns that accepting
// signs the admin out, offers a way back, and signs out only when asked. Inviting the same address again
// says that the earlier link was cancelled, and that link says so too.
import { expect, it } from "vitest";
import { useBrowser } from "../support/browser";
import { appUrl } from "../support/env";
import { AppShell, DEMO_BY_ROLE, InvitationPage, PeoplePage, SignInPage, journeyTimeout, uniqueEmail } from "../support/pages";
import { fillNewPassword } from "../support/pages/password-pages";

const browser = useBrowser();

it(
  "warns before an invitation replaces the signed-in admin's session; a repeated invitation cancels the earlier link",
  async () => {
    const email = uniqueEmail("warned");
    // A session of its own (not the shared demo one): this journey ends it.
    const context = await browser().newContext();
    const page = await context.newPage();
    const signIn = new SignInPage(page);
    await signIn.goto("/admin/users");
    await signIn.signIn(DEMO_BY_ROLE.admin.email, DEMO_BY_ROLE.admin.password);
    const people = new PeoplePage(page);
    await people.goto();
    await people.invite({ name: "Tomasz Ilves", email, role: "lead" });
    expect(await page.getByTestId("invite-replaced").count()).toBe(0);
    await people.invite({ name: "Tomasz Ilves", email, role: "lead" });
    expect(await page.getByTestId("invite-replaced").textContent()).toMatch(/earlier invitation to this address was cancelled/);

    // The demo mailbox: newest first, so the first mail to the address carries the link that works.
    await page.goto(appUrl("/admin/mailbox"));
    const mails = page.locator(`[data-testid="mail-item"][data-to="${email}"]`);
    // The mails go out from the queue's worker and may arrive after the page was drawn (on a busy 2-core
    // machine even the first one): read the mailbox again until both are there.
    await expect
      .poll(
        async () => {
          await page.reload();
          return mails.count();
        },
        { timeout: 45_000, interval: 1000 },
      )
      .toBe(2);
    const latest = (await mails.nth(0).getByTestId("mail-link").first().getAttribute("href"))!;
    const earlier = (await mails.nth(1).getByTestId("mail-link").first().getAttribute("href"))!;

    // The earlier link says it was cancelled.
    const invitation = new InvitationPage(page);
    await invitation.open(earlier);
    expect(await invitation.unusableMessage().textContent()).toMatch(/cancelled.*latest e-mail/);

    // The latest, opened while signed in as the admin: a warning, no form, and a way back.
    await invitation.open(latest);
    const warning = page.getByTestId("switch-account-warning");
    await warning.waitFor();
    expect(await warning.textContent()).toContain(
      `You are signed in as ${DEMO_BY_ROLE.admin.name}. Accepting this invitation signs you out of that account.`,
    );
    expect(await page.getByTestId("accept-invitation-form").count()).toBe(0);
    await page.getByTestId("stay-signed-in").click();
    await new AppShell(page).home().waitFor();
    expect(await new AppShell(page).userName().textContent()).toBe(DEMO_BY_ROLE.admin.name);

    // Asked again, the admin signs out and continues as the invitee.
    await invitation.open(latest);
    await page.getByTestId("switch-account").click();
    await page.getByTestId("accept-invitation-form").waitFor();
    await fillNewPassword(page, "tomasz-chose-this-one", "tomasz-chose-this-one");
    await page.getByTestId("accept-invitation-submit").click();
    await page.waitForURL((url) => url.pathname === "/home", { timeout: 20_000 });
    expect(await new AppShell(page).userName().textContent()).toBe("Tomasz Ilves");

    await context.close();
  },
  journeyTimeout(1),
);
