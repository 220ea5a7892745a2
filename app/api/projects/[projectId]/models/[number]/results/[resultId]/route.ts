import { getResultColumns } from "@/db/queries/result-columns";
import { NotFoundError } from "@/lib/http/errors";
import { projectRoute } from "@/lib/http/route";
import { resultColumnsParamsSchema } from "@/lib/models/columns-schemas";
import { wireFromStored } from "@/lib/models/result-columns";

/**
 * One result's columns as binary (lib/models/result-columns.ts packWire): what the viewer draws from. A stored
 * analysis never changes, so the answer is immutable; it is private to the team, and the strong ETag names the run.
 */
export const GET = projectRoute({ params: resultColumnsParamsSchema, action: "project.read" }, async ({ params, request }) => {
  const stored = await getResultColumns(params);
  if (!stored) throw new NotFoundError("This revision has no stored result by that id.");
  const etag = `"${stored.runId}.${Buffer.from(params.resultId).toString("base64url")}"`;
  const headers = { ETag: etag, "Cache-Control": "private, max-age=31536000, immutable", Vary: "Cookie" };
  if (request.headers.get("if-none-match") === etag) return new Response(null, { status: 304, headers });
  const body = wireFromStored(stored);
  return new Response(body, { headers: { ...headers, "Content-Type": "application/octet-stream", "Content-Length": String(body.byteLength) } });
});
