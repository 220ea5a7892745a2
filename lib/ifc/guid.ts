import { createHash, randomBytes } from "node:crypto";

// The IFC GlobalId alphabet: 128 bits written as 22 characters, the first carrying 2 bits, the rest 6 each.
const ALPHABET = "0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz_$";
const GLOBAL_ID = /^[0-3][0-9A-Za-z_$]{21}$/;

/** Writes 16 bytes as an IFC GlobalId. */
export function globalIdFromBytes(bytes: Uint8Array): string {
  let n = 0n;
  for (const b of bytes.subarray(0, 16)) n = (n << 8n) | BigInt(b);
  let out = "";
  for (let k = 0; k < 22; k++) {
    out = ALPHABET[Number(n & 63n)] + out;
    n >>= 6n;
  }
  return out;
}

export const isGlobalId = (value: string) => GLOBAL_ID.test(value);

/** A GlobalId that is the same every time for the same name (re-exports keep their ids, BCF components match). */
export function stableGlobalId(name: string): string {
  return globalIdFromBytes(createHash("sha256").update(name).digest());
}

/** The GlobalId of a roof member: its id when that already is a GlobalId (imported from IFC), else derived from it. */
export const memberGlobalId = (memberId: string) => (isGlobalId(memberId) ? memberId : stableGlobalId(`strutroom member ${memberId}`));

export const newGlobalId = () => globalIdFromBytes(randomBytes(16));
