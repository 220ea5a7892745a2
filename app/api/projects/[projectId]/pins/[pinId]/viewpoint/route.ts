import { z } from "zod";
import { getPinViewpoint } from "@/db/queries/pins";
import { savePinViewSchema, SNAPSHOT_BYTES } from "@/lib/bcf";
import { savePinViewpoint } from "@/lib/commands/save-pin-viewpoint";
import { ForbiddenError, NotFoundError } from "@/lib/http/errors";
import { projectRoute } from "@/lib/http/route";
import { authorize } from "@/lib/permissions";
import { downloadUrl } from "@/lib/commands/stored-files";

const paramsSchema = z.object({ projectId: z.uuid(), pinId: z.uuid() });

/** A pin's saved view (null when none), a short-lived link to its snapshot, and whether the caller may replace it. */
export const GET = projectRoute({ params: paramsSchema, action: "project.read" }, async ({ params, membership }) => {
  const pin = await getPinViewpoint(params);
  if (!pin) throw new NotFoundError("No such pin in this project.");
  const { snapshotId, ...viewpoint } = pin.viewpoint ?? {};
  const snapshotUrl = snapshotId ? await downloadUrl({ projectId: params.projectId, attachmentId: snapshotId }).catch(() => null) : null;
  return Response.json({ viewpoint: pin.viewpoint ? viewpoint : null, snapshotUrl, canSave: authorize(membership, "pin.saveView", { kind: "pin", authorId: pin.authorId }) });
});

/** Saves the viewer's view on the pin with its snapshot PNG (pin.saveView: the pin's author, owner or structural engineer). */
export const PUT = projectRoute(
  { params: paramsSchema, body: savePinViewSchema, bodyBytes: Math.ceil((SNAPSHOT_BYTES * 4) / 3) + 64 * 1024, action: "comment.create" },
  async ({ params, body, user, membership }) => {
    const pin = await getPinViewpoint(params);
    if (!pin) throw new NotFoundError("No such pin in this project.");
    if (!authorize(membership, "pin.saveView", { kind: "pin", authorId: pin.authorId })) throw new ForbiddenError("Only the pin's author, the owner or the structural engineer may save its view.");
    const snapshot = body.snapshot ? new Uint8Array(Buffer.from(body.snapshot.slice(body.snapshot.indexOf(",") + 1), "base64")) : undefined;
    const { snapshotId, ...viewpoint } = await savePinViewpoint({ projectId: params.projectId, pinId: params.pinId, actorId: user.id, view: body.viewpoint, snapshot });
    return Response.json({ viewpoint, snapshot: Boolean(snapshotId) });
  },
);
