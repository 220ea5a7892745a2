import { importRuns } from "@/lib/commands/import-runs";
import { readBodyBytes } from "@/lib/http/body-bytes";
import { ValidationError } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { readIfcRuns } from "@/lib/ifc";
import { IFC_UPLOAD_BYTES, ifcRunsQuerySchema } from "@/lib/ifc/schemas";
import { requireRevision } from "@/app/api/projects/[projectId]/_lib/require-revision";

/**
 * Duct, pipe and cable-tray runs from an IFC file (the request body). `preview=1` (the default) answers the runs,
 * their count per system, what was skipped and every element not read, and stores nothing; `preview=0` stores the
 * runs (ids from the IFC GlobalIds, so a re-import updates the same runs) unless the file has problems.
 */
export const POST = projectRoute({ params: projectParamsSchema, query: ifcRunsQuerySchema, action: "runs.edit" }, async ({ request, params: { projectId }, query, user }) => {
  const revision = await requireRevision(projectId, query.revision);
  const read = await readIfcRuns(await readBodyBytes(request, IFC_UPLOAD_BYTES));
  if ("message" in read) throw new ValidationError([{ path: read.where, message: read.message }], read.message);
  const systems: Record<string, number> = {};
  for (const run of read.runs) systems[run.system] = (systems[run.system] ?? 0) + 1;
  const preview = { runs: read.runs, systems, skipped: read.skipped, sources: read.sources, problems: read.problems };
  if (query.preview === "1") return Response.json(preview);
  if (read.problems.length > 0) {
    throw new ValidationError(
      read.problems.map((p) => ({ path: p.where, message: p.message })),
      `The file has ${read.problems.length} element${read.problems.length === 1 ? "" : "s"} that could not be read; nothing was imported.`,
    );
  }
  if (read.runs.length === 0) throw new ValidationError([{ path: "file", message: "The file holds no duct, pipe or cable-tray segments." }], "The file holds no runs.");
  const detection = await importRuns({ projectId, revision, runs: read.runs, mode: query.mode, actorId: user.id });
  return Response.json({ imported: read.runs.map((r) => r.id), systems, skipped: read.skipped, detection }, { status: 201 });
});
