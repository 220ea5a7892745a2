import { listClashesByRevision } from "@/db/queries/clashes";
import { clashesCsv } from "@/lib/clash/csv";
import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { requireRevisionRef } from "@/app/api/projects/[projectId]/_lib/require-revision";
import { envelopeQuerySchema } from "@/lib/report/schemas";
import { getDefaultRevisionNumber } from "@/db/queries/models";
import { NotFoundError } from "@/lib/http/errors";

/** The clashes of a revision (`?revision=`, the current one when absent) as CSV, with where each decision stands. */
export const GET = projectRoute({ params: projectParamsSchema, query: envelopeQuerySchema, action: "report.export" }, async ({ params, query }) => {
  const number = query.revision ?? (await getDefaultRevisionNumber({ projectId: params.projectId }));
  if (number === null) throw new NotFoundError("This project has no model revision yet.");
  const revision = await requireRevisionRef(params.projectId, number);
  const csv = clashesCsv(await listClashesByRevision({ revisionId: revision.id }));
  return new Response(csv, { headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="clashes-rev${revision.number}.csv"` } });
});
