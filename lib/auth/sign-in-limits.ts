import "server-only";
// Sign-in limits: per account and per client address, with blocks that double each time they are earned again.
// rate-limiter-flexible keeps the counts in PostgreSQL (table sign_in_limits, created by our migrations in the
// library's layout), so every web process shares them and a restart forgets nothing.
import { RateLimiterPostgres, type RateLimiterRes } from "rate-limiter-flexible";
import { getPool } from "@/db/client";
import { verifyCredentials } from "@/db/queries/users";

export const SIGN_IN_LIMITS = {
  /** Failed sign-ins to one account (from anywhere) within the window before it is blocked. */
  account: { failures: 5, windowSeconds: 15 * 60 },
  /** Failed sign-ins from one address (to any account) within the window before it is blocked. */
  address: { failures: 30, windowSeconds: 60 * 60 },
  firstBlockSeconds: 5 * 60,
  longestBlockSeconds: 24 * 60 * 60,
  /** How long earned blocks are remembered for the back-off. */
  blockMemorySeconds: 24 * 60 * 60,
} as const;

/** The n-th block within a day lasts twice as long as the one before (5 min, 10, 20, … at most a day). */
export function blockSeconds(timesBlocked: number): number {
  return Math.min(SIGN_IN_LIMITS.firstBlockSeconds * 2 ** (Math.max(1, timesBlocked) - 1), SIGN_IN_LIMITS.longestBlockSeconds);
}

export class TooManySignInsError extends Error {
  constructor(readonly retryAfterSeconds: number) {
    super(`Too many sign-in attempts. Try again in ${Math.max(1, Math.ceil(retryAfterSeconds / 60))} minutes.`);
    this.name = "TooManySignInsError";
  }
}

type Limiters = { account: RateLimiterPostgres; address: RateLimiterPostgres; blocks: RateLimiterPostgres };
let limiters: Limiters | undefined;

function getLimiters(): Limiters {
  if (!limiters) {
    const store = { storeClient: getPool(), tableName: "sign_in_limits", tableCreated: true };
    limiters = {
      account: new RateLimiterPostgres({ ...store, keyPrefix: "account", points: SIGN_IN_LIMITS.account.failures, duration: SIGN_IN_LIMITS.account.windowSeconds }),
      address: new RateLimiterPostgres({ ...store, keyPrefix: "address", points: SIGN_IN_LIMITS.address.failures, duration: SIGN_IN_LIMITS.address.windowSeconds }),
      blocks: new RateLimiterPostgres({ ...store, keyPrefix: "blocks", points: 1_000_000, duration: SIGN_IN_LIMITS.blockMemorySeconds }),
    };
  }
  return limiters;
}

/** Seconds until a blocked key may try again, or 0 when it is not blocked (block() counts points + 1). */
function blockedFor(result: RateLimiterRes | null, limiter: RateLimiterPostgres): number {
  return result && result.consumedPoints > limiter.points ? result.msBeforeNext / 1000 : 0;
}

/** Counts a failure; the one that reaches the limit earns a block, longer each time within a day. */
async function countFailure(limiter: RateLimiterPostgres, key: string) {
  const counted = await limiter.penalty(key, 1);
  if (counted.consumedPoints < limiter.points) return;
  const earned = await getLimiters().blocks.penalty(`${limiter.keyPrefix}:${key}`, 1);
  await limiter.block(key, blockSeconds(earned.consumedPoints));
}

/**
 * Signs in with e-mail and password unless the account or the address is blocked (TooManySignInsError, even for
 * the right password). `address` is the client's address, or null when unknown (then only the account limit
 * applies). A success clears the account's failures.
 */
export async function signInWithLimits({ email, password, address }: { email: string; password: string; address: string | null }) {
  const { account, address: byAddress } = getLimiters();
  const accountKey = email.trim().toLowerCase();
  const [accountState, addressState] = await Promise.all([account.get(accountKey), address ? byAddress.get(address) : null]);
  const wait = Math.max(blockedFor(accountState, account), blockedFor(addressState, byAddress));
  if (wait > 0) throw new TooManySignInsError(wait);

  const user = await verifyCredentials({ email, password });
  if (user) {
    await account.delete(accountKey);
    return user;
  }
  await Promise.all([countFailure(account, accountKey), address ? countFailure(byAddress, address) : null]);
  return null;
}
