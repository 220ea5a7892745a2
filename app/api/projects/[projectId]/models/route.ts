import { listRevisionsByProject } from "@/db/queries/models";
import { createRevision } from "@/lib/commands/create-revision";
import { ValidationError } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { requestBytes } from "@/lib/limits";
import { buildRevision } from "@/lib/models/build-revision";
import { createRevisionSchema, type InlineRevisionRequest } from "@/lib/models/schemas";
import { requestFromUploadedFiles } from "@/lib/models/uploaded-files";
import { readModelFiles } from "@/app/api/projects/[projectId]/_lib/uploaded-model-files";
import type { ReceivedFile } from "@/lib/commands/stored-files";

const encoder = new TextEncoder();

/** The files an upload request carried; a generated roof has none. */
function originalFiles(input: InlineRevisionRequest): ReceivedFile[] {
  if (input.kind === "uploadJson") return [{ filename: input.fileName ?? "model.json", bytes: encoder.encode(JSON.stringify(input.model)) }];
  if (input.kind === "uploadCsv") return Object.entries(input.tables).map(([filename, text]) => ({ filename, bytes: encoder.encode(text) }));
  return [];
}

/** The project's model revisions, newest first. */
export const GET = projectRoute({ params: projectParamsSchema, action: "project.read" }, async ({ params }) =>
  Response.json({ revisions: await listRevisionsByProject(params) }),
);

/**
 * Creates a revision from generator parameters or an uploaded JSON / CSV model. Bad input is a 400 listing every
 * problem and nothing is stored; otherwise the revision is stored and its analysis and review queued: 202 with the
 * job, whose progress the browser follows at /jobs/<id>.
 */
export const POST = projectRoute(
  // Saving a revision also runs its analysis, so both permissions are needed.
  { params: projectParamsSchema, body: createRevisionSchema, bodyBytes: requestBytes.modelUpload, action: ["model.edit", "analysis.run"] },
  async ({ params: { projectId }, body: input, user }) => {
    const inline = input.kind === "uploadFiles" ? requestFromUploadedFiles(await readModelFiles({ projectId, userId: user.id, attachmentIds: input.attachmentIds }), input.name) : input;
    const built = buildRevision(inline);
    if (!built.ok) {
      const count = built.problems.length;
      throw new ValidationError(
        built.problems.map((p) => ({ path: p.where, message: p.message })),
        `The model has ${count} problem${count === 1 ? "" : "s"}; nothing was saved.`,
      );
    }
    const { revision, job } = await createRevision({
      projectId,
      userId: user.id,
      name: built.name,
      model: built.model,
      source: built.source,
      originals: input.kind === "uploadFiles" ? [] : originalFiles(input),
      uploadedFiles: input.kind === "uploadFiles" ? input.attachmentIds : [],
    });
    return Response.json({ revision, job }, { status: 202 });
  },
);
