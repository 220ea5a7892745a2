// Page objects for the screens of issue 8: the captured-mail page, a pin thread's attachments in the viewer's live
// review, and the report page.
import type { Page } from "playwright-core";

/** The owners' captured-mail page (development). */
export class CapturedMailPage {
  constructor(readonly page: Page) {}

  async open(projectId: string) {
    await this.page.goto(`/projects/${projectId}/mail`);
    await this.page.getByTestId("captured-mail").waitFor();
  }

  /** Reloads until a mail to `to` with the subject shows up (the jobs process sends the outbox every few seconds). */
  async waitForMail(projectId: string, to: string, subject: RegExp, attempts = 30) {
    for (let attempt = 0; attempt < attempts; attempt += 1) {
      await this.open(projectId);
      const item = this.page.getByTestId("captured-mail-item").filter({ hasText: to }).filter({ hasText: subject });
      if ((await item.count()) > 0) return item.first();
      await this.page.waitForTimeout(1000);
    }
    throw new Error(`No captured mail to ${to} matching ${subject}.`);
  }
}

/** The live review beside the 3D viewer: pins, a thread, and its comments' attachments. */
export class ReviewThreadPage {
  constructor(readonly page: Page) {}

  async open(projectId: string) {
    await this.page.goto(`/projects/${projectId}/viewer`);
    await this.page.locator('[data-testid="connection-state"][data-state="connected"]').waitFor({ timeout: 60_000 });
  }

  async selectPin(title: string) {
    await this.page.getByTestId("pin-item").filter({ hasText: title }).click();
    await this.page.getByTestId("pin-thread").waitFor();
  }

  comment(text: string) {
    return this.page.getByTestId("comment").filter({ hasText: text });
  }

  async attach(commentText: string, file: { name: string; mimeType: string; buffer: Buffer }) {
    await this.comment(commentText).getByTestId("attachment-input").setInputFiles(file);
  }
}

/** The report page: revision, results, comparison, and the CSV exports. */
export class ReportPage {
  constructor(readonly page: Page) {}

  async open(projectId: string) {
    await this.page.goto(`/projects/${projectId}/report`);
    await this.page.getByTestId("report-form").waitFor();
  }

  async chooseResults(ids: string[]) {
    for (const box of await this.page.getByTestId("report-form").locator('input[name="combinations"]').all()) {
      await box.setChecked(ids.includes(await box.getAttribute("value") ?? ""));
    }
  }

  async compare(first: string, second: string) {
    await this.page.getByTestId("report-compare-first").selectOption(first);
    await this.page.getByTestId("report-compare-second").selectOption(second);
  }

  /** Clicks "Make the PDF report"; resolves once the job's progress bar shows (queued or running). */
  async make() {
    await this.page.getByTestId("report-make").click();
    await this.page.getByTestId("report-job").getByTestId("job-progress").waitFor();
  }

  /** The stored report's download link once the job is done (the jobs process draws it meanwhile). */
  async madeFile(timeout = 120_000) {
    const link = this.page.getByTestId("report-file");
    await link.waitFor({ timeout });
    return link;
  }

  envelopeUrl(): Promise<string | null> {
    return this.page.getByTestId("export-envelope").getAttribute("href");
  }
}
