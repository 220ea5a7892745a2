// Tests that need a revision derived from another with a model of their own (a resized chord, a pulled joint), its
// runs carried and its analysis queued, store it with the same transaction step the hang-services job uses
// (lib/commands/store-derived-revision.ts); the job itself always hangs the runs on the source's model.
import { runRevisionCommand } from "@/lib/commands/command";
import { storeDerivedRevision } from "@/lib/commands/store-derived-revision";

export function deriveRevision(input: Parameters<typeof storeDerivedRevision>[1]) {
  return runRevisionCommand(async ({ tx, live }) => {
    const derived = await storeDerivedRevision(tx, input);
    await live({ projectId: input.projectId, kind: "revision", subjectId: derived.revision.id, revision: derived.revision.number });
    return derived;
  });
}
