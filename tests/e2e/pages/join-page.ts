import type { Page } from "playwright-core";

/** The page behind an invitation link. */
export class JoinPage {
  constructor(readonly page: Page) {}

  async open(link: string) {
    await this.page.goto(link);
  }

  notice() {
    return this.page.getByTestId("join-notice");
  }

  async join(name: string, password: string) {
    await this.page.getByLabel("Your name").fill(name);
    await this.page.getByLabel("Choose a password").fill(password);
    await this.page.getByTestId("join-submit").click();
  }

  passwordError() {
    return this.page.getByTestId("password-error");
  }
}
