import { z } from "zod";
import { getClashById } from "@/db/queries/clashes";
import { supersedeDecisionSchema } from "@/lib/clash/outcomes";
import { supersedeClashDecision } from "@/lib/commands/supersede-clash-decision";
import { projectRoute } from "@/lib/http/route";
import { STANDING_CAUTION } from "@/lib/review/caution";

const paramsSchema = z.object({ projectId: z.uuid(), clashId: z.uuid() });

/** Supersedes the standing decision of a clash with a reason (structural engineer); the history keeps both. */
export const POST = projectRoute({ params: paramsSchema, body: supersedeDecisionSchema, action: "clash.decide" }, async ({ params, body, membership }) => {
  await supersedeClashDecision({ ...params, actor: membership, input: body });
  return Response.json({ clash: await getClashById(params), caution: STANDING_CAUTION });
});
