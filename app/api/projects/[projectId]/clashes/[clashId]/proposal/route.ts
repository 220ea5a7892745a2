import { z } from "zod";
import { proposeClashOutcome } from "@/db/queries/clashes";
import { proposeOutcomeSchema } from "@/lib/clash/outcomes";
import { projectRoute } from "@/lib/http/route";
import { STANDING_CAUTION } from "@/lib/review/caution";

const paramsSchema = z.object({ projectId: z.uuid(), clashId: z.uuid() });

/** Proposes an outcome for a clash (MEP or structural engineer); recorded with who, when and the caution. */
export const POST = projectRoute({ params: paramsSchema, body: proposeOutcomeSchema, action: "clash.propose" }, async ({ params, body, user }) => {
  const clash = await proposeClashOutcome({ ...params, actorId: user.id, ...body });
  return Response.json({ clash, caution: STANDING_CAUTION });
});
