import { z } from "zod";
import { deleteRun } from "@/lib/commands/delete-run";
import { editRun } from "@/lib/commands/edit-run";
import { projectRoute } from "@/lib/http/route";
import { requireRevision } from "@/app/api/projects/[projectId]/_lib/require-revision";
import { editRunRequestSchema, revisionQuerySchema, runIdSchema } from "@/lib/mep/schemas";

const paramsSchema = z.object({ projectId: z.uuid(), runId: runIdSchema });

/** Edits one run (any of its fields but the id); clash detection re-runs with the change. */
export const PATCH = projectRoute({ params: paramsSchema, body: editRunRequestSchema, action: "runs.edit" }, async ({ params: { projectId, runId }, body, user }) => {
  const { revision: number, ...edit } = body;
  const revision = await requireRevision(projectId, number);
  return Response.json(await editRun({ projectId, revision, runId, edit, actorId: user.id }));
});

/** Removes one run (`?revision=N`); its clashes are kept as cleared, with their decisions. */
export const DELETE = projectRoute({ params: paramsSchema, query: revisionQuerySchema, action: "runs.edit" }, async ({ params: { projectId, runId }, query, user }) => {
  const revision = await requireRevision(projectId, query.revision);
  return Response.json({ detection: await deleteRun({ projectId, revision, runId, actorId: user.id }) });
});
