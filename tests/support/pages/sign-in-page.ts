// The sign-in page as a person uses it. signIn() waits out the server's sign-in rate limit the way a
// patient person would: when the page says "Too many attempts", wait a minute and press again.
import type { Page } from "playwright-core";
import { appUrl } from "../env";
import { SIGN_IN_MINUTE_MS } from "./timeouts";

const RATE_LIMITED = /too many attempts/i;

export class SignInPage {
  constructor(readonly page: Page) {}

  readonly email = () => this.page.getByTestId("email");
  readonly password = () => this.page.getByTestId("password");
  readonly submitButton = () => this.page.getByTestId("sign-in-submit");
  readonly formError = () => this.page.getByTestId("form-error");
  readonly formNotice = () => this.page.getByTestId("form-notice");
  readonly emailError = () => this.page.getByTestId("email-error");
  readonly passwordError = () => this.page.getByTestId("password-error");

  async goto(next?: string): Promise<void> {
    await this.page.goto(appUrl(next ? `/sign-in?next=${encodeURIComponent(next)}` : "/sign-in"));
    await this.submitButton().waitFor();
  }

  async fillAndSubmit(email: string, password: string): Promise<void> {
    await this.email().fill(email);
    await this.password().fill(password);
    await this.submitButton().click();
  }

  /**
   * Submits and waits for the answer: left the page (signed in) or a message on it. A "too many
   * attempts" answer is waited out (refused attempts do not count, so the limiter frees up within
   * a minute) and the form sent again; any other message is returned as "error".
   */
  async attempt(email: string, password: string, { patienceMs = 150_000 } = {}): Promise<"signed-in" | "error"> {
    const deadline = Date.now() + patienceMs;
    for (;;) {
      await this.fillAndSubmit(email, password);
      // Both waits settle (the loser by timing out later), so neither leaves an unhandled rejection.
      const left = this.page
        .waitForURL((url) => !url.pathname.startsWith("/sign-in"), { timeout: 20_000 })
        .then(
          () => "signed-in" as const,
          () => "no answer" as const,
        );
      const refused = this.formError()
        .waitFor({ timeout: 20_000 })
        .then(
          () => "error" as const,
          () => "no answer" as const,
        );
      const outcome = await Promise.race([left, refused]);
      if (outcome === "signed-in") return outcome;
      if (outcome === "no answer") throw new Error(`signing in as ${email}: no answer within 20 s`);
      const message = (await this.formError().textContent()) ?? "";
      if (!RATE_LIMITED.test(message) || Date.now() > deadline) return "error";
      await this.page.waitForTimeout(SIGN_IN_MINUTE_MS);
    }
  }

  /** Signs in and waits to leave the sign-in page; throws with the page's message if refused. */
  async signIn(email: string, password: string): Promise<void> {
    if ((await this.attempt(email, password)) === "signed-in") return;
    throw new Error(`sign-in as ${email} refused: ${await this.formError().textContent()}`);
  }
}
