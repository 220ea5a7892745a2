import { getNodeDetail } from "@/db/queries/node-detail";
import { NotFoundError } from "@/lib/http/errors";
import { projectRoute } from "@/lib/http/route";
import { nodeDetailParamsSchema } from "@/lib/models/columns-schemas";
import { presentNodeDetail } from "@/lib/models/node-detail";

/**
 * One node's results for the node panel (lib/models/node-detail.ts): its support, and its displacement (ux, uy, uz,
 * |u|) and reaction in every result. Immutable like the stored analysis it reads; the strong ETag names the run.
 */
export const GET = projectRoute({ params: nodeDetailParamsSchema, action: "project.read" }, async ({ params, request }) => {
  const stored = await getNodeDetail(params);
  if (!stored) throw new NotFoundError("This revision has no analysed node by that id.");
  const etag = `"${stored.runId}.node.${Buffer.from(params.nodeId).toString("base64url")}"`;
  const headers = { ETag: etag, "Cache-Control": "private, max-age=31536000, immutable", Vary: "Cookie" };
  if (request.headers.get("if-none-match") === etag) return new Response(null, { status: 304, headers });
  return Response.json(presentNodeDetail(stored), { headers });
});
