// The admin's people page: invite, change a role, deactivate and reactivate.
import type { Page } from "playwright-core";
import type { Role } from "@/lib/domain/roles";
import { appUrl } from "../env";

export class PeoplePage {
  constructor(readonly page: Page) {}

  readonly inviteSent = () => this.page.getByTestId("invite-sent");
  readonly inviteEmailError = () => this.page.getByTestId("invite-email-error");
  /** A person's row; `state` narrows it to the row once it shows that status or role. */
  readonly row = (email: string, state = "") => this.page.locator(`[data-testid="user-row"][data-email="${email}"]${state}`);
  readonly pendingInvitation = (email: string) => this.page.locator(`[data-testid="pending-invitation"][data-email="${email}"]`);

  async goto(): Promise<void> {
    await this.page.goto(appUrl("/admin/users"));
    await this.page.getByTestId("users-table").waitFor();
  }

  /** Fills the invitation form and sends it; does not wait for the answer. */
  async submitInvitation({ name, email, role }: { name: string; email: string; role: Role }): Promise<void> {
    await this.page.getByTestId("invite-name").fill(name);
    await this.page.getByTestId("invite-email").fill(email);
    await this.page.getByTestId("invite-role").selectOption(role);
    await this.page.getByTestId("invite-submit").click();
  }

  async invite(invitee: { name: string; email: string; role: Role }): Promise<void> {
    await this.submitInvitation(invitee);
    await this.inviteSent().filter({ hasText: invitee.email }).waitFor();
  }

  async deactivate(email: string): Promise<void> {
    const row = this.row(email);
    await row.getByTestId("user-deactivate").click();
    await row.getByTestId("user-deactivate-confirm").click();
    await this.row(email, '[data-status="deactivated"]').waitFor();
  }

  async reactivate(email: string): Promise<void> {
    await this.row(email).getByTestId("user-reactivate").click();
    await this.row(email, '[data-status="active"]').waitFor();
  }

  async setRole(email: string, role: Role): Promise<void> {
    const row = this.row(email);
    await row.getByTestId("user-role-select").selectOption(role);
    await row.getByTestId("user-role-save").click();
    await this.row(email, `[data-role="${role}"]`).waitFor();
  }
}
