import { listPinsByProject } from "@/db/queries/pins";
import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { pinFilterSchema } from "@/lib/realtime/events";

/** The project's pins (for the page load), filtered by ?state=, ?discipline= and ?authorId=. */
export const GET = projectRoute({ params: projectParamsSchema, query: pinFilterSchema, action: "project.read" }, async ({ params, query }) =>
  Response.json({ pins: await listPinsByProject({ projectId: params.projectId, filter: query }) }),
);
