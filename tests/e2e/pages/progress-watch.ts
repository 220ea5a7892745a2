// Every progress text a page shows (the browser's own step, then the job's phase and percent), however briefly: a
// step may last less than a poll, so a MutationObserver in the page keeps each text as it appears.
// Page scripts are functions, not strings: the app's CSP forbids eval, which string scripts need.
import type { Page } from "playwright-core";

declare global {
  interface Window {
    __progressSeen?: string[];
  }
}

const PROGRESS_TEXT = '[data-testid="step-progress"] [role="status"], [data-testid="job-progress"] [role="status"]';

export async function watchProgress(page: Page): Promise<void> {
  await page.evaluate((selector) => {
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

export function progressSeen(page: Page): Promise<string[]> {
  return page.evaluate(() => window.__progressSeen ?? []);
}

/** Whether the element is wholly inside the visible part of the page. */
export function inView(page: Page, selector: string): Promise<boolean> {
  return page.evaluate((s) => {
    const box = document.querySelector(s)!.getBoundingClientRect();
    return box.top >= 0 && box.bottom <= window.innerHeight;
  }, selector);
}

/** Whether no part of the element is inside the visible part of the page. */
export function whollyOutOfView(page: Page, selector: string): Promise<boolean> {
  return page.evaluate((s) => {
    const box = document.querySelector(s)!.getBoundingClientRect();
    return box.bottom <= 0 || box.top >= window.innerHeight;
  }, selector);
}

/**
 * Waits until the element exists, `ready` (a regular expression on its text) matches, nothing inside it matches
 * `pending` (a selector, e.g. a progress bar still running), and it is wholly in view.
 */
export async function waitInView(page: Page, selector: string, ready: RegExp, { pending = "", timeout = 180_000 } = {}): Promise<void> {
  await page.waitForFunction(
    ({ s, source, pending }) => {
      const el = document.querySelector(s);
      if (!el || !new RegExp(source).test(el.textContent ?? "") || (pending && el.querySelector(pending))) return false;
      const box = el.getBoundingClientRect();
      return box.top >= 0 && box.bottom <= window.innerHeight;
    },
    { s: selector, source: ready.source, pending },
    { timeout, polling: 250 },
  );
}

export const scrollToBottom = (page: Page) => page.evaluate(() => window.scrollTo(0, document.documentElement.scrollHeight));
export const scrollToTop = (page: Page) => page.evaluate(() => window.scrollTo(0, 0));
