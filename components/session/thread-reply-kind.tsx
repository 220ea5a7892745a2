"use client";
// What a reply in a pin's thread may be: a comment, a proposal, a decision (with conditions) or the supersession of
// the standing decision (its reason is the reply). Offered by the rule book (threadStepRefusal) and the thread's
// standing, as the server checks them; the standing caution is shown with every step, as it is recorded with it.
import { threadStepRefusal, type Asker } from "@/lib/permissions";
import type { CommentKind } from "@/lib/realtime/events";
import { threadStepConflict, type ThreadStanding } from "@/lib/realtime/thread-record";
import { STANDING_CAUTION } from "@/lib/review/caution";

const REPLY_KIND_LABELS: Record<CommentKind, string> = {
  comment: "Comment",
  proposal: "Proposal",
  decision: "Decision",
  supersession: "Supersede the decision (the reply is the reason)",
};

export type ReplyKinds = { allowed: CommentKind[]; /** Why a decision cannot be recorded here now, shown when it is the two-person rule. */ decisionBlocked: string | null };

/** The kinds of reply this member may post on the thread as it stands. */
export function replyKindsFor(asker: Asker, standing: ThreadStanding): ReplyKinds {
  const proposer = standing.proposal?.proposerId ?? null;
  const allowed = (["comment", "proposal", "decision", "supersession"] as const).filter((kind) => !threadStepRefusal(asker, kind, proposer) && !threadStepConflict(kind, standing));
  const ownProposal = !standing.decisionId && proposer !== null && proposer === asker?.userId && !threadStepRefusal(asker, "supersession", null);
  return { allowed, decisionBlocked: ownProposal ? threadStepRefusal(asker, "decision", proposer) : null };
}

export function ThreadReplyKind({
  kinds,
  kind,
  onKind,
  conditions,
  onConditions,
}: {
  kinds: ReplyKinds;
  kind: CommentKind;
  onKind: (kind: CommentKind) => void;
  conditions: string;
  onConditions: (conditions: string) => void;
}) {
  return (
    <>
      {kinds.allowed.length > 1 ? (
        <label className="flex items-center gap-1 text-xs">
          Record as
          <select className="rounded border border-board-200 px-1" value={kind} onChange={(e) => onKind(e.target.value as CommentKind)} data-testid="comment-kind">
            {kinds.allowed.map((k) => (
              <option key={k} value={k}>
                {REPLY_KIND_LABELS[k]}
              </option>
            ))}
          </select>
        </label>
      ) : null}
      {kinds.decisionBlocked ? (
        <p className="text-xs text-board-700" data-testid="thread-decide-blocked">
          {kinds.decisionBlocked}
        </p>
      ) : null}
      {kind === "decision" ? (
        <textarea
          className="rounded-md border border-board-200 px-2 py-1 text-sm"
          aria-label="Conditions"
          placeholder="Conditions (if any)"
          value={conditions}
          onChange={(e) => onConditions(e.target.value)}
          data-testid="comment-conditions"
        />
      ) : null}
      {kind !== "comment" ? <p className="text-xs text-board-700">{STANDING_CAUTION}</p> : null}
    </>
  );
}
