import type { Page } from "playwright-core";
import { appUrl } from "../../support/browser";

/** The viewer with its live review panel. */
export class ReviewPage {
  constructor(readonly page: Page) {}

  async open(projectId: string) {
    await this.page.goto(appUrl(`/projects/${projectId}/viewer`));
    await this.page.getByTestId("review-panel").waitFor();
    await this.page.locator('[data-testid="connection-state"][data-state="connected"]').waitFor();
  }

  /** The project's review overview (Review sessions tab). */
  async openOverview() {
    await this.page.getByTestId("project-nav").getByRole("link", { name: "Review sessions" }).click();
    await this.page.waitForURL(/\/sessions$/);
  }

  sessionStatus() {
    return this.page.getByTestId("session-status");
  }

  async startPresenting() {
    await this.page.getByTestId("session-start").click();
  }

  presenceEntry(userName: string) {
    return this.page.getByTestId("presence-entry").filter({ hasText: userName });
  }

  newPinForm() {
    return this.page.getByTestId("new-pin-form");
  }

  async pinOnMember(memberId: string, title: string, details: string) {
    await this.page.getByTestId("pin-anchor-kind").selectOption("member");
    await this.page.getByTestId("pin-anchor-id").fill(memberId);
    await this.page.getByTestId("pin-title").fill(title);
    await this.newPinForm().getByLabel("Details").fill(details);
    await this.page.getByTestId("pin-submit").click();
  }

  pinItem(title: string) {
    return this.page.getByTestId("pin-item").filter({ hasText: title });
  }

  /** Replies in the open thread: a comment, or a step of its record (a decision may carry conditions). */
  async reply(body: string, kind?: "proposal" | "decision" | "supersession", conditions?: string) {
    await this.page.getByTestId("comment-body").fill(body);
    if (kind) await this.page.getByTestId("comment-kind").selectOption(kind);
    if (conditions) await this.page.getByTestId("comment-conditions").fill(conditions);
    await this.page.getByTestId("comment-submit").click();
  }

  /** The kinds of reply the open thread offers (none listed when only a comment is possible). */
  replyKinds() {
    return this.page.getByTestId("comment-kind").locator("option");
  }

  comment(text: string) {
    return this.page.getByTestId("comment").filter({ hasText: text });
  }
}
