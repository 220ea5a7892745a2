// Issue 8 end to end on the demo, with every process running (web, realtime, jobs, the S3 and SMTP fakes): an
// invitation mail whose link lets a new person join, a comment with an image attachment (and a refused file), and
// the review report PDF and CSV exports from the report page.
import { execFileSync } from "node:child_process";
import { randomUUID } from "node:crypto";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { eq } from "drizzle-orm";
import Papa from "papaparse";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getRevisionWithResults } from "@/db/queries/models";
import { users } from "@/db/schema";
import type { PresentedComment, PresentedPin } from "@/lib/realtime/events";
import { STANDING_CAUTION } from "@/lib/review/caution";
import { launchBrowser, newContext, screenshot } from "../support/browser";
import { closeDb, getDb } from "../support/db";
import { DEMO_PROJECT, demoAccount, demoAccounts, demoProjectId } from "../support/demo";
import { connectClient, realtimeClient } from "../support/realtime";
import { CapturedMailPage, ReportPage, ReviewThreadPage } from "./pages/files-mail-report-pages";
import { signedInPage } from "./pages/sign-in-page";

// A 1x1 PNG (common-practice test image; PNG signature per the W3C PNG specification §5.2) and a Windows
// executable header ("MZ").
const PNG = Buffer.from("iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==", "base64");
const EXE = Buffer.concat([Buffer.from("MZ"), Buffer.alloc(58), Buffer.from([0x80, 0, 0, 0]), Buffer.alloc(64), Buffer.from("PE\0\0"), Buffer.alloc(200)]);

let browser: Browser;
let projectId: string;
const work = mkdtempSync(path.join(tmpdir(), "strutroom-e2e-report-"));

const signedIn = (role: string): Promise<Page> => signedInPage(browser, demoAccount(role).email, demoAccounts.password);

beforeAll(async () => {
  browser = await launchBrowser();
  projectId = await demoProjectId();
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
  rmSync(work, { recursive: true, force: true });
});

describe("invitation mail", () => {
  it("an owner invites by e-mail; the captured mail's link lets the newcomer join", async () => {
    const owner = await signedIn("owner");
    const email = `newcomer-${randomUUID().slice(0, 8)}@northfield-demo.test`;
    const invited = await owner.request.post(`/api/projects/${projectId}/invitations`, { data: { email, role: "mep_engineer" } });
    expect(invited.status()).toBe(201);

    const mailPage = new CapturedMailPage(owner);
    const mail = await mailPage.waitForMail(projectId, email, /invited you to/);
    await screenshot(owner, "captured-mail");
    const link = await mail.locator('a[href*="/join/"]').getAttribute("href");
    expect(link).toBeTruthy();
    await owner.context().close();

    const newcomer = await (await newContext(browser)).newPage();
    await newcomer.goto(link!);
    await newcomer.getByLabel("Your name").fill("Rosa Whitfield");
    await newcomer.getByLabel("Choose a password").fill("a-long-enough-password");
    await newcomer.getByTestId("join-submit").click();
    await newcomer.waitForURL(new RegExp(`/projects/${projectId}$`));
    await newcomer.context().close();
  });
});

describe("comment attachments", () => {
  it("the comment's author attaches an image, which shows in the thread; an executable named .png is refused", async () => {
    const architect = demoAccount("architect");
    // The sign-out in the roles test ended the architect's earlier sessions: mint this one at the current version.
    const [row] = await getDb().select({ id: users.id, sessionVersion: users.sessionVersion }).from(users).where(eq(users.email, architect.email));
    const socket = await realtimeClient(process.env.REALTIME_URL!, projectId, { id: row.id, email: architect.email, name: architect.name, sessionVersion: row.sessionVersion });
    await connectClient(socket);
    const title = `Skylight kerb at grid C/4 ${randomUUID().slice(0, 6)}`;
    const pin = await socket.emitWithAck("pin:create", { id: randomUUID(), anchor: { kind: "point", point: [12, 18, 7.5] }, revisionId: null, title, discipline: "architectural" }) as { ok: boolean; data: PresentedPin };
    expect(pin.ok).toBe(true);
    const comment = await socket.emitWithAck("comment:create", { id: randomUUID(), pinId: pin.data.id, body: "Mock-up photo attached." }) as { ok: boolean; data: PresentedComment };
    expect(comment.ok).toBe(true);
    socket.disconnect();

    const page = await signedIn("architect");
    const thread = new ReviewThreadPage(page);
    await thread.open(projectId);
    await thread.selectPin(title);
    await thread.attach("Mock-up photo attached.", { name: "mock-up.png", mimeType: "image/png", buffer: PNG });
    const image = thread.comment("Mock-up photo attached.").getByTestId("attachment-image");
    await image.waitFor();
    await expect.poll(() => image.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth)).toBe(1);

    await thread.attach("Mock-up photo attached.", { name: "holiday.png", mimeType: "image/png", buffer: EXE });
    await expect.poll(() => thread.comment("Mock-up photo attached.").getByTestId("attachment-error").textContent()).toMatch(/EXE/);
    expect(await thread.comment("Mock-up photo attached.").getByTestId("attachment").count()).toBe(1);
    await screenshot(page, "comment-attachment");
    // The captured-mail page is for owners only: a member with another role sees "not allowed" (403), not "not found".
    const refused = await page.goto(`/projects/${projectId}/mail`);
    expect(refused?.status()).toBe(403);
    await page.getByRole("heading", { name: "Not allowed" }).waitFor();
    expect(await page.getByTestId("captured-mail").count()).toBe(0);
    await page.context().close();
  });
});

describe("review report", () => {
  it("making the report shows its progress, then the stored PDF: the caution on every page, the chosen combinations; the envelope CSV matches the stored results", async () => {
    const page = await signedIn("architect");
    const report = new ReportPage(page);
    await report.open(projectId);
    await report.chooseResults(["ULS-2", "ULS-3"]);
    await report.compare("ULS-2", "ULS-3");
    await screenshot(page, "report-page");
    await report.make();
    expect(await page.getByTestId("job-progress").getByRole("status").textContent()).toMatch(/%/);
    await screenshot(page, "report-progress");
    const link = await report.madeFile();
    await expect.poll(() => link.evaluate((a) => { const box = a.getBoundingClientRect(); return box.top >= 0 && box.bottom <= window.innerHeight; })).toBe(true);
    await screenshot(page, "report-made");

    const response = await page.request.get((await link.getAttribute("href"))!);
    expect(response.status()).toBe(200);
    expect(response.headers()["content-type"]).toBe("application/pdf");
    const file = path.join(work, "report.pdf");
    writeFileSync(file, await response.body());
    const pages = Number(/^Pages:\s+(\d+)/m.exec(execFileSync("pdfinfo", [file]).toString())?.[1]);
    const text = execFileSync("pdftotext", ["-raw", file, "-"]).toString().split("\f").slice(0, pages).map((p) => p.replace(/\s+/g, " "));
    expect(pages).toBeGreaterThan(3);
    text.forEach((p, k) => expect(p, `page ${k + 1}`).toContain(STANDING_CAUTION));
    expect(text[0]).toContain(DEMO_PROJECT);
    const revision = (await getRevisionWithResults({ projectId, number: 1 }))!;
    const all = text.join("\n");
    for (const id of ["ULS-2", "ULS-3"]) {
      const name = revision.model.combinations.find((c) => c.id === id)!.name;
      expect(all).toContain(`Member forces: ${name} (${id})`);
    }
    expect(all).not.toContain("Member forces: EN 1990 (6.10) permanent only");
    expect(all).toContain("Members whose state differs");
    for (const heading of ["Plan coloured by force state", "Support reactions and deflection", "Reactions balance:", "Utilisation: the most utilised members per check", "Content hash (SHA-256)"]) expect(all).toContain(heading);

    const csv = await page.request.get((await report.envelopeUrl())!);
    expect(csv.status()).toBe(200);
    const { data } = Papa.parse<Record<string, string>>(await csv.text(), { header: true, skipEmptyLines: true });
    expect(data).toHaveLength(revision.model.members.length);
    const envelope = revision.analysis!.result.envelope;
    for (const row of data) expect(Number(row.max_compression_kN)).toBeCloseTo(envelope[row.member].maxCompression, 2);
    await page.context().close();
  }, 240_000);

  it("a viewer downloads the reports the team made but cannot make one (report.make)", async () => {
    const page = await signedIn("viewer");
    await page.goto(`/projects/${projectId}/report`);
    await page.getByTestId("report-viewer-note").waitFor();
    expect(await page.getByTestId("report-make").count()).toBe(0);
    const made = page.getByTestId("report-recent-file").first();
    await made.waitFor();
    const response = await page.request.get((await made.getAttribute("href"))!);
    expect(response.status()).toBe(200);
    expect(response.headers()["content-type"]).toBe("application/pdf");
    const refused = await page.request.post(`/api/projects/${projectId}/report`, { data: {} });
    expect(refused.status()).toBe(403);
    await page.context().close();
  });
});
