import { z } from "zod";
import { acceptClashOpening } from "@/db/queries/clashes";
import { requireProjectRole, requireUser } from "@/lib/auth/guard";
import { getRequestUser } from "@/lib/auth/session";
import { acceptOpeningSchema } from "@/lib/clash/outcomes";
import { handleRoute } from "@/lib/http/errors";
import { parseJson, parseParams } from "@/lib/http/parse";
import { STANDING_CAUTION } from "@/lib/review/caution";

type Context = RouteContext<"/api/projects/[projectId]/clashes/[clashId]/acceptance">;
const paramsSchema = z.object({ projectId: z.uuid(), clashId: z.uuid() });

/** Accepts a proposed opening with written conditions (structural engineer only); recorded with the caution. */
export const POST = handleRoute(async (request: Request, context: Context) => {
  const { projectId, clashId } = parseParams(paramsSchema, await context.params);
  const user = requireUser(await getRequestUser(request));
  await requireProjectRole(user, projectId, "clash.acceptOpening");
  const { conditions } = await parseJson(request, acceptOpeningSchema);
  const clash = await acceptClashOpening({ projectId, clashId, actorId: user.id, conditions });
  return Response.json({ clash, caution: STANDING_CAUTION });
});
