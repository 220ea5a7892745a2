import type { Page } from "playwright-core";

/** The list of the signed-in user's projects. */
export class ProjectsPage {
  constructor(readonly page: Page) {}

  async waitForList() {
    await this.page.waitForURL(/\/projects$/);
    await this.page.getByTestId("project-list").waitFor();
  }

  card(name: string) {
    return this.page.getByTestId("project-card").filter({ hasText: name });
  }

  /** Opens a project and returns its id from the URL. */
  async open(name: string): Promise<string> {
    await this.card(name).click();
    await this.page.waitForURL(/\/projects\/[0-9a-f-]{36}$/);
    return this.page.url().split("/").pop()!;
  }

  signedInAs() {
    return this.page.getByTestId("signed-in-as");
  }

  async signOut() {
    await this.page.getByTestId("sign-out").click();
    await this.page.waitForURL(/\/sign-in/);
  }
}
