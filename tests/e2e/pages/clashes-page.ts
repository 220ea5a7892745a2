// Page object for the clashes screen (issue 7): table, filters, the selected clash's panel and its forms.
import type { Page } from "playwright-core";
import { appUrl } from "../../support/browser";
import { inView, waitInView } from "./progress-watch";

const HANG_RESULT = '[data-testid="hang-services-result"]';

export class ClashesPage {
  constructor(readonly page: Page) {}

  async open(projectId: string, revision: number) {
    await this.page.goto(appUrl(`/projects/${projectId}/clashes?revision=${revision}`));
    await this.page.getByTestId("clash-table").waitFor({ timeout: 60_000 });
  }

  /** Opens the page without choosing a revision: the current one. */
  async openDefault(projectId: string) {
    await this.page.goto(appUrl(`/projects/${projectId}/clashes`));
    await this.page.getByTestId("clash-table").waitFor({ timeout: 60_000 });
  }

  count() {
    return this.page.getByTestId("clash-count").textContent();
  }

  rows() {
    return this.page.getByTestId("clash-row");
  }

  caution() {
    return this.page.getByTestId("standing-caution").textContent();
  }

  async filter(by: "system" | "state" | "outcome" | "envelopeState", value: string) {
    await this.page.getByTestId(`clash-filter-${by}`).selectOption(value);
  }

  /** Selects the first clash of a run (flies the viewer there and opens its panel). */
  async select(runId: string) {
    await this.rows().filter({ hasText: runId }).first().getByTestId("clash-show").click();
    await this.page.getByTestId("clash-panel").waitFor();
  }

  outcome() {
    return this.page.getByTestId("clash-outcome");
  }

  async propose(outcome: string, note: string) {
    await this.page.getByTestId("propose-outcome").selectOption(outcome);
    await this.page.getByTestId("propose-note").fill(note);
    await this.page.getByTestId("propose-submit").click();
  }

  proposeForm() {
    return this.page.getByTestId("propose-form");
  }

  decideForm() {
    return this.page.getByTestId("decide-form");
  }

  async accept(conditions: string) {
    await this.page.getByTestId("decide-accept").check();
    await this.page.getByTestId("decide-text").fill(conditions);
    await this.page.getByTestId("decide-submit").click();
  }

  async refuse(reason: string) {
    await this.page.getByTestId("decide-refuse").check();
    await this.page.getByTestId("decide-text").fill(reason);
    await this.page.getByTestId("decide-submit").click();
  }

  history() {
    return this.page.getByTestId("clash-history").locator("li");
  }

  /** Asks to hang the services' weight as a load case of a new revision; resolves once the queued job's box shows. */
  async hangServices() {
    await this.page.getByTestId("hang-services-submit").click();
    await this.page.locator(HANG_RESULT).waitFor({ timeout: 60_000 });
  }

  hangResultInView(): Promise<boolean> {
    return inView(this.page, HANG_RESULT);
  }

  /** Waits until the hanging and then the new revision's analysis are done (no progress bar, no failure left) and the result is in view. */
  hangAnalysedInView() {
    return waitInView(this.page, HANG_RESULT, /Revision \d+ created/, { pending: '[data-testid="job-progress"], [data-testid="job-failed"]' });
  }
}
