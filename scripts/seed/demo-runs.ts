// The demo project's own services on revision 1 of the Northfield roof (our invented scenario), with real clashes.
// Three tell the review's story (lib/analysis/demo-roof.ts says why each member carries what it does):
// the fresh-air intake FA-01 cuts west edge chord TCY-0-5, zero in every combination (an opening can be accepted
// with conditions); the heating pipe HW-01 cuts restraint strut RS-W1, zero under every gravity combination but
// working under the wind from the west (an opening is refused); the supply-air riser SA-02 cuts mid-span bottom
// chord BCX-7-5, working hard in every gravity combination (the run is rerouted). Around them: the supply-air
// duct's dog-leg cuts a diagonal, the chilled-water drop comes too close to a bottom chord, the sprinkler main
// hangs too tight under the mid-span bottom chords, and a cable tray set on edge clips six diagonals.
// Idempotent: skipped once the revision has runs.
import type { Transaction } from "../../db/client";
import { DEMO_RUNS } from "../../lib/mep/demo-runs";
import { runSchema } from "../../lib/mep/schemas";
import { detectRevisionClashes } from "../../lib/commands/detect-revision-clashes";
import { getRevisionForMep, revisionHasRuns, upsertRuns } from "../../db/queries/mep";

/** Adds the demo runs to revision 1 and stores their clashes, unless that revision already has runs. */
export async function seedDemoRuns(tx: Transaction, { projectId, createdBy }: { projectId: string; createdBy: string }): Promise<void> {
  const revision = await getRevisionForMep({ projectId, number: 1, db: tx });
  if (!revision) throw new Error("seed the demo model before its runs");
  if (await revisionHasRuns({ db: tx, revisionId: revision.id })) return;
  const runs = DEMO_RUNS.map((run) => runSchema.parse(run));
  await upsertRuns({ db: tx, revisionId: revision.id, runs, actorId: createdBy });
  await detectRevisionClashes(tx, { projectId, revision });
}
