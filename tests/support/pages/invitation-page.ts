// The page an invitation link opens: who is invited and as what, then choose a password.
import type { Page } from "playwright-core";
import { fillNewPassword } from "./password-pages";

export class InvitationPage {
  constructor(readonly page: Page) {}

  readonly details = () => this.page.getByTestId("invitation-details");
  readonly invitedName = () => this.page.getByTestId("invitation-name");
  readonly invitedRole = () => this.page.getByTestId("invitation-role");
  readonly unusable = () => this.page.getByTestId("invitation-unusable");
  readonly unusableMessage = () => this.page.getByTestId("invitation-message");
  readonly passwordError = () => this.page.getByTestId("new-password-error");
  readonly confirmError = () => this.page.getByTestId("confirm-password-error");

  async open(link: string): Promise<void> {
    await this.page.goto(link);
    await this.details().or(this.unusable()).first().waitFor();
  }

  async submitPasswords(password: string, confirmation = password): Promise<void> {
    await fillNewPassword(this.page, password, confirmation);
    await this.page.getByTestId("accept-invitation-submit").click();
  }

  /** Sets the password and waits to land signed in on the home page. */
  async accept(password: string): Promise<void> {
    await this.submitPasswords(password);
    await this.page.waitForURL((url) => url.pathname === "/home", { timeout: 20_000 });
  }
}
