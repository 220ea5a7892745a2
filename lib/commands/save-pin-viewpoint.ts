import "server-only";
import { getPinViewpoint, setPinViewpoint } from "@/db/queries/pins";
import type { Viewpoint, StoredPinViewpoint } from "@/lib/bcf";
import { NotFoundError } from "@/lib/http/errors";
import { removeStoredFile, withStoredFiles } from "@/lib/commands/stored-files";
import { runCommand } from "./command";

/**
 * Saves the viewer's view on a pin: camera, result, colouring, selected member, section box, and the canvas capture
 * as a snapshot PNG in object storage. The PNG is checked from its bytes and stored first; the view, the snapshot's
 * record and the audit event then commit together, and a pin removed meanwhile leaves no file behind. The snapshot
 * it replaces is removed once the new view is committed.
 */
export async function savePinViewpoint({ projectId, pinId, actorId, view, snapshot }: { projectId: string; pinId: string; actorId: string; view: Viewpoint; snapshot?: Uint8Array }): Promise<StoredPinViewpoint> {
  const files = snapshot ? [{ filename: `view-${pinId}.png`, bytes: snapshot }] : [];
  const saved = await withStoredFiles({ projectId, userId: actorId, purpose: "snapshot", files }, (record) =>
    runCommand(async ({ tx, audit }) => {
      const previous = (await getPinViewpoint({ projectId, pinId, db: tx }))?.viewpoint?.snapshotId;
      const [stored] = await record(tx, {});
      const viewpoint: StoredPinViewpoint = { ...view, ...(stored ? { snapshotId: stored.id } : {}) };
      if (!(await setPinViewpoint({ projectId, pinId, viewpoint, db: tx }))) throw new NotFoundError("No such pin in this project.");
      await audit({ projectId, actorId, action: "pin.saveView", subjectType: "pin", subjectId: pinId, details: { snapshot: Boolean(stored), selectedMember: view.selectedMember ?? null, result: view.result ?? null } });
      return { viewpoint, previous };
    }),
  );
  if (saved.previous && saved.previous !== saved.viewpoint.snapshotId) await removeStoredFile({ projectId, attachmentId: saved.previous });
  return saved.viewpoint;
}
