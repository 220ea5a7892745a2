import { z } from "zod";
import { getClashById } from "@/db/queries/clashes";
import { assignClashSchema } from "@/lib/clash/outcomes";
import { assignClash } from "@/lib/commands/assign-clash";
import { projectRoute } from "@/lib/http/route";

const paramsSchema = z.object({ projectId: z.uuid(), clashId: z.uuid() });

/** Sets the assignee and due date of a clash (MEP or structural engineer). */
export const PUT = projectRoute({ params: paramsSchema, body: assignClashSchema, action: "clash.assign" }, async ({ params, body, membership }) => {
  await assignClash({ ...params, actor: membership, input: body });
  return Response.json({ clash: await getClashById(params) });
});
