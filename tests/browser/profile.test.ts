// The profile page, as a person uses it: reached from the user menu; name, e-mail and role shown; a time
// zone chosen and kept; the password changed (a wrong current one refused in words), which signs out
// their other browser (told why on the sign-in page) and keeps this one; then sign-in takes the new
// password and refuses the old. The person joins by invitation in this run.
import { expect, it } from "vitest";
import { useBrowser } from "../support/browser";
import { appUrl } from "../support/env";
import { SignInPage, invitePersonAndAccept, journeyTimeout, openPeopleAsAdmin, uniqueEmail } from "../support/pages";

const browser = useBrowser();

it(
  "shows who you are, keeps a time zone, and changes the password, ending the other session",
  async () => {
    const person = {
      name: "Priya Castellanos-Ward",
      email: uniqueEmail("profile"),
      role: "engineer" as const,
      password: "my-first-gusset-password",
    };
    const newPassword = "a-second-and-better-password";
    const { context: adminContext, people } = await openPeopleAsAdmin(browser());
    const { context, page } = await invitePersonAndAccept(browser(), people, person);
    await adminContext.close();

    // A second browser of theirs, signed in too.
    const otherContext = await browser().newContext();
    const other = await otherContext.newPage();
    const otherSignIn = new SignInPage(other);
    await otherSignIn.goto("/projects");
    await otherSignIn.signIn(person.email, person.password);

    // From the user menu to the profile page.
    await page.getByTestId("user-menu-button").click();
    await page.getByTestId("profile-link").click();
    await page.waitForURL((url) => url.pathname === "/profile");
    expect(await page.getByTestId("profile-name").textContent()).toBe(person.name);
    expect(await page.getByTestId("profile-email").textContent()).toBe(person.email);
    expect(await page.getByTestId("profile-role").textContent()).toBe("Engineer");

    // A time zone, kept across a reload.
    await page.getByTestId("time-zone").selectOption("Pacific/Auckland");
    await page.getByTestId("time-zone-submit").click();
    expect(await page.getByTestId("time-zone-saved").textContent()).toContain("Pacific/Auckland".replace("_", " "));
    await page.reload();
    expect(await page.getByTestId("time-zone").inputValue()).toBe("Pacific/Auckland");

    // A wrong current password is refused beside its field.
    await page.getByTestId("current-password").fill("not-what-i-chose");
    await page.getByTestId("new-password").fill(newPassword);
    await page.getByTestId("confirm-password").fill(newPassword);
    await page.getByTestId("change-password-submit").click();
    expect(await page.getByTestId("current-password-error").textContent()).toMatch(/not your current password/);

    // The right one changes it; this browser stays signed in, the other is signed out.
    await page.getByTestId("current-password").fill(person.password);
    await page.getByTestId("change-password-submit").click();
    expect(await page.getByTestId("password-changed").textContent()).toMatch(/signed out of 1 other session/);
    expect(await page.getByTestId("current-password").inputValue()).toBe("");
    await page.getByTestId("nav-home").click();
    await page.getByTestId("home").waitFor();

    await other.getByTestId("nav-home").click();
    await other.waitForURL((url) => url.pathname === "/sign-in", { timeout: 15_000 });
    expect(await other.getByTestId("sign-in-reason").textContent()).toMatch(/password of this account was changed/);

    // Sign-in takes the new password and refuses the old one.
    expect(await otherSignIn.attempt(person.email, person.password)).toBe("error");
    expect(await otherSignIn.formError().textContent()).toMatch(/do not match/);
    await otherSignIn.signIn(person.email, newPassword);
    await other.goto(appUrl("/profile"));
    expect(await other.getByTestId("time-zone").inputValue()).toBe("Pacific/Auckland");

    await otherContext.close();
    await context.close();
  },
  journeyTimeout(4),
);
