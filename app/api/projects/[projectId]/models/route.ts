import { createRevisionWithAnalysis, listRevisionsByProject } from "@/db/queries/models";
import { carryPreviousRunsForward } from "@/db/queries/mep";
import { getProjectById } from "@/db/queries/projects";
import { NotFoundError, ValidationError } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { analyseForStorage } from "@/lib/models/analyse";
import { buildRevision } from "@/lib/models/build-revision";
import { createRevisionSchema, type CreateRevisionRequest } from "@/lib/models/schemas";
import { withStoredFiles, type ReceivedFile } from "@/lib/storage/attachments";

const encoder = new TextEncoder();

/** The files an upload request carried; a generated roof has none. */
function originalFiles(input: CreateRevisionRequest): ReceivedFile[] {
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
 * problem and nothing is stored; otherwise the analysis and review run now and are stored with the revision.
 */
export const POST = projectRoute(
  // Saving a revision also runs its analysis, so both permissions are needed.
  { params: projectParamsSchema, body: createRevisionSchema, action: ["model.edit", "analysis.run"] },
  async ({ params: { projectId }, body: input, user }) => {
    const built = buildRevision(input);
    if (!built.ok) {
      const count = built.problems.length;
      throw new ValidationError(
        built.problems.map((p) => ({ path: p.where, message: p.message })),
        `The model has ${count} problem${count === 1 ? "" : "s"}; nothing was saved.`,
      );
    }
    const project = await getProjectById({ projectId });
    if (!project) throw new NotFoundError();
    const { result, review } = analyseForStorage(built.model, project.designStandard);
    // The uploaded original (the JSON model as received, or each CSV table) is stored and recorded with the revision,
    // and the previous revision's MEP runs come along with their clashes detected on the new model, in the same
    // transaction (stable clash keys keep threads attached where the same member and segment still clash).
    const revision = await withStoredFiles({ projectId, userId: user.id, purpose: "model", files: originalFiles(input) }, (record) =>
      createRevisionWithAnalysis(
        { projectId, name: built.name, model: built.model, source: built.source, createdBy: user.id, result, review },
        async (tx, saved) => {
          await record(tx, { revisionId: saved.id });
          await carryPreviousRunsForward({ projectId, revision: saved, model: built.model, actorId: user.id, db: tx });
        },
      ),
    );
    return Response.json({ revision: { ...revision, status: result.status } }, { status: 201 });
  },
);
