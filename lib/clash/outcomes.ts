import { z } from "zod";
import { revisionNumber, revisionNumberText } from "@/lib/fields";

/** Outcomes of a clash, in our words (glossary.md). */
export const CLASH_OUTCOMES = ["reroute_run", "opening_proposed", "opening_accepted", "opening_refused", "member_change_needed", "no_conflict"] as const;
export type ClashOutcome = (typeof CLASH_OUTCOMES)[number];

export const CLASH_OUTCOME_LABELS: Record<ClashOutcome, string> = {
  reroute_run: "Reroute the run",
  opening_proposed: "Opening proposed",
  opening_accepted: "Opening accepted with conditions",
  opening_refused: "Opening refused",
  member_change_needed: "Member change needed",
  no_conflict: "No conflict",
};

/** What MEP or structural engineers may propose; accepting an opening is a separate, structural-only decision. */
export const PROPOSABLE_OUTCOMES = ["reroute_run", "opening_proposed", "member_change_needed", "no_conflict"] as const;

/** Steps in a clash's history (clash_decisions): each is appended, never changed. */
export const CLASH_ENTRY_KINDS = ["proposal", "decision", "supersession", "recheck", "closure"] as const;
export type ClashEntryKind = (typeof CLASH_ENTRY_KINDS)[number];
export const CLASH_ENTRY_LABELS: Record<ClashEntryKind, string> = {
  proposal: "Proposed",
  decision: "Decided",
  supersession: "Decision superseded",
  recheck: "Needs another look",
  closure: "Closed",
};

export const CLASH_KINDS = ["hard", "clearance"] as const;
export const CLASH_KIND_LABELS = { hard: "Hard (bodies overlap)", clearance: "Clearance" } as const;

/**
 * Whether the last detection still finds the clash (cleared: not found again), or the clash was closed because its
 * member or run changed or vanished in a newer revision (with the reason in words). Both keep their history.
 */
export const CLASH_STATUSES = ["active", "cleared", "closed"] as const;
export type ClashStatus = (typeof CLASH_STATUSES)[number];

export const proposeOutcomeSchema = z.object({
  outcome: z.enum(PROPOSABLE_OUTCOMES, "Choose an outcome."),
  note: z.string().trim().max(2000).default(""),
});
export type ProposeOutcomeInput = z.infer<typeof proposeOutcomeSchema>;

/** Outcomes a proposal other than an opening is decided with: the structural engineer confirms it as proposed. */
export const CONFIRMABLE_OUTCOMES = ["reroute_run", "member_change_needed", "no_conflict"] as const;

/**
 * The structural engineer's decision on the open proposal: an opening is accepted with written conditions or
 * refused with a reason; any other proposal is confirmed as proposed (optionally with a note).
 */
export const decideClashSchema = z.discriminatedUnion("outcome", [
  z.object({
    outcome: z.literal("opening_accepted"),
    conditions: z.string().trim().min(10, "Write down the conditions of the opening (at least 10 characters).").max(4000),
  }),
  z.object({
    outcome: z.literal("opening_refused"),
    reason: z.string().trim().min(10, "Say why the opening is refused (at least 10 characters).").max(4000),
  }),
  z.object({ outcome: z.enum(CONFIRMABLE_OUTCOMES), note: z.string().trim().max(2000).default("") }),
], "Choose a decision.");
export type DecideClashInput = z.infer<typeof decideClashSchema>;

/** Superseding the standing decision (structural engineer): the reason is kept beside both in the history. */
export const supersedeDecisionSchema = z.object({
  reason: z.string().trim().min(10, "Say why the decision is superseded (at least 10 characters).").max(4000),
});
export type SupersedeDecisionInput = z.infer<typeof supersedeDecisionSchema>;

/** Who works on a clash and by when (either may be cleared with null). */
export const assignClashSchema = z.object({
  assigneeId: z.uuid("Choose a member of the team.").nullable(),
  dueOn: z.iso.date("Give the due date as a date.").nullable(),
});
export type AssignClashInput = z.infer<typeof assignClashSchema>;

/** Query of the clash list: the revision and the low-force threshold (kN) for the force-state filter. */
export const clashListQuerySchema = z.object({
  revision: revisionNumberText,
  lowForce: z.coerce.number().min(0).max(100_000).default(5),
});

/** Re-run detection on a revision; with copyRunsFrom, first bring that revision's runs onto it (model changed). */
export const detectRequestSchema = z.object({ revision: revisionNumber, copyRunsFrom: revisionNumber.optional() });
