import { listClashesByRevision } from "@/db/queries/clashes";
import { copyRunsToRevision, getMemberStatesForRevision, listRunsByRevision, redetectClashes } from "@/db/queries/mep";
import { requireProjectRole, requireUser } from "@/lib/auth/guard";
import { getRequestUser } from "@/lib/auth/session";
import { clashListQuerySchema, detectRequestSchema } from "@/lib/clash/outcomes";
import { clashTableRows } from "@/lib/clash/rows";
import { memberVerdicts } from "@/lib/clash/verdicts";
import { handleRoute } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { parseJson, parseParams, parseWith } from "@/lib/http/parse";
import { requireRevision } from "@/lib/mep/revision";
import { abilitiesOf } from "@/lib/permissions";
import { STANDING_CAUTION } from "@/lib/review/caution";

type Context = RouteContext<"/api/projects/[projectId]/clashes">;

/**
 * The clashes of one revision (`?revision=N&lowForce=kN`) with each member's forces over all combinations, its
 * force state and verdict, plus what the caller may do and the standing caution.
 */
export const GET = handleRoute(async (request: Request, context: Context) => {
  const { projectId } = parseParams(projectParamsSchema, await context.params);
  const membership = await requireProjectRole(await getRequestUser(request), projectId, "project.read");
  const query = parseWith(clashListQuerySchema, Object.fromEntries(new URL(request.url).searchParams));
  const revision = await requireRevision(projectId, query.revision);
  const [clashes, runs, states] = await Promise.all([
    listClashesByRevision({ revisionId: revision.id }),
    listRunsByRevision({ revisionId: revision.id }),
    getMemberStatesForRevision({ revisionId: revision.id }),
  ]);
  const rows = clashTableRows({ clashes, runs, envelope: states.envelope, verdicts: memberVerdicts(states.verdicts), lowForceThreshold: query.lowForce });
  const abilities = abilitiesOf(membership.role);
  return Response.json({
    revision: { id: revision.id, number: revision.number },
    clashes: rows,
    abilities: {
      propose: abilities["clash.propose"],
      acceptOpening: abilities["clash.acceptOpening"],
      editRuns: abilities["runs.edit"],
      hangServices: abilities["model.edit"] && abilities["analysis.run"],
    },
    caution: STANDING_CAUTION,
  });
});

/**
 * Re-runs clash detection on the revision's runs (on request), or — with `copyRunsFrom` — first brings an earlier
 * revision's runs onto a new revision that has none, so a model change keeps its services and clash ids.
 */
export const POST = handleRoute(async (request: Request, context: Context) => {
  const { projectId } = parseParams(projectParamsSchema, await context.params);
  const user = requireUser(await getRequestUser(request));
  await requireProjectRole(user, projectId, "runs.edit");
  const input = await parseJson(request, detectRequestSchema);
  const revision = await requireRevision(projectId, input.revision);
  if (input.copyRunsFrom !== undefined) {
    const from = await requireRevision(projectId, input.copyRunsFrom);
    return Response.json({ detection: await copyRunsToRevision({ projectId, fromRevisionId: from.id, toRevision: revision, actorId: user.id }) });
  }
  return Response.json({ detection: await redetectClashes({ projectId, revision, actorId: user.id }) });
});
