import { getCommentAuthor, listAttachmentsByComment } from "@/db/queries/attachments";
import { ForbiddenError, NotFoundError } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { authorize, type Action } from "@/lib/permissions";
import { requestUpload } from "@/lib/commands/stored-files";
import type { UploadPurpose } from "@/lib/storage/content-check";
import { listAttachmentsQuerySchema, uploadRequestSchema } from "@/lib/storage/schemas";

const ACTION_FOR: Record<UploadPurpose, Action> = { comment: "comment.create", model: "model.edit", run: "runs.edit" };

/** The ready attachments of one comment (`?commentId=`), for anyone on the project. */
export const GET = projectRoute({ params: projectParamsSchema, query: listAttachmentsQuerySchema, action: "project.read" }, async ({ params, query }) =>
  Response.json({ attachments: await listAttachmentsByComment({ projectId: params.projectId, commentId: query.commentId }) }),
);

/**
 * Starts an upload: answers with a presigned PUT URL and the attachment id to confirm once the bytes are up.
 * Comment files may be added by the comment's author only; model files need model.edit, run files runs.edit.
 */
export const POST = projectRoute(
  { params: projectParamsSchema, body: uploadRequestSchema, action: (input) => ACTION_FOR[input.purpose] },
  async ({ params: { projectId }, body: input, user, membership }) => {
    if (input.purpose === "comment" && input.commentId) {
      const authorId = await getCommentAuthor({ projectId, commentId: input.commentId });
      if (!authorId) throw new NotFoundError("No such comment in this project.");
      if (!authorize(membership, "comment.attach", { kind: "comment", authorId })) throw new ForbiddenError("Only the comment's author can attach files to it.");
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
  },
);
