import { z } from "zod";
import { getClashById } from "@/db/queries/clashes";
import { proposeOutcomeSchema } from "@/lib/clash/outcomes";
import { proposeClashOutcome } from "@/lib/commands/propose-clash-outcome";
import { projectRoute } from "@/lib/http/route";
import { STANDING_CAUTION } from "@/lib/review/caution";

const paramsSchema = z.object({ projectId: z.uuid(), clashId: z.uuid() });

/** Proposes an outcome for a clash (MEP or structural engineer); refused while a decision stands. */
export const POST = projectRoute({ params: paramsSchema, body: proposeOutcomeSchema, action: "clash.propose" }, async ({ params, body, membership }) => {
  await proposeClashOutcome({ ...params, actor: membership, input: body });
  return Response.json({ clash: await getClashById(params), caution: STANDING_CAUTION });
});
