import { z } from "zod";
import { getClashById } from "@/db/queries/clashes";
import { decideClashSchema } from "@/lib/clash/outcomes";
import { decideClash } from "@/lib/commands/decide-clash";
import { projectRoute } from "@/lib/http/route";
import { STANDING_CAUTION } from "@/lib/review/caution";

const paramsSchema = z.object({ projectId: z.uuid(), clashId: z.uuid() });

/** Decides the open proposal of a clash (structural engineer; never the proposer of an opening, see decideClash). */
export const POST = projectRoute({ params: paramsSchema, body: decideClashSchema, action: "clash.decide" }, async ({ params, body, membership }) => {
  await decideClash({ ...params, actor: membership, input: body });
  return Response.json({ clash: await getClashById(params), caution: STANDING_CAUTION });
});
