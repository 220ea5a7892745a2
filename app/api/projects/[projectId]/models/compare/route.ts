import { z } from "zod";
import { loadRevisionComparison } from "@/lib/commands/revision-comparison";
import { projectRoute } from "@/lib/http/route";
import { compareQuerySchema } from "@/lib/models/schemas";

/** What changed between two revisions: members, force states per result, verdicts, clashes (lib/models/compare-revisions.ts). */
export const GET = projectRoute({ params: z.object({ projectId: z.uuid() }), query: compareQuerySchema, action: "project.read" }, async ({ params, query }) =>
  Response.json({ comparison: await loadRevisionComparison({ projectId: params.projectId, from: query.from, to: query.to }) }),
);
