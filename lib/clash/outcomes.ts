import { z } from "zod";
import { revisionNumber, revisionNumberText } from "@/lib/fields";

/** Outcomes of a clash, in our words (glossary.md). */
export const CLASH_OUTCOMES = ["reroute_run", "opening_proposed", "opening_accepted", "member_change_needed", "no_conflict"] as const;
export type ClashOutcome = (typeof CLASH_OUTCOMES)[number];

export const CLASH_OUTCOME_LABELS: Record<ClashOutcome, string> = {
  reroute_run: "Reroute the run",
  opening_proposed: "Opening proposed",
  opening_accepted: "Opening accepted with conditions",
  member_change_needed: "Member change needed",
  no_conflict: "No conflict",
};

/** What MEP or structural engineers may propose; accepting an opening is a separate, structural-only decision. */
export const PROPOSABLE_OUTCOMES = ["reroute_run", "opening_proposed", "member_change_needed", "no_conflict"] as const;

export const CLASH_KINDS = ["hard", "clearance"] as const;
export const CLASH_KIND_LABELS = { hard: "Hard (bodies overlap)", clearance: "Clearance" } as const;

/** Whether the last detection still finds the clash; cleared clashes keep their decisions for the record. */
export const CLASH_STATUSES = ["active", "cleared"] as const;
export type ClashStatus = (typeof CLASH_STATUSES)[number];

export const proposeOutcomeSchema = z.object({
  outcome: z.enum(PROPOSABLE_OUTCOMES, "Choose an outcome."),
  note: z.string().trim().max(2000).default(""),
});
export type ProposeOutcomeInput = z.infer<typeof proposeOutcomeSchema>;

export const acceptOpeningSchema = z.object({
  conditions: z.string().trim().min(10, "Write down the conditions of the opening (at least 10 characters).").max(4000),
});
export type AcceptOpeningInput = z.infer<typeof acceptOpeningSchema>;

/** Query of the clash list: the revision and the low-force threshold (kN) for the force-state filter. */
export const clashListQuerySchema = z.object({
  revision: revisionNumberText,
  lowForce: z.coerce.number().min(0).max(100_000).default(5),
});

/** Re-run detection on a revision; with copyRunsFrom, first bring that revision's runs onto it (model changed). */
export const detectRequestSchema = z.object({ revision: revisionNumber, copyRunsFrom: revisionNumber.optional() });
