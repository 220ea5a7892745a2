import type { Page } from "playwright-core";
import { appUrl } from "../../support/browser";

/** The account page: name and password. */
export class AccountPage {
  constructor(readonly page: Page) {}

  async open() {
    await this.page.goto(appUrl("/account"));
    await this.page.getByTestId("name-form").waitFor();
  }

  async rename(name: string) {
    await this.page.getByLabel("Name shown to your team").fill(name);
    await this.page.getByRole("button", { name: "Save name" }).click();
    await this.page.getByTestId("name-saved").waitFor();
  }

  async changePassword(current: string, next: string) {
    await this.page.getByLabel("Current password").fill(current);
    await this.page.getByLabel("New password").fill(next);
    await this.page.getByRole("button", { name: "Change password" }).click();
  }

  currentPasswordError() {
    return this.page.getByTestId("currentPassword-error");
  }
}
