import { z } from "zod";
import { getClashById, listClashDecisions } from "@/db/queries/clashes";
import { requireProjectRole } from "@/lib/auth/guard";
import { getRequestUser } from "@/lib/auth/session";
import { NotFoundError, handleRoute } from "@/lib/http/errors";
import { parseParams } from "@/lib/http/parse";
import { STANDING_CAUTION } from "@/lib/review/caution";

type Context = RouteContext<"/api/projects/[projectId]/clashes/[clashId]">;
const clashParamsSchema = z.object({ projectId: z.uuid(), clashId: z.uuid() });

/** One clash with its decision history (who decided what, when, under which caution). */
export const GET = handleRoute(async (request: Request, context: Context) => {
  const { projectId, clashId } = parseParams(clashParamsSchema, await context.params);
  await requireProjectRole(await getRequestUser(request), projectId, "project.read");
  const clash = await getClashById({ projectId, clashId });
  if (!clash) throw new NotFoundError("No such clash on this project.");
  const decisions = await listClashDecisions({ clashIds: [clashId] });
  return Response.json({ clash, decisions: decisions.map((d) => ({ ...d, createdAt: d.createdAt.toISOString() })), caution: STANDING_CAUTION });
});
