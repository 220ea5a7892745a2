import { z } from "zod";
import { acceptClashOpening } from "@/db/queries/clashes";
import { acceptOpeningSchema } from "@/lib/clash/outcomes";
import { projectRoute } from "@/lib/http/route";
import { STANDING_CAUTION } from "@/lib/review/caution";

const paramsSchema = z.object({ projectId: z.uuid(), clashId: z.uuid() });

/** Accepts a proposed opening with written conditions (structural engineer only); recorded with the caution. */
export const POST = projectRoute({ params: paramsSchema, body: acceptOpeningSchema, action: "clash.acceptOpening" }, async ({ params, body, user }) => {
  const clash = await acceptClashOpening({ ...params, actorId: user.id, conditions: body.conditions });
  return Response.json({ clash, caution: STANDING_CAUTION });
});
