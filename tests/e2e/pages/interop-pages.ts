// Page objects for the IFC and BCF import screens (issue 18): the roof on the models page, runs on the clashes page,
// pins on the review sessions page. Files are handed over as buffers written by the tests.
import type { Page } from "playwright-core";
import { appUrl } from "../../support/browser";

type Upload = { name: string; mimeType: string; buffer: Buffer };
const ifc = (name: string, text: string): Upload => ({ name, mimeType: "application/octet-stream", buffer: Buffer.from(text) });

export class IfcRoofImport {
  constructor(readonly page: Page) {}
  async open(projectId: string) {
    await this.page.goto(appUrl(`/projects/${projectId}/models`));
  }
  get form() {
    return this.page.getByTestId("ifc-roof-form");
  }
  async read(name: string, text: string) {
    await this.page.getByTestId("ifc-roof-file").setInputFiles(ifc(name, text));
    await this.page.getByTestId("ifc-roof-read").click();
  }
  problems() {
    return this.page.getByTestId("ifc-roof-problems").locator("li").allTextContents();
  }
  summary() {
    return this.page.getByTestId("ifc-roof-summary");
  }
  async save() {
    await this.page.getByTestId("ifc-roof-save").click();
    return (await this.page.getByTestId("revision-saved").textContent()) ?? "";
  }
}

export class IfcRunsImport {
  constructor(readonly page: Page) {}
  async open(projectId: string, revision: number) {
    await this.page.goto(appUrl(`/projects/${projectId}/clashes?revision=${revision}`));
    await this.page.getByTestId("clash-table").waitFor({ timeout: 60_000 });
  }
  get form() {
    return this.page.getByTestId("ifc-runs-form");
  }
  async preview(name: string, text: string) {
    await this.page.getByTestId("ifc-runs-file").setInputFiles(ifc(name, text));
    await this.page.getByTestId("ifc-runs-preview").click();
    await this.page.getByTestId("ifc-runs-summary").waitFor();
  }
  summary() {
    return this.page.getByTestId("ifc-runs-summary");
  }
  systems() {
    return this.page.getByTestId("ifc-runs-systems").locator("li").allTextContents();
  }
  problems() {
    return this.page.getByTestId("ifc-runs-problems").locator("li").allTextContents();
  }
  confirmButton() {
    return this.page.getByTestId("ifc-runs-confirm");
  }
  async confirm() {
    await this.confirmButton().click();
    return (await this.page.getByTestId("ifc-runs-done").textContent()) ?? "";
  }
  runIds() {
    return this.page.getByTestId("runs-list").locator("li span.font-mono").allTextContents();
  }
}

export class BcfImport {
  constructor(readonly page: Page) {}
  async open(projectId: string) {
    await this.page.goto(appUrl(`/projects/${projectId}/sessions`));
  }
  get form() {
    return this.page.getByTestId("bcf-import-form");
  }
  async upload(name: string, bytes: Uint8Array) {
    await this.page.getByTestId("bcf-import-file").setInputFiles({ name, mimeType: "application/octet-stream", buffer: Buffer.from(bytes) });
    await this.page.getByTestId("bcf-import-submit").click();
  }
  async result() {
    return (await this.page.getByTestId("bcf-import-done").textContent()) ?? "";
  }
  problems() {
    return this.page.getByTestId("bcf-import-problems").locator("li").allTextContents();
  }
  pinTitles() {
    return this.page.getByTestId("sessions-pin-table").locator("tbody tr td:first-child").allTextContents();
  }
}
