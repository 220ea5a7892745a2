import { z } from "zod";
import { getClashById, listClashDecisions } from "@/db/queries/clashes";
import { NotFoundError } from "@/lib/http/errors";
import { projectRoute } from "@/lib/http/route";
import { STANDING_CAUTION } from "@/lib/review/caution";

const clashParamsSchema = z.object({ projectId: z.uuid(), clashId: z.uuid() });

/** One clash with its decision history (who decided what, when, under which caution). */
export const GET = projectRoute({ params: clashParamsSchema, action: "project.read" }, async ({ params }) => {
  const clash = await getClashById(params);
  if (!clash) throw new NotFoundError("No such clash on this project.");
  const decisions = await listClashDecisions({ clashIds: [params.clashId] });
  return Response.json({ clash, decisions: decisions.map((d) => ({ ...d, createdAt: d.createdAt.toISOString() })), caution: STANDING_CAUTION });
});
