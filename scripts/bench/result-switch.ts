// One result switch in the viewer, as both browser benchmarks (bench:viewer, bench:bigroofs) time it: from asking the
// viewer's test hook for the result until its "viewer:colouring-drawn" mark, by the page's own clock.
import type { Page } from "playwright-core";

/** Shows result `id` in the open viewer and answers the milliseconds until its colours were submitted. */
export function timeResultSwitch(page: Page, id: string): Promise<number> {
  // A string, not a function: tsx compiles the benchmarks with esbuild's keepNames, which wraps named functions in a
  // `__name` helper that exists in this process but not in the page (a function here fails with "__name is not defined").
  return page.evaluate(`new Promise((resolve) => {
    const before = performance.getEntriesByName("viewer:colouring-drawn").length;
    const start = performance.now();
    window.__strutroom.setResult(${JSON.stringify(id)});
    const wait = () => {
      const marks = performance.getEntriesByName("viewer:colouring-drawn");
      if (marks.length > before) resolve(marks[marks.length - 1].startTime - start);
      else requestAnimationFrame(wait);
    };
    requestAnimationFrame(wait);
  })`) as Promise<number>;
}
