// "Forgot your password?" and the page the reset e-mail links to.
import type { Page } from "playwright-core";
import { appUrl } from "../env";

export class ForgotPasswordPage {
  constructor(readonly page: Page) {}

  readonly requested = () => this.page.getByTestId("reset-requested");

  async goto(): Promise<void> {
    await this.page.goto(appUrl("/forgot-password"));
  }

  async request(email: string): Promise<void> {
    await this.page.getByTestId("email").fill(email);
    await this.page.getByTestId("forgot-password-submit").click();
    await this.requested().waitFor();
  }
}

export class ResetPasswordPage {
  constructor(readonly page: Page) {}

  readonly formError = () => this.page.getByTestId("form-error");
  readonly linkInvalid = () => this.page.getByTestId("reset-link-invalid");

  async open(link: string): Promise<void> {
    await this.page.goto(link);
  }

  async submit(password: string, confirmation = password): Promise<void> {
    await fillNewPassword(this.page, password, confirmation);
    await this.page.getByTestId("reset-password-submit").click();
  }
}

/** The "choose a password" pair the reset and invitation pages share (components/new-password-fields.tsx). */
export async function fillNewPassword(page: Page, password: string, confirmation: string): Promise<void> {
  await page.getByTestId("new-password").fill(password);
  await page.getByTestId("confirm-password").fill(confirmation);
}
