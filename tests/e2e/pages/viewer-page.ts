import type { Page } from "playwright-core";
import { appUrl } from "../../support/browser";

type Counts = { tension: number; compression: number; "zero-force": number };

/** The 3D viewer of a project. */
export class ViewerPage {
  constructor(readonly page: Page) {}

  async open(projectId: string, revision?: number) {
    await this.page.goto(appUrl(`/projects/${projectId}/viewer${revision ? `?revision=${revision}` : ""}`));
    await this.legend.waitFor({ timeout: 60_000 });
  }

  get legend() {
    return this.page.getByTestId("viewer-legend");
  }

  get panel() {
    return this.page.getByTestId("member-panel");
  }

  async chooseResult(id: string) {
    await this.page.getByTestId("viewer-result").selectOption(id);
  }

  async legendResultLabel() {
    return this.page.getByTestId("legend-result").textContent();
  }

  /** The tension / compression / zero-force counts the legend shows. */
  async legendCounts(): Promise<Counts> {
    const read = async (key: string) => Number(await this.page.getByTestId(`legend-count-${key}`).textContent());
    return { tension: await read("tension"), compression: await read("compression"), "zero-force": await read("zero-force") };
  }

  /** Selects a member through the test hook (clicking into a WebGL canvas is unreliable headless). */
  async selectMember(id: string) {
    await this.page.waitForFunction(() => window.__strutroom !== undefined);
    await this.page.evaluate((memberId) => window.__strutroom!.selectMember(memberId), id);
    await this.panel.waitFor();
  }

  hookCounts(): Promise<Counts | null> {
    return this.page.evaluate(() => window.__strutroom!.getLegendCounts());
  }

  measureFrame() {
    return this.page.evaluate(() => window.__strutroom!.measureFrame());
  }
}
