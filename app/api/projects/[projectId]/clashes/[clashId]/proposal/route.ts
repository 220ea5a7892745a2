import { z } from "zod";
import { proposeClashOutcome } from "@/db/queries/clashes";
import { requireProjectRole, requireUser } from "@/lib/auth/guard";
import { getRequestUser } from "@/lib/auth/session";
import { proposeOutcomeSchema } from "@/lib/clash/outcomes";
import { handleRoute } from "@/lib/http/errors";
import { parseJson, parseParams } from "@/lib/http/parse";
import { STANDING_CAUTION } from "@/lib/review/caution";

type Context = RouteContext<"/api/projects/[projectId]/clashes/[clashId]/proposal">;
const paramsSchema = z.object({ projectId: z.uuid(), clashId: z.uuid() });

/** Proposes an outcome for a clash (MEP or structural engineer); recorded with who, when and the caution. */
export const POST = handleRoute(async (request: Request, context: Context) => {
  const { projectId, clashId } = parseParams(paramsSchema, await context.params);
  const user = requireUser(await getRequestUser(request));
  await requireProjectRole(user, projectId, "clash.propose");
  const input = await parseJson(request, proposeOutcomeSchema);
  const clash = await proposeClashOutcome({ projectId, clashId, actorId: user.id, ...input });
  return Response.json({ clash, caution: STANDING_CAUTION });
});
