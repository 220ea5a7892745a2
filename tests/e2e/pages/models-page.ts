// Page object of the models page (the generate form, the revision list with each analysis's progress).
// Page scripts are functions, not strings: the app's CSP forbids eval, which string scripts need.
import type { Page } from "playwright-core";
import { appUrl } from "../../support/browser";

declare global {
  interface Window {
    __progressSeen?: string[];
  }
}

const PROGRESS_TEXT = '[data-testid="step-progress"] [role="status"], [data-testid="job-progress"] [role="status"]';

export class ModelsPage {
  constructor(private readonly page: Page) {}

  async open(projectId: string) {
    await this.page.goto(appUrl(`/projects/${projectId}/models`));
    await this.page.getByTestId("generate-form").waitFor();
    // Every progress text shown, however briefly (a step may last less than a poll), kept in the page.
    await this.page.evaluate((selector) => {
      const seen: string[] = [];
      window.__progressSeen = seen;
      new MutationObserver(() =>
        document.querySelectorAll(selector).forEach((el) => {
          const text = (el.textContent ?? "").trim();
          if (text && seen.at(-1) !== text) seen.push(text);
        }),
      ).observe(document.body, { subtree: true, childList: true, characterData: true });
    }, PROGRESS_TEXT);
  }

  progressSeen(): Promise<string[]> {
    return this.page.evaluate(() => window.__progressSeen ?? []);
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

  /** Waits until the revision's row says analysed and has been scrolled into the visible part of the page. */
  async analysedRowInView(number: number, timeout = 180_000) {
    await this.page.waitForFunction(
      (n) => {
        const row = document.querySelector(`[data-testid="revision-${n}"]`);
        if (!row || !/analysed/.test(row.querySelector('[data-testid="revision-analysis"]')?.textContent ?? "")) return false;
        const box = row.getBoundingClientRect();
        return box.top >= 0 && box.bottom <= window.innerHeight;
      },
      number,
      { timeout, polling: 250 },
    );
  }

  /** Whether the revision's row is wholly inside the visible part of the page. */
  rowInView(number: number): Promise<boolean> {
    return this.page.evaluate((n) => {
      const box = document.querySelector(`[data-testid="revision-${n}"]`)!.getBoundingClientRect();
      return box.top >= 0 && box.bottom <= window.innerHeight;
    }, number);
  }
}
