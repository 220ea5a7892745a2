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

  /** Opens the toolbar's "View options" (filters, section box, deflected shape) unless it is open. */
  async openViewOptions() {
    const options = this.page.getByTestId("viewer-options");
    if (!(await options.evaluate((details) => (details as HTMLDetailsElement).open))) await options.locator("summary").click();
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

  /** Turns the camera to a preset view and waits until it has stopped moving. */
  async preset(name: "plan" | "isometric" | "elevationSouth" | "elevationEast") {
    await this.page.getByTestId(`viewer-preset-${name}`).click();
    await this.settle();
  }

  /**
   * Brings the canvas into the window (mouse clicks land only on what is inside it) and waits until the camera is
   * still: a corner node is drawn at the same pixel twice, 200 ms apart (also after a panel resized the canvas).
   */
  async settle(node = "T-0-0") {
    await this.page.getByTestId("viewer-canvas").scrollIntoViewIfNeeded();
    let last = "";
    for (let attempt = 0; attempt < 50; attempt += 1) {
      const now = JSON.stringify(await this.page.evaluate((id) => window.__strutroom!.screenOf("node", id), node));
      if (now === last) return;
      last = now;
      await this.page.waitForTimeout(200);
    }
    throw new Error("The camera did not come to rest.");
  }

  /** Client coordinates of a node, or of the point at fraction t along a member, as drawn now. */
  async screenOf(kind: "member" | "node", id: string, t = 0.5): Promise<{ x: number; y: number }> {
    const at = await this.page.evaluate(([k, i, f]) => window.__strutroom!.screenOf(k as "member" | "node", i as string, f as number), [kind, id, t] as const);
    if (!at) throw new Error(`${kind} ${id} is not on screen.`);
    return at;
  }

  selection() {
    return this.page.evaluate(() => window.__strutroom!.selection());
  }

  async resultId(): Promise<string> {
    return this.page.getByTestId("viewer-result").inputValue();
  }

  measureFrame() {
    return this.page.evaluate(() => window.__strutroom!.measureFrame());
  }
}
