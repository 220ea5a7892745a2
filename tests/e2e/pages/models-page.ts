// Page object of the models page (the generate and upload forms, the revision list with each analysis's progress).
import type { Page } from "playwright-core";
import { appUrl } from "../../support/browser";
import { inView, progressSeen, waitInView, watchProgress, whollyOutOfView } from "./progress-watch";

export class ModelsPage {
  constructor(private readonly page: Page) {}

  async open(projectId: string) {
    await this.page.goto(appUrl(`/projects/${projectId}/models`));
    await this.page.getByTestId("generate-form").waitFor();
    await this.page.getByTestId("revision-list").waitFor();
    await watchProgress(this.page);
  }

  progressSeen(): Promise<string[]> {
    return progressSeen(this.page);
  }

  async generate(name: string) {
    await this.page.locator("#roof-name").fill(name);
    await this.page.getByTestId("generate-submit").click();
    return this.savedNumber();
  }

  private async savedNumber(): Promise<number> {
    const saved = this.page.getByTestId("revision-saved");
    await this.page.waitForFunction(() => /Revision \d+ saved/.test(document.querySelector('[data-testid="revision-saved"]')?.textContent ?? ""), undefined, { timeout: 60_000 });
    return Number(/Revision (\d+) saved/.exec((await saved.textContent()) ?? "")![1]);
  }

  /** Uploads one model file through the upload form (presigned upload, then the server's check and the job). */
  async upload(file: { name: string; mimeType: string; buffer: Buffer }) {
    await this.page.getByTestId("upload-files").setInputFiles(file);
    await this.page.getByTestId("upload-submit").click();
    return this.savedNumber();
  }

  /** Waits until the revision's row says analysed and has been scrolled into the visible part of the page. */
  analysedRowInView(number: number, timeout = 180_000) {
    return waitInView(this.page, `[data-testid="revision-${number}"]`, /analysed/, { timeout });
  }

  /** Whether the revision's row is wholly in view. */
  rowInView(number: number): Promise<boolean> {
    return inView(this.page, `[data-testid="revision-${number}"]`);
  }

  /** Whether no part of the revision list is in view. */
  listOutOfView(): Promise<boolean> {
    return whollyOutOfView(this.page, '[data-testid="revision-list"]');
  }
}
