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

  /** Fills the new-project form and submits it (organisationName only when the user has no organisation yet). */
  async createProject({ name, description = "", designStandard, organizationName }: { name: string; description?: string; designStandard?: string; organizationName?: string }) {
    const form = this.page.getByTestId("create-project-form");
    if (organizationName !== undefined) await form.getByLabel("Your organisation").fill(organizationName);
    await form.getByLabel("Project name").fill(name);
    await form.getByLabel("Description (optional)").fill(description);
    if (designStandard) await form.getByLabel("Design standard").selectOption({ label: designStandard });
    await this.page.getByTestId("create-project-submit").click();
  }

  projectNameError() {
    return this.page.getByTestId("project-name-error");
  }

  signedInAs() {
    return this.page.getByTestId("signed-in-as");
  }

  async signOut() {
    await this.page.getByTestId("sign-out").click();
    await this.page.waitForURL(/\/sign-in/);
  }
}
