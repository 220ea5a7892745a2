import type { Browser, Page } from "playwright-core";
import { appUrl, newContext } from "../../support/browser";

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

/** Signs in through the sign-in screen and waits for the project list. */
export async function signInAs(page: Page, email: string, password: string): Promise<void> {
  const signIn = new SignInPage(page);
  await signIn.open();
  await signIn.signIn(email, password);
  await page.waitForURL(/\/projects$/);
}

/** A page in a fresh browser context, signed in as this person. */
export async function signedInPage(browser: Browser, email: string, password: string): Promise<Page> {
  const page = await (await newContext(browser)).newPage();
  await signInAs(page, email, password);
  return page;
}
