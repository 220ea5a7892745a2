import { z } from "zod";
import { getClashById, listClashHistory } from "@/db/queries/clashes";
import { NotFoundError } from "@/lib/http/errors";
import { projectRoute } from "@/lib/http/route";
import { STANDING_CAUTION } from "@/lib/review/caution";

const clashParamsSchema = z.object({ projectId: z.uuid(), clashId: z.uuid() });

/** One clash with its history on every revision (who proposed, decided or superseded what, when, why). */
export const GET = projectRoute({ params: clashParamsSchema, action: "project.read" }, async ({ params }) => {
  const clash = await getClashById(params);
  if (!clash) throw new NotFoundError("No such clash on this project.");
  const history = await listClashHistory({ projectId: params.projectId, clashKeys: [clash.clashKey] });
  return Response.json({ clash, history, caution: STANDING_CAUTION });
});
