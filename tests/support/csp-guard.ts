// Browser tests run under the app's real Content-Security-Policy (proxy.ts): any violation a test's pages report
// fails that test, so a policy that breaks the app cannot go unnoticed.
import { afterEach, expect } from "vitest";
import { takeCspViolations } from "./browser";

afterEach(() => {
  expect(takeCspViolations(), "Content-Security-Policy violations").toEqual([]);
});
