import { getCommentAuthor, listAttachmentsByComment } from "@/db/queries/attachments";
import { requireProjectRole, requireUser } from "@/lib/auth/guard";
import { getRequestUser } from "@/lib/auth/session";
import { ForbiddenError, handleRoute, NotFoundError } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { parseJson, parseParams, parseWith } from "@/lib/http/parse";
import type { Action } from "@/lib/permissions";
import { requestUpload } from "@/lib/storage/attachments";
import type { FilePurpose } from "@/lib/storage/content-check";
import { listAttachmentsQuerySchema, uploadRequestSchema } from "@/lib/storage/schemas";

type Context = RouteContext<"/api/projects/[projectId]/attachments">;

const ACTION_FOR: Record<FilePurpose, Action> = { comment: "comment.create", model: "model.edit", run: "runs.edit" };

/** The ready attachments of one comment (`?commentId=`), for anyone on the project. */
export const GET = handleRoute(async (request: Request, context: Context) => {
  const { projectId } = parseParams(projectParamsSchema, await context.params);
  await requireProjectRole(await getRequestUser(request), projectId, "project.read");
  const { commentId } = parseWith(listAttachmentsQuerySchema, Object.fromEntries(new URL(request.url).searchParams));
  return Response.json({ attachments: await listAttachmentsByComment({ projectId, commentId }) });
});

/**
 * Starts an upload: answers with a presigned PUT URL and the attachment id to confirm once the bytes are up.
 * Comment files may be added by the comment's author only; model files need model.edit, run files runs.edit.
 */
export const POST = handleRoute(async (request: Request, context: Context) => {
  const { projectId } = parseParams(projectParamsSchema, await context.params);
  const user = requireUser(await getRequestUser(request));
  const input = await parseJson(request, uploadRequestSchema);
  await requireProjectRole(user, projectId, ACTION_FOR[input.purpose]);
  if (input.purpose === "comment" && input.commentId) {
    const authorId = await getCommentAuthor({ projectId, commentId: input.commentId });
    if (!authorId) throw new NotFoundError("No such comment in this project.");
    if (authorId !== user.id) throw new ForbiddenError("Only the comment's author can attach files to it.");
  }
  const upload = await requestUpload({
    projectId,
    userId: user.id,
    purpose: input.purpose,
    filename: input.filename,
    contentType: input.contentType,
    sizeBytes: input.sizeBytes,
    links: { commentId: input.commentId ?? null, revisionId: input.revisionId ?? null, runId: input.runId ?? null },
  });
  return Response.json(upload, { status: 201 });
});
