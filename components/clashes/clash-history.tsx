"use client";
// The history of a clash on every revision, oldest first: proposals, decisions, supersessions, re-checks and
// closures, each with who (and their role then), the revision judged on, the text and the caution shown.
import { useQuery } from "@tanstack/react-query";
import type { ClashHistoryEntry } from "@/db/queries/clashes";
import { CLASH_ENTRY_LABELS, CLASH_OUTCOME_LABELS } from "@/lib/clash/outcomes";
import { apiFetch } from "@/lib/http/fetcher";
import { ROLE_LABELS } from "@/lib/permissions";

export const clashHistoryKey = (projectId: string, clashId: string) => ["projects", projectId, "clash", clashId] as const;

const when = (iso: string) => new Date(iso).toLocaleString();

export function ClashHistory({ projectId, clashId }: { projectId: string; clashId: string }) {
  const history = useQuery({ queryKey: clashHistoryKey(projectId, clashId), queryFn: () => apiFetch<{ history: ClashHistoryEntry[] }>(`/api/projects/${projectId}/clashes/${clashId}`) });
  if (history.isPending) return <p className="text-sm text-board-700">Loading the history…</p>;
  const entries = history.data?.history ?? [];
  if (entries.length === 0) return <p className="text-sm text-board-700">Nothing proposed or decided yet.</p>;
  const superseded = new Set(entries.map((e) => e.supersedesId).filter(Boolean));
  return (
    <ol className="mt-1 flex flex-col gap-2 text-sm" data-testid="clash-history">
      {entries.map((e) => (
        <li key={e.id} className={`border-l-2 pl-2 ${e.kind === "recheck" || e.kind === "supersession" ? "border-compression" : "border-board-200"}`} data-testid="clash-history-entry" data-kind={e.kind}>
          <span className="font-medium">{CLASH_ENTRY_LABELS[e.kind]}</span>
          {e.outcome && <>: {CLASH_OUTCOME_LABELS[e.outcome]}</>}
          {superseded.has(e.id) && <span className="ml-1 rounded bg-board-100 px-1 text-xs">superseded</span>}
          <span className="block text-xs text-board-700">
            {e.decidedBy ?? (e.role ? "someone who left" : "Strutroom")}
            {e.role ? ` (${ROLE_LABELS[e.role]})` : ""} · {when(e.createdAt)}
            {e.revision !== null ? ` · judged on revision ${e.revision}` : ""}
          </span>
          {e.note && <span className="block text-board-700">{e.note}</span>}
          {e.conditions && <span className="block text-board-700">Conditions: {e.conditions}</span>}
          {e.reason && <span className="block text-board-700">Reason: {e.reason}</span>}
          {(e.kind === "decision" || e.kind === "proposal") && <span className="block text-xs text-board-700">Caution shown: {e.caution}</span>}
        </li>
      ))}
    </ol>
  );
}
