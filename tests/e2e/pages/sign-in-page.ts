import type { Page } from "playwright-core";
import { appUrl } from "../../support/browser";

/** The sign-in screen. */
export class SignInPage {
  constructor(readonly page: Page) {}

  async open(callbackUrl?: string) {
    await this.page.goto(appUrl(callbackUrl ? `/sign-in?callbackUrl=${encodeURIComponent(callbackUrl)}` : "/sign-in"));
    await this.form.waitFor();
  }

  get form() {
    return this.page.getByTestId("sign-in-form");
  }

  async signIn(email: string, password: string) {
    await this.page.getByLabel("E-mail").fill(email);
    await this.page.getByLabel("Password").fill(password);
    await this.page.getByTestId("sign-in-submit").click();
  }

  /** The message shown beside the password field. */
  passwordError() {
    return this.page.getByTestId("password-error");
  }

  emailError() {
    return this.page.getByTestId("email-error");
  }
}
