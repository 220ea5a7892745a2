// What the web app tells open viewers through the live server: small invalidations `{ kind, id, revision }`.
// Viewers refetch what changed (TanStack Query); nothing of the data itself travels this way.
import { z } from "zod";

/**
 * What changed: a clash (outcome, decision), a revision (new model, analysis), a revision's runs, the team, pins and
 * threads written over HTTP (BCF import, saved views), a job's progress (phase and percent, done or failed; the
 * id is the job's, read back from its endpoint), a stored report PDF (the id is its job's; the revision's list of
 * reports changes) and the project's settings (the deflection limit; the id is the project's).
 */
export const LIVE_EVENT_KINDS = ["clash", "revision", "runs", "member", "pins", "job", "report", "settings"] as const;
export type LiveEventKind = (typeof LIVE_EVENT_KINDS)[number];

export const invalidationSchema = z.object({
  kind: z.enum(LIVE_EVENT_KINDS),
  /** The changed thing's id (clash id, revision id, user id of the member, job id, project id). */
  id: z.string(),
  /** The model revision number it belongs to, when it belongs to one. */
  revision: z.number().int().nullable(),
});
export type Invalidation = z.infer<typeof invalidationSchema>;

/** The PostgreSQL channel a command notifies after writing a live event (delivered on commit only). */
export const LIVE_EVENTS_CHANNEL = "strutroom_live_events";
