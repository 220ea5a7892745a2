import { listClashesByRevision } from "@/db/queries/clashes";
import { listMembersByProject } from "@/db/queries/memberships";
import { getMemberStatesForRevision, listRunsByRevision } from "@/db/queries/mep";
import { copyRunsToRevision } from "@/lib/commands/copy-runs";
import { redetectClashes } from "@/lib/commands/redetect-clashes";
import { clashListQuerySchema, detectRequestSchema } from "@/lib/clash/outcomes";
import { clashTableRows } from "@/lib/clash/rows";
import { analysedPatternsFrom, memberVerdicts } from "@/lib/clash/verdicts";
import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { requireRevision, requireRevisionRef } from "@/app/api/projects/[projectId]/_lib/require-revision";
import { authorize } from "@/lib/permissions";
import { STANDING_CAUTION } from "@/lib/review/caution";

/**
 * The clashes of one revision (`?revision=N&lowForce=kN`) with each member's forces over all combinations, its
 * force state and verdict (with the load patterns analysed, which "idle" rests on), plus what the caller may do
 * and the standing caution.
 */
export const GET = projectRoute({ params: projectParamsSchema, query: clashListQuerySchema, action: "project.read" }, async ({ params, query, membership }) => {
  const revision = await requireRevisionRef(params.projectId, query.revision);
  const [clashes, runs, team] = await Promise.all([
    listClashesByRevision({ revisionId: revision.id }),
    listRunsByRevision({ revisionId: revision.id }),
    listMembersByProject({ projectId: params.projectId }),
  ]);
  const states = await getMemberStatesForRevision({ revisionId: revision.id, memberIds: clashes.map((clash) => clash.memberId) });
  const rows = clashTableRows({ clashes, runs, envelope: states.envelope, verdicts: memberVerdicts(states.verdicts), lowForceThreshold: query.lowForce });
  return Response.json({
    revision: { id: revision.id, number: revision.number },
    userId: membership.userId,
    role: membership.role,
    team: team.map((m) => ({ userId: m.userId, name: m.name, role: m.role })),
    clashes: rows,
    analysedPatterns: analysedPatternsFrom(states.patterns),
    abilities: {
      propose: authorize(membership, "clash.propose"),
      decide: authorize(membership, "clash.decide"),
      assign: authorize(membership, "clash.assign"),
      editRuns: authorize(membership, "runs.edit"),
      hangServices: authorize(membership, "model.edit") && authorize(membership, "analysis.run"),
    },
    caution: STANDING_CAUTION,
  });
});

/**
 * Re-runs clash detection on the revision's runs (on request), or — with `copyRunsFrom` — first brings an earlier
 * revision's runs onto a new revision that has none, so a model change keeps its services and clash ids.
 */
export const POST = projectRoute({ params: projectParamsSchema, body: detectRequestSchema, action: "runs.edit" }, async ({ params: { projectId }, body: input, user }) => {
  const revision = await requireRevision(projectId, input.revision);
  if (input.copyRunsFrom !== undefined) {
    const from = await requireRevision(projectId, input.copyRunsFrom);
    return Response.json({ detection: await copyRunsToRevision({ projectId, fromRevisionId: from.id, toRevision: revision, actorId: user.id }) });
  }
  return Response.json({ detection: await redetectClashes({ projectId, revision, actorId: user.id }) });
});
