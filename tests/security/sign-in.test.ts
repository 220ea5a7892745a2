// Hole 5: sign-in could be guessed. There was no limit (11 guesses a second, then success), an unknown e-mail
// answered faster than a known one (no password hash was checked), and "1111111111" was an accepted password.
// Limits per account and per address with growing blocks, kept in PostgreSQL so every web process shares them
// (rate-limiter-flexible's RateLimiterPostgres); the same bcrypt work for unknown e-mails; a strength rule from
// zxcvbn-ts (score 3 of 4 or more: "safely unguessable" in zxcvbn's scale, with its common-password dictionary).
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { POST as changePassword } from "@/app/api/account/password/route";
import { authOptions } from "@/lib/auth/options";
import { verifyPassword } from "@/lib/auth/password";
import { joinSchema } from "@/lib/auth/schemas";
import { blockSeconds, signInWithLimits, SIGN_IN_LIMITS, TooManySignInsError } from "@/lib/auth/sign-in-limits";
import { closeDb, requireIntegrationEnv } from "../support/db";
import { createFixtureUser, FIXTURE_PASSWORD, type FixtureUser } from "../support/fixtures";
import { buildRequest } from "../support/session";

vi.mock("@/lib/auth/password", async (importOriginal) => {
  const original = await importOriginal<typeof import("@/lib/auth/password")>();
  return { ...original, verifyPassword: vi.fn(original.verifyPassword) };
});

const run = Date.now().toString(36);
let address = 0;
/** A fresh client address per test, so the tests do not share the per-address count. */
const newAddress = () => `198.51.100.${(address += 1)}-${run}`;

beforeAll(requireIntegrationEnv);
afterAll(closeDb);

describe("sign-in limits", () => {
  let user: FixtureUser;
  beforeAll(async () => {
    user = await createFixtureUser("sec-sign-in");
  });

  it("blocks an account after its failures, even for the right password, from any address", async () => {
    for (let k = 0; k < SIGN_IN_LIMITS.account.failures; k += 1) {
      expect(await signInWithLimits({ email: user.email, password: `guess-${k}`, address: newAddress() })).toBeNull();
    }
    await expect(signInWithLimits({ email: user.email, password: FIXTURE_PASSWORD, address: newAddress() })).rejects.toBeInstanceOf(TooManySignInsError);
    await expect(signInWithLimits({ email: user.email.toUpperCase(), password: FIXTURE_PASSWORD, address: newAddress() })).rejects.toThrow(/Too many/);
  });

  it("blocks an address that guesses across many accounts", async () => {
    const from = newAddress();
    for (let k = 0; k < SIGN_IN_LIMITS.address.failures; k += 1) {
      expect(await signInWithLimits({ email: `nobody-${k}-${run}@fixture.test`, password: "wrong-password", address: from })).toBeNull();
    }
    const other = await createFixtureUser("sec-sign-in-addr");
    await expect(signInWithLimits({ email: other.email, password: FIXTURE_PASSWORD, address: from })).rejects.toBeInstanceOf(TooManySignInsError);
    // The same person from another address is not blocked.
    expect(await signInWithLimits({ email: other.email, password: FIXTURE_PASSWORD, address: newAddress() })).toMatchObject({ id: other.id });
  });

  it("the first block lasts the first back-off step, and each later one twice as long as the one before", async () => {
    const target = await createFixtureUser("sec-sign-in-backoff");
    for (let k = 0; k < SIGN_IN_LIMITS.account.failures; k += 1) await signInWithLimits({ email: target.email, password: "nope-nope-1", address: newAddress() });
    const error = await signInWithLimits({ email: target.email, password: "nope-nope-1", address: newAddress() }).catch((caught: unknown) => caught);
    expect(error).toBeInstanceOf(TooManySignInsError);
    expect((error as TooManySignInsError).retryAfterSeconds).toBeLessThanOrEqual(blockSeconds(1));
    expect((error as TooManySignInsError).retryAfterSeconds).toBeGreaterThan(blockSeconds(1) - 60);
    expect([1, 2, 3, 4].map(blockSeconds)).toEqual([1, 2, 4, 8].map((factor) => factor * blockSeconds(1)));
    expect(blockSeconds(30)).toBe(SIGN_IN_LIMITS.longestBlockSeconds);
  });

  it("does the same password-hash work for an unknown e-mail as for a known one", async () => {
    const known = await createFixtureUser("sec-sign-in-work");
    vi.mocked(verifyPassword).mockClear();
    await signInWithLimits({ email: known.email, password: "wrong-password-1", address: newAddress() });
    expect(vi.mocked(verifyPassword)).toHaveBeenCalledTimes(1);
    vi.mocked(verifyPassword).mockClear();
    await signInWithLimits({ email: `unknown-${run}@fixture.test`, password: "wrong-password-1", address: newAddress() });
    expect(vi.mocked(verifyPassword)).toHaveBeenCalledTimes(1);
  });
});

describe("malformed sign-in input (issue 21)", () => {
  type Authorize = (credentials: Record<string, string>, request: { headers: Record<string, string> }) => Promise<unknown>;
  const authorize = (authOptions.providers[0] as unknown as { options: { authorize: Authorize } }).options.authorize;

  it.each([
    ["a 100 kB e-mail", { email: `${"a".repeat(100_000)}@fixture.test`, password: "whatever-1" }, /^Sign-in refused: That e-mail address is too long \(at most 254 characters\)\.$/],
    ["a 100 kB password", { email: "someone@fixture.test", password: "p".repeat(100_000) }, /^Sign-in refused: That password is too long \(at most 200 characters\)\.$/],
    ["no e-mail and no password", { email: "", password: "" }, /^Sign-in refused: .*Enter an e-mail address\..*Enter your password\./],
  ])("%s is refused with the reason, before any password is checked", async (_name, credentials, message) => {
    vi.mocked(verifyPassword).mockClear();
    await expect(authorize(credentials, { headers: { "x-forwarded-for": newAddress() } })).rejects.toThrow(message);
    expect(vi.mocked(verifyPassword)).not.toHaveBeenCalled();
  });
});

describe("password strength", () => {
  it.each(["1111111111", "password123", "abcabcabcabc", "qwertyuiop1", "aaaaaaaaaaaaaaaa"])("refuses %s", (password) => {
    const parsed = joinSchema.safeParse({ name: "New Person", password });
    expect(parsed.success).toBe(false);
  });

  it("accepts a long, uncommon passphrase", () => {
    expect(joinSchema.safeParse({ name: "New Person", password: "Quartz-lantern-ridge-2931" }).success).toBe(true);
  });

  it("the password change route refuses a weak new password with an issue on the field", async () => {
    const user = await createFixtureUser("sec-sign-in-weak");
    const response = await changePassword(await buildRequest("/api/account/password", { method: "POST", user, body: { currentPassword: FIXTURE_PASSWORD, newPassword: "1111111111" } }), undefined);
    expect(response.status).toBe(400);
    expect((await response.json()).issues.map((issue: { path: string }) => issue.path)).toEqual(["newPassword"]);
  });
});
