// Browser tests drive Debian's chromium (CHROMIUM_PATH) through playwright-core against the built app (BASE_URL).
// Screenshots go to ARTIFACTS_DIR/screenshots (git-ignored).
import { mkdirSync } from "node:fs";
import path from "node:path";
import { chromium, type Browser, type BrowserContext, type Page } from "playwright-core";

export const CHROMIUM_FLAGS = [
  "--headless",
  "--no-sandbox",
  "--disable-gpu",
  "--disable-background-networking",
  "--disable-component-update",
  "--no-first-run",
];

function env(name: string): string {
  const value = process.env[name];
  if (!value) throw new Error(`${name} must be set for browser tests (npm test sets it).`);
  return value;
}

/**
 * The app's URL. Vitest sets process.env.BASE_URL to Vite's base path ("/"), overriding the caller's value, so an
 * absolute BASE_URL is used when present and otherwise APP_URL (both are set by scripts/test.mjs).
 */
export function baseUrl(): string {
  const url = [process.env.BASE_URL, process.env.APP_URL].find((value) => value && /^https?:\/\//.test(value));
  if (!url) throw new Error("BASE_URL or APP_URL must be an absolute URL for browser tests (npm test sets them).");
  return url;
}

/** An absolute URL on the app under test (page.goto is given absolute URLs, whatever the context's baseURL). */
export const appUrl = (path: string) => new URL(path, baseUrl()).toString();

const cspViolations: string[] = [];

/** The Content-Security-Policy violations seen since the last call (tests/support/csp-guard.ts fails on any). */
export function takeCspViolations(): string[] {
  return cspViolations.splice(0);
}

/** Records every CSP violation in the context's pages: the DOM event, and Chromium's "Refused to …" console error. */
async function watchCsp(context: BrowserContext): Promise<void> {
  await context.addInitScript(() => {
    document.addEventListener("securitypolicyviolation", (event) => {
      console.error(`CSP violation: ${event.violatedDirective} blocked ${event.blockedURI || "inline"}`);
    });
  });
  const watchPage = (page: Page) => {
    page.on("console", (message) => {
      if (message.type() === "error" && /Content Security Policy|CSP violation/.test(message.text())) cspViolations.push(`${page.url()}: ${message.text()}`);
    });
  };
  context.pages().forEach(watchPage);
  context.on("page", watchPage);
}

/** Launches Debian's chromium (never a downloaded browser); every context it opens is watched for CSP violations. */
export async function launchBrowser({ extraArgs = [] }: { extraArgs?: string[] } = {}): Promise<Browser> {
  const browser = await chromium.launch({ executablePath: env("CHROMIUM_PATH"), args: [...CHROMIUM_FLAGS, ...extraArgs], headless: true });
  const open = browser.newContext.bind(browser);
  browser.newContext = async (...args: Parameters<Browser["newContext"]>) => {
    const context = await open(...args);
    await watchCsp(context);
    return context;
  };
  return browser;
}

/** A fresh signed-out browser context on the app. */
export function newContext(browser: Browser): Promise<BrowserContext> {
  return browser.newContext({ baseURL: baseUrl(), viewport: { width: 1280, height: 860 } });
}

/** Saves a full-page screenshot as ARTIFACTS_DIR/screenshots/<name>.png. */
export async function screenshot(page: Page, name: string): Promise<void> {
  const dir = path.join(process.env.ARTIFACTS_DIR ?? ".artifacts", "screenshots");
  mkdirSync(dir, { recursive: true });
  await page.screenshot({ path: path.join(dir, `${name}.png`), fullPage: true });
}
