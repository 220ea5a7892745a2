import { listPinsForBcf } from "@/db/queries/bcf";
import { getProjectById } from "@/db/queries/projects";
import { bcfFromPins, TOPIC_STATUSES, writeBcf } from "@/lib/bcf";
import { NotFoundError } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { memberGlobalId } from "@/lib/ifc/guid";
import { readSnapshot } from "@/lib/commands/stored-files";

/** Every pin of the project as a BCF 3.0 archive: topics, comments and saved views (camera, member, section box, snapshot). */
export const GET = projectRoute({ params: projectParamsSchema, action: "report.export" }, async ({ params: { projectId } }) => {
  const project = await getProjectById({ projectId });
  if (!project) throw new NotFoundError();
  const rows = await listPinsForBcf({ projectId });
  const pins = await Promise.all(rows.map(async ({ pin, authorEmail, comments }) => ({
    ...pin,
    snapshot: pin.viewpoint?.snapshotId ? await readSnapshot({ projectId, attachmentId: pin.viewpoint.snapshotId }) : undefined,
    authorEmail,
    anchor: pin.anchorKind === "point" ? `point (${[pin.anchorX, pin.anchorY, pin.anchorZ].map((v) => (v ?? 0).toFixed(2)).join(", ")})` : `${pin.anchorKind} ${pin.anchorId}`,
    comments: comments.map(({ comment, authorEmail: email }) => ({ ...comment, authorEmail: email })),
  })));
  const bytes = writeBcf(bcfFromPins({ id: projectId, name: project.name }, pins, memberGlobalId), Object.values(TOPIC_STATUSES));
  return new Response(Buffer.from(bytes), { headers: { "content-type": "application/octet-stream", "content-disposition": `attachment; filename="strutroom-pins.bcf"` } });
});
