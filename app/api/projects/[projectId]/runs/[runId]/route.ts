import { z } from "zod";
import { deleteRun, updateRun } from "@/db/queries/mep";
import { requireProjectRole, requireUser } from "@/lib/auth/guard";
import { getRequestUser } from "@/lib/auth/session";
import { handleRoute } from "@/lib/http/errors";
import { parseJson, parseParams, parseWith } from "@/lib/http/parse";
import { requireRevision } from "@/lib/mep/revision";
import { editRunRequestSchema, revisionQuerySchema, runIdSchema } from "@/lib/mep/schemas";

type Context = RouteContext<"/api/projects/[projectId]/runs/[runId]">;
const paramsSchema = z.object({ projectId: z.uuid(), runId: runIdSchema });

/** Edits one run (any of its fields but the id); clash detection re-runs with the change. */
export const PATCH = handleRoute(async (request: Request, context: Context) => {
  const { projectId, runId } = parseParams(paramsSchema, await context.params);
  const user = requireUser(await getRequestUser(request));
  await requireProjectRole(user, projectId, "runs.edit");
  const { revision: number, ...edit } = await parseJson(request, editRunRequestSchema);
  const revision = await requireRevision(projectId, number);
  return Response.json(await updateRun({ projectId, revision, runId, edit, actorId: user.id }));
});

/** Removes one run (`?revision=N`); its clashes are kept as cleared, with their decisions. */
export const DELETE = handleRoute(async (request: Request, context: Context) => {
  const { projectId, runId } = parseParams(paramsSchema, await context.params);
  const user = requireUser(await getRequestUser(request));
  await requireProjectRole(user, projectId, "runs.edit");
  const { revision: number } = parseWith(revisionQuerySchema, Object.fromEntries(new URL(request.url).searchParams));
  const revision = await requireRevision(projectId, number);
  return Response.json({ detection: await deleteRun({ projectId, revision, runId, actorId: user.id }) });
});
