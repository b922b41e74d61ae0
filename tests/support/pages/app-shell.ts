// The signed-in frame around every page: navigation, the person's name and role, sign-out.
import type { Page } from "playwright-core";

export class AppShell {
  constructor(readonly page: Page) {}

  readonly nav = () => this.page.getByTestId("main-nav");
  readonly userName = () => this.page.getByTestId("user-name");
  readonly userRole = () => this.page.getByTestId("user-role");
  readonly home = () => this.page.getByTestId("home");

  /** The labels of the navigation entries, top to bottom. */
  async navLabels(): Promise<string[]> {
    await this.nav().waitFor();
    return (await this.nav().getByRole("link").allTextContents()).map((label) => label.trim());
  }

  async signOut(): Promise<void> {
    await this.page.getByTestId("user-menu-button").click();
    await this.page.getByTestId("sign-out").click();
    await this.page.waitForURL((url) => url.pathname === "/sign-in");
  }
}
