import { createHash } from "node:crypto";

/**
 * Stable clash id: a hash of what the clash is between (member, run, run segment), not of where it is, so a thread
 * stays attached while the model or the run moves a little and the same pair still clashes.
 */
export function clashKey(memberId: string, runId: string, segmentIndex: number): string {
  // JSON keeps the three parts unambiguous whatever characters the ids contain.
  const digest = createHash("sha256").update(JSON.stringify([memberId, runId, segmentIndex])).digest("base64url");
  return `clash_${digest.slice(0, 20)}`;
}
