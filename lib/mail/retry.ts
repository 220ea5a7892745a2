// Back-off for the mail outbox: pure, so the schedule is tested on its own.

/** Attempts before a mail is given up and marked failed (the first send plus seven retries). */
export const MAX_MAIL_ATTEMPTS = 8;
const FIRST_DELAY_MS = 30_000;
const MAX_DELAY_MS = 60 * 60_000;

/**
 * When to try again after the given number of failed attempts (1 = the first send failed): 30 s, 1 min, 2 min, …
 * doubling up to one hour; null once MAX_MAIL_ATTEMPTS have failed.
 */
export function nextMailAttempt(failedAttempts: number, now: Date): Date | null {
  if (failedAttempts >= MAX_MAIL_ATTEMPTS) return null;
  const delay = Math.min(FIRST_DELAY_MS * 2 ** (failedAttempts - 1), MAX_DELAY_MS);
  return new Date(now.getTime() + delay);
}
