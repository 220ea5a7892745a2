// Layout checks for browser tests (issue 17 item 11): nothing sticks out of the window sideways and nothing is cut
// off by a box that hides its overflow. Run in the page; returns what is wrong, described for a reader.
import type { Page } from "playwright-core";

/** The page's width beyond the window's (0 when nothing makes the page scroll sideways). */
export function horizontalOverflow(page: Page): Promise<number> {
  return page.evaluate(() => Math.max(0, document.documentElement.scrollWidth - window.innerWidth));
}

/**
 * Every element drawn (at least 2 px each way, not visibility:hidden) that reaches past the window's left or right
 * edge, or past the sides of an ancestor that hides its overflow (clipped: the Thread link of a table cut by its
 * box). An element inside a box that scrolls sideways is judged against nothing further out: it can be scrolled
 * to, and the scrolling box itself is judged like any other element.
 */
export function cutOffElements(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const slack = 1;
    const describe = (el: Element) => {
      const id = el.getAttribute("data-testid");
      const text = (el.textContent ?? "").replace(/\s+/g, " ").trim().slice(0, 40);
      return `<${el.tagName.toLowerCase()}${id ? ` data-testid="${id}"` : ""}> "${text}"`;
    };
    const found: string[] = [];
    for (const el of Array.from(document.body.querySelectorAll("*"))) {
      const rect = el.getBoundingClientRect();
      if (rect.width < 2 || rect.height < 2) continue;
      // Not rendered: display:none or visibility:hidden here or above, or inside a closed <details>.
      if (!el.checkVisibility({ visibilityProperty: true, contentVisibilityAuto: false } as CheckVisibilityOptions)) continue;
      let judged = false;
      for (let up = el.parentElement; up && up !== document.body && !judged; up = up.parentElement) {
        const overflow = getComputedStyle(up).overflowX;
        if (overflow === "visible") continue;
        judged = true;
        if (overflow === "auto" || overflow === "scroll") break;
        const box = up.getBoundingClientRect();
        if (rect.left < box.left - slack || rect.right > box.right + slack) {
          found.push(`${describe(el)} is cut off by ${describe(up)} (${Math.round(rect.left)}–${Math.round(rect.right)} px in ${Math.round(box.left)}–${Math.round(box.right)} px)`);
        }
      }
      if (judged) continue;
      if (rect.left < -slack || rect.right > window.innerWidth + slack) {
        found.push(`${describe(el)} reaches ${Math.round(rect.left)}–${Math.round(rect.right)} px in a ${window.innerWidth} px window`);
      }
    }
    return found;
  });
}
