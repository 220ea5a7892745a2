"use client";
// The side panel of the selected member: forces in every load case and combination, envelope, utilisation with
// the numbers behind it, why it is zero, its influence map, and the removal / opening what-ifs with the standing
// caution. Forces, envelope and review come from the member's own endpoint (one member, not the whole run).
import { useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/lib/http/fetcher";
import type { MemberDetail } from "@/lib/models/member-detail";
import { forceStateOf } from "@/lib/vocabulary/force-state";
import { InfluenceControl } from "./influence-control";
import { MemberReviewSection } from "./member-review-section";
import { EndDisplacementTable, ReactionTable } from "./node-results-tables";
import { LoadFailure } from "./load-failure";
import { resultLabel, type PreparedModel } from "./prepare";
import { useWhatIfWorker } from "./use-whatif-worker";
import type { ViewedRevision } from "./viewed-revision";
import { useViewerStore } from "./viewer-store";

const kN = (value: number) => `${value.toFixed(2)} kN`;


export function MemberPanel({ projectId, prepared, revision }: { projectId: string; prepared: PreparedModel; revision: ViewedRevision }) {
  const { ask, ready } = useWhatIfWorker(projectId, revision.number, revision.analysis?.review?.standard ?? null);
  const selected = useViewerStore((s) => s.selectedMemberId);
  const resultId = useViewerStore((s) => s.resultId);
  const k = selected ? prepared.memberIndex.get(selected) : undefined;
  const detailQuery = useQuery({
    queryKey: ["projects", projectId, "models", revision.number, "members", selected],
    queryFn: () => apiFetch<MemberDetail>(`/api/projects/${projectId}/models/${revision.number}/members/${encodeURIComponent(selected!)}`),
    enabled: selected !== null && k !== undefined,
    staleTime: Infinity,
  });
  if (!selected || k === undefined) return null;
  const detail = detailQuery.data;
  const member = prepared.model.members[k];
  const group = prepared.groups[member.id] ?? "other";
  const a = prepared.ends[k * 2] * 3;
  const b = prepared.ends[k * 2 + 1] * 3;
  const p = prepared.nodes.positions;
  const length = Math.hypot(p[b] - p[a], p[b + 1] - p[a + 1], p[b + 2] - p[a + 2]);
  const envelope = detail?.envelope;
  const governing = detail?.governing;
  const ids = detail ? [...prepared.model.loadCases.map((c) => c.id), ...prepared.model.combinations.map((c) => c.id)].filter((id) => id in detail.results) : [];
  const isCombination = new Set(prepared.model.combinations.map((c) => c.id));
  const supported = new Set(prepared.model.supports.map((s) => s.node));

  return (
    <aside data-testid="member-panel" aria-label={`Member ${member.id}`} className="absolute inset-y-0 right-0 z-20 w-80 max-w-full overflow-y-auto border-l border-board-200 bg-white p-4 text-sm shadow-lg">
      <header className="mb-3 flex items-start justify-between">
        <div>
          <h2 className="text-lg font-semibold" data-testid="member-panel-id">Member {member.id}</h2>
          <p className="text-xs text-board-700">
            {group.replace("_", " ")} · section {member.section} · {member.i} → {member.j} · L = {length.toFixed(3)} m
          </p>
        </div>
        <button type="button" className="rounded px-2 text-board-700 hover:bg-board-100" aria-label="Close the member panel" onClick={() => useViewerStore.getState().selectMember(null)}>
          ×
        </button>
      </header>

      <h3 className="mb-1 font-semibold">Axial force (tension positive)</h3>
      {detailQuery.isPending ? <p className="text-xs text-board-700">Loading this member&apos;s results…</p> : null}
      {detailQuery.isError ? <LoadFailure error={detailQuery.error} retry={() => void detailQuery.refetch()} /> : null}
      <table className="mb-3 w-full text-xs" data-testid="member-panel-forces">
        <tbody>
          {ids.map((id) => {
            const { force, zero } = detail!.results[id];
            return (
              <tr key={id} className={id === resultId ? "font-semibold outline outline-2 -outline-offset-2 outline-selection" : ""}>
                <td className="py-0.5 pr-2">
                  <button type="button" className="text-left hover:underline" onClick={() => useViewerStore.getState().setResult(id)}>
                    {resultLabel(prepared.model, id)}
                    {isCombination.has(id) ? "" : " (case)"}
                  </button>
                </td>
                <td className="text-right font-mono tabular-nums">{kN(force)}</td>
                <td className={`pl-2 ${zero ? "text-board-700" : force > 0 ? "text-tension" : "text-compression"}`}>{forceStateOf(force, zero)}</td>
              </tr>
            );
          })}
        </tbody>
      </table>

      {detail ? (
        <section className="mb-3" data-testid="member-panel-ends">
          <h3 className="mb-1 font-semibold">Displacement of its end nodes</h3>
          <EndDisplacementTable model={prepared.model} rows={detail.ends} ends={member} testId="member-panel-end-displacements" />
          {(["i", "j"] as const)
            .filter((end) => supported.has(member[end]))
            .map((end) => (
              <div key={end}>
                <h4 className="text-xs font-semibold">Support reaction at {member[end]} (kN, on the roof)</h4>
                <ReactionTable model={prepared.model} rows={Object.fromEntries(Object.entries(detail.ends).map(([id, e]) => [id, e[end]]))} testId={`member-panel-reactions-${end}`} />
              </div>
            ))}
        </section>
      ) : null}

      {envelope ? (
        <section className="mb-3" data-testid="member-panel-envelope">
          <h3 className="mb-1 font-semibold">Envelope over {detail?.envelopeOver === "combinations" ? "the combinations" : "the load cases"}</h3>
          <dl className="grid grid-cols-2 gap-x-2 text-xs">
            <dt>Largest tension</dt>
            <dd className="font-mono">{kN(envelope.maxTension)} {governing?.maxTension ? `(${governing.maxTension})` : ""}</dd>
            <dt>Largest compression</dt>
            <dd className="font-mono">{kN(envelope.maxCompression)} {governing?.maxCompression ? `(${governing.maxCompression})` : ""}</dd>
            <dt>Zero everywhere</dt>
            <dd>{envelope.zeroInAll ? "yes" : "no"}</dd>
          </dl>
        </section>
      ) : null}

      <InfluenceControl key={member.id} memberId={member.id} ask={ask} ready={ready} />

      <MemberReviewSection memberId={member.id} detail={detail} revision={revision} prepared={prepared} ask={ask} ready={ready} />
    </aside>
  );
}
