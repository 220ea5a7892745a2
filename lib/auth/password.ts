import bcrypt from "bcryptjs";

// bcrypt cost 10: about 50–100 ms per hash on a small server, the library's documented default.
const COST = 10;

/** A bcrypt hash of the password. */
export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, COST);
}

/** True when the password matches the stored bcrypt hash. */
export function verifyPassword(password: string, hash: string): Promise<boolean> {
  return bcrypt.compare(password, hash);
}
