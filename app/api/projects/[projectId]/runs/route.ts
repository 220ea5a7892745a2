import { listRunsByRevision } from "@/db/queries/mep";
import { importRuns } from "@/lib/commands/import-runs";
import { ValidationError } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { requestBytes } from "@/lib/limits";
import { parseRunsFile } from "@/lib/mep/import";
import { requireRevision, requireRevisionRef } from "@/app/api/projects/[projectId]/_lib/require-revision";
import { importRunsSchema, revisionQuerySchema } from "@/lib/mep/schemas";
import { withStoredFiles } from "@/lib/commands/stored-files";

/** The runs of one revision (`?revision=N`). */
export const GET = projectRoute({ params: projectParamsSchema, query: revisionQuerySchema, action: "project.read" }, async ({ params, query }) => {
  const revision = await requireRevisionRef(params.projectId, query.revision);
  return Response.json({ runs: await listRunsByRevision({ revisionId: revision.id }) });
});

/** Imports runs from a CSV or JSON file; any problem rejects the whole file and every problem is listed. */
export const POST = projectRoute({ params: projectParamsSchema, body: importRunsSchema, bodyBytes: requestBytes.runsImport, action: "runs.edit" }, async ({ params: { projectId }, body: input, user }) => {
  const revision = await requireRevision(projectId, input.revision);
  const { runs, problems } = parseRunsFile(input.text, input.fileName);
  if (problems.length > 0) {
    throw new ValidationError(
      problems.map((p) => ({ path: p.row === null ? p.field : `row ${p.row}.${p.field}`, message: p.message })),
      `The file has ${problems.length} problem${problems.length === 1 ? "" : "s"}; nothing was imported.`,
    );
  }
  if (runs.length === 0) throw new ValidationError([{ path: "text", message: "The file holds no runs." }], "The file holds no runs.");
  // The imported file is kept as uploaded, recorded on the revision together with the runs.
  const file = { filename: input.fileName, bytes: new TextEncoder().encode(input.text) };
  const detection = await withStoredFiles({ projectId, userId: user.id, purpose: "run", files: [file] }, (record) =>
    importRuns({ projectId, revision, runs, mode: input.mode, actorId: user.id, alsoWrite: (tx) => record(tx, { revisionId: revision.id }) }),
  );
  return Response.json({ imported: runs.map((r) => r.id), detection }, { status: 201 });
});
