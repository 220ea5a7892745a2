// The record a pin's thread keeps (issue 16 item 1): proposals, decisions and supersessions, append-only. Pure, so
// the command that writes a step and the thread that shows its buttons read the thread's standing the same way.
import type { CommentKind } from "./events";

/** True for a comment kind that is a step of the record (never edited or deleted once stored). */
export function isRecordStep(kind: CommentKind): kind is Exclude<CommentKind, "comment"> {
  return kind !== "comment";
}

type Step = { id: string; kind: CommentKind; author: { id: string } };

/** Where a thread stands: its standing decision and the proposal still open (made after the last decision or supersession). */
export type ThreadStanding = { decisionId: string | null; proposal: { id: string; proposerId: string } | null };

/** The standing of a thread from its comments, oldest first (plain comments change nothing). */
export function threadStanding(comments: readonly Step[]): ThreadStanding {
  let standing: ThreadStanding = { decisionId: null, proposal: null };
  for (const c of comments) {
    if (c.kind === "proposal") standing = { ...standing, proposal: { id: c.id, proposerId: c.author.id } };
    else if (c.kind === "decision") standing = { decisionId: c.id, proposal: null };
    else if (c.kind === "supersession") standing = { decisionId: null, proposal: null };
  }
  return standing;
}

/**
 * Why this step cannot be added to the thread as it stands, or null when it can (the who is the rule book's, asked
 * before): a proposal or a second decision never replaces a standing decision, which only a supersession ends; a
 * decision answers an open proposal, as a clash's does, so proposer and decider are always two people (deciding on
 * a thread with nothing proposed would let the structural engineer accept their own opening).
 */
export function threadStepConflict(kind: CommentKind, standing: ThreadStanding): string | null {
  if (kind === "proposal" && standing.decisionId) return "This thread is decided. A proposal cannot replace a decision; the structural engineer can supersede it, with a reason.";
  if (kind === "decision" && standing.decisionId) return "This thread is already decided; supersede the decision, with a reason, to decide it again.";
  if (kind === "decision" && !standing.proposal) return "Nothing is proposed on this thread: a decision answers someone else's proposal (proposer and decider are two people).";
  if (kind === "supersession" && !standing.decisionId) return "There is no standing decision on this thread to supersede.";
  return null;
}
