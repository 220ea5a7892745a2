import { getRevisionGeometry, getRevisionModel } from "@/db/queries/revision-view";
import { NotFoundError } from "@/lib/http/errors";
import { projectRoute } from "@/lib/http/route";
import { packGeometry } from "@/lib/models/geometry-wire";
import { revisionParamsSchema } from "@/lib/models/schemas";

/**
 * A revision's geometry as binary (lib/models/geometry-wire.ts): what the viewer draws the roof from before any
 * result. Packed when the revision was saved (a revision saved before that is packed from its model here). A
 * revision's model never changes, so the answer is immutable; it is private to the team (Vary: Cookie) and its
 * strong ETag names the revision, so a repeat request is a 304.
 */
export const GET = projectRoute({ params: revisionParamsSchema, action: "project.read" }, async ({ params, request }) => {
  const headers = { "Cache-Control": "private, max-age=31536000, immutable", Vary: "Cookie" };
  const revision = await getRevisionGeometry(params);
  if (!revision) throw new NotFoundError("No such revision.");
  const etag = `"geometry-${revision.id}"`;
  if (request.headers.get("if-none-match") === etag) return new Response(null, { status: 304, headers: { ...headers, ETag: etag } });
  const body = revision.geometry ?? (await packedFromModel(params));
  // (node-postgres gives bytea as a Buffer, which sits on a plain ArrayBuffer)
  return new Response(body as Uint8Array<ArrayBuffer>, { headers: { ...headers, ETag: etag, "Content-Type": "application/octet-stream", "Content-Length": String(body.byteLength) } });
});

async function packedFromModel(params: { projectId: string; number: number }): Promise<Uint8Array> {
  const revision = await getRevisionModel(params);
  if (!revision) throw new NotFoundError("No such revision.");
  return packGeometry(revision.model);
}
