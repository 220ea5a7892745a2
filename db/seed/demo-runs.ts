// The demo project's own services on revision 1 of the Northfield roof (our invented scenario), with real clashes:
// the supply-air duct's dog-leg cuts a diagonal, the chilled-water drop comes too close to a bottom chord, the
// sprinkler main hangs too tight under the mid-span bottom chords, and a cable tray set on edge clips six
// diagonals. Idempotent: skipped once the revision has runs.
import type { Transaction } from "../client";
import { runSchema, type RunInput } from "../../lib/mep/schemas";
import { detectRevisionClashes } from "../../lib/commands/detect-revision-clashes";
import { getRevisionForMep, revisionHasRuns, upsertRuns } from "../queries/mep";

const DEMO_RUNS: RunInput[] = [
  {
    id: "SA-01",
    name: "Supply air main, hall east",
    system: "supply air",
    profile: { shape: "rectangular", width: 0.8, height: 0.4, rotation: 0 },
    insulation: 0.025,
    clearance: 0.05,
    weightPerMetre: 0.45,
    points: [{ x: 1.5, y: 18, z: 0.9 }, { x: 21, y: 18, z: 0.9 }, { x: 22.5, y: 19.5, z: 0.9 }, { x: 33, y: 19.5, z: 0.9 }, { x: 33, y: 27, z: 0.9 }],
  },
  {
    id: "CHW-01",
    name: "Chilled water flow to the air handler",
    system: "chilled water",
    profile: { shape: "round", diameter: 0.15 },
    insulation: 0.03,
    clearance: 0.05,
    weightPerMetre: 0.35,
    points: [{ x: 6, y: 3, z: 0.6 }, { x: 36, y: 3, z: 0.6 }, { x: 36, y: 9, z: 0.1 }],
  },
  {
    id: "SPR-01",
    name: "Sprinkler main, court zone",
    system: "sprinkler",
    profile: { shape: "round", diameter: 0.1 },
    insulation: 0,
    clearance: 0.05,
    weightPerMetre: 0.2,
    points: [{ x: 12, y: 12, z: -0.16 }, { x: 27, y: 12, z: -0.16 }],
  },
  {
    id: "CT-01",
    name: "Cable tray to the scoreboard",
    system: "cable tray",
    profile: { shape: "rectangular", width: 0.3, height: 0.1, rotation: 90 },
    insulation: 0,
    clearance: 0.05,
    weightPerMetre: 0.15,
    points: [{ x: 24.6, y: 13.5, z: 1.2 }, { x: 24.6, y: 22.5, z: 1.2 }],
  },
];

/** Adds the demo runs to revision 1 and stores their clashes, unless that revision already has runs. */
export async function seedDemoRuns(tx: Transaction, { projectId, createdBy }: { projectId: string; createdBy: string }): Promise<void> {
  const revision = await getRevisionForMep({ projectId, number: 1, db: tx });
  if (!revision) throw new Error("seed the demo model before its runs");
  if (await revisionHasRuns({ db: tx, revisionId: revision.id })) return;
  const runs = DEMO_RUNS.map((run) => runSchema.parse(run));
  await upsertRuns({ db: tx, revisionId: revision.id, runs, actorId: createdBy });
  await detectRevisionClashes(tx, { projectId, revision });
}
