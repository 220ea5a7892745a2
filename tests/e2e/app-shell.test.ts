// The app's icon, favicon and web manifest (public/): linked from every page and served with the right types.
// What a manifest must hold to be installable is from the W3C Web Application Manifest spec (name, icons, start_url).
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { appUrl, launchBrowser, newContext } from "../support/browser";

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe("app icon and manifest", () => {
  it("links the manifest and icons from the sign-in page, and serves them", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    try {
      await page.goto(appUrl("/sign-in"));
      const manifestHref = await page.locator('link[rel="manifest"]').getAttribute("href");
      expect(manifestHref).toBe("/manifest.webmanifest");
      expect(await page.locator('link[rel="icon"]').count()).toBeGreaterThanOrEqual(1);
      expect(await page.locator('meta[name="theme-color"]').getAttribute("content")).toBe("#0f766e");

      const manifest = await (await context.request.get(appUrl(manifestHref!))).json();
      expect(manifest.name).toBe("Strutroom");
      expect(manifest.start_url).toBe("/projects");
      const sizes = manifest.icons.map((icon: { sizes: string }) => icon.sizes);
      expect(sizes).toEqual(expect.arrayContaining(["192x192", "512x512"]));
      for (const icon of [...manifest.icons, { src: "/favicon.ico", type: "image/" }]) {
        const response = await context.request.get(appUrl(icon.src));
        expect(response.status(), icon.src).toBe(200);
        expect(response.headers()["content-type"], icon.src).toContain(icon.type === "image/" ? "image/" : icon.type);
      }
    } finally {
      await context.close();
    }
  });
});
