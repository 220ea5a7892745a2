import { listLatestMemberIds } from "@/db/queries/bcf";
import { BCF_LIMITS, readBcf } from "@/lib/bcf";
import { importBcf } from "@/lib/commands/import-bcf";
import { readBodyBytes } from "@/lib/http/body-bytes";
import { ValidationError } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { memberGlobalId } from "@/lib/ifc/guid";

/**
 * Imports a BCF archive (the request body): new topics become pins, known ones gain their new comments. Any
 * problem in the archive is a 400 listing them all, and nothing is stored.
 */
export const POST = projectRoute({ params: projectParamsSchema, action: ["pin.create", "comment.create"] }, async ({ request, params: { projectId }, user }) => {
  const { file, problems } = readBcf(await readBodyBytes(request, BCF_LIMITS.archiveBytes));
  if (problems.length > 0 || !file) {
    throw new ValidationError(
      problems.map((p) => ({ path: p.where, message: p.message })),
      `The BCF file has ${problems.length} problem${problems.length === 1 ? "" : "s"}; nothing was imported.`,
    );
  }
  const members = new Map((await listLatestMemberIds({ projectId })).map((id) => [memberGlobalId(id), id]));
  const summary = await importBcf({ projectId, actor: { userId: user.id }, file, memberOf: (guid) => members.get(guid) });
  return Response.json(summary, { status: 201 });
});
