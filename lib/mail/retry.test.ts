import { describe, expect, it } from "vitest";
import { MAX_MAIL_ATTEMPTS, nextMailAttempt } from "./retry";

describe("nextMailAttempt", () => {
  const now = new Date("2026-03-02T08:00:00Z");
  const delaySeconds = (failed: number) => {
    const next = nextMailAttempt(failed, now);
    return next ? (next.getTime() - now.getTime()) / 1000 : null;
  };

  it("doubles from 30 s and caps at one hour", () => {
    expect([1, 2, 3, 4, 5, 6, 7].map(delaySeconds)).toEqual([30, 60, 120, 240, 480, 960, 1920]);
    expect(nextMailAttempt(7, now)!.getTime()).toBeLessThanOrEqual(now.getTime() + 3600_000);
  });

  it("gives up after the last attempt", () => {
    expect(delaySeconds(MAX_MAIL_ATTEMPTS)).toBeNull();
    expect(delaySeconds(MAX_MAIL_ATTEMPTS - 1)).not.toBeNull();
  });
});
