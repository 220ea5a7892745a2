import type { Page } from "playwright-core";
import { appUrl } from "../../support/browser";

/** A project's overview: header, section nav, team, and for owners the invite panel. */
export class ProjectOverviewPage {
  constructor(readonly page: Page) {}

  async open(projectId: string) {
    await this.page.goto(appUrl(`/projects/${projectId}`));
    await this.header.waitFor();
  }

  get header() {
    return this.page.getByTestId("project-header");
  }

  get nav() {
    return this.page.getByTestId("project-nav");
  }

  get invitePanel() {
    return this.page.getByTestId("invite-panel");
  }

  members() {
    return this.page.getByTestId("team-member");
  }

  roleSelect(email: string) {
    return this.page.getByTestId(`role-select-${email}`);
  }

  async waitForTeam(count: number) {
    await this.page.waitForFunction((n) => document.querySelectorAll('[data-testid="team-member"]').length >= n, count);
  }

  /** Fills and sends the invite form. */
  async submitInvite(email: string, roleLabel: string) {
    await this.page.getByLabel("E-mail").fill(email);
    await this.page.getByLabel("Role", { exact: true }).selectOption({ label: roleLabel });
    await this.page.getByTestId("invite-submit").click();
  }

  /** Invites an e-mail with a role and returns the join link shown. */
  async invite(email: string, roleLabel: string): Promise<string> {
    await this.submitInvite(email, roleLabel);
    const link = this.page.getByTestId("join-link");
    await link.waitFor();
    return link.inputValue();
  }

  pendingInvitation(email: string) {
    return this.page.getByTestId("pending-invitations").getByText(email);
  }

  async cancelInvitation(email: string) {
    await this.page.getByTestId(`cancel-invitation-${email}`).click();
  }

  /** Clicks a member's Remove button and accepts the confirmation. */
  async removeMember(email: string) {
    this.page.once("dialog", (dialog) => dialog.accept());
    await this.page.getByTestId(`remove-member-${email}`).click();
  }

  teamMessage() {
    return this.page.getByTestId("team-message");
  }

  inviteEmailError() {
    return this.page.getByTestId("invite-email-error");
  }
}
