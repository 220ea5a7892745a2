"use client";
// The selected clash: what it is, the member's forces and verdict, where its decision stands (proposed, decided,
// needing another look, closed), the forms the caller may use and the history on every revision. The standing
// caution is always shown.
import { useQueryClient } from "@tanstack/react-query";
import { ENVELOPE_STATE_LABELS } from "@/lib/clash/envelope-state";
import { CLASH_KIND_LABELS, CLASH_OUTCOME_LABELS } from "@/lib/clash/outcomes";
import { clashDecisionRefusal } from "@/lib/permissions";
import { idlePatternsText } from "@/lib/review/analysed-patterns";
import { AssignForm, DecideForm, ProposeForm, SupersedeForm } from "./clash-forms";
import { ClashHistory, clashHistoryKey } from "./clash-history";
import type { ClashListResponse, ClashRowData } from "./types";

const when = (iso: string | null) => (iso ? new Date(iso).toLocaleString() : "");

function Standing({ clash }: { clash: ClashRowData }) {
  if (!clash.outcome) return <p className="mt-1 text-sm" data-testid="clash-outcome">Outcome: <strong>undecided</strong></p>;
  const label = CLASH_OUTCOME_LABELS[clash.outcome];
  return (
    <div className="mt-1 text-sm" data-testid="clash-outcome" data-state={clash.decidedAt ? "decided" : "proposed"}>
      {clash.decidedAt ? (
        <p>
          Decided: <strong>{label}</strong> · by {clash.decidedBy ?? "someone who left"}, {when(clash.decidedAt)}
          {clash.proposedBy ? ` · proposed by ${clash.proposedBy}` : ""}
        </p>
      ) : (
        <p>
          Proposed: <strong>{label}</strong> · by {clash.proposedBy ?? "someone who left"}, {when(clash.proposedAt)} · waiting for the structural engineer’s decision
        </p>
      )}
      {clash.conditions && (
        <p className="mt-1 rounded bg-board-50 p-2" data-testid="clash-conditions">
          Conditions: {clash.conditions}
        </p>
      )}
      {clash.outcome === "opening_refused" && clash.note && (
        <p className="mt-1 rounded bg-board-50 p-2" data-testid="clash-refusal">
          Reason: {clash.note}
        </p>
      )}
    </div>
  );
}

export function DecisionPanel({ projectId, clash, list }: { projectId: string; clash: ClashRowData; list: ClashListResponse }) {
  const queryClient = useQueryClient();
  const refresh = () => {
    void queryClient.invalidateQueries({ queryKey: ["projects", projectId, "clashes"] });
    void queryClient.invalidateQueries({ queryKey: clashHistoryKey(projectId, clash.id) });
  };
  const open = clash.status !== "closed";
  const decided = Boolean(clash.decidedAt);
  const refusal = clash.outcome && !decided ? clashDecisionRefusal({ role: list.role, userId: list.userId }, { outcome: clash.outcome, proposerId: clash.proposerId }) : null;
  return (
    <section className="flex flex-col gap-3 rounded-xl border border-board-200 bg-white p-4" aria-label="Selected clash" data-testid="clash-panel">
      <header>
        <h2 className="font-semibold text-board-900">
          {clash.memberId} × {clash.runId} (segment {clash.segmentIndex + 1})
        </h2>
        <p className="text-sm text-board-700">
          {CLASH_KIND_LABELS[clash.kind]}: {clash.kind === "hard" ? "overlap" : "clearance short by"} {(clash.depth * 1000).toFixed(0)} mm (required clearance {(clash.requiredClearance * 1000).toFixed(0)} mm)
          {clash.status === "cleared" ? " · no longer found by the last detection" : ""}
        </p>
        <p className="text-sm text-board-700">
          Member: {clash.envelopeState ? ENVELOPE_STATE_LABELS[clash.envelopeState] : "no results"}
          {clash.maxTension !== null ? ` · max tension ${clash.maxTension.toFixed(1)} kN · max compression ${(clash.maxCompression ?? 0).toFixed(1)} kN` : ""}
          {` · verdict: ${clash.verdict ?? "not reviewed"}`}
        </p>
        {clash.verdict === "idle" ? (
          <p className="text-xs text-board-700" data-testid="clash-idle-patterns">
            {idlePatternsText(list.analysedPatterns)}
          </p>
        ) : null}
        <p className="text-sm text-board-700" data-testid="clash-assignment">
          Assignee: {clash.assignee ?? "nobody"}
          {clash.dueOn ? ` · due ${clash.dueOn}` : ""}
        </p>
        <Standing clash={clash} />
        {clash.recheckReason && (
          <p className="mt-1 rounded border border-compression/50 bg-compression/10 p-2 text-sm text-board-900" data-testid="clash-recheck">
            <strong>Needs another look:</strong> {clash.recheckReason}
          </p>
        )}
        {clash.closedReason && (
          <p className="mt-1 rounded border border-board-200 bg-board-100 p-2 text-sm" data-testid="clash-closed">
            <strong>Closed:</strong> {clash.closedReason}
          </p>
        )}
      </header>
      <p className="rounded-md border border-compression/30 bg-compression/5 px-3 py-2 text-xs text-board-800" data-testid="clash-caution">
        {list.caution}
      </p>
      {open && list.abilities.assign && <AssignForm key={`${clash.id}-assign-${clash.assigneeId}-${clash.dueOn}`} projectId={projectId} clash={clash} team={list.team} onDone={refresh} />}
      {open && list.abilities.propose && !decided && <ProposeForm key={clash.id} projectId={projectId} clash={clash} onDone={refresh} />}
      {open && list.abilities.propose && decided && (
        <p className="text-sm text-board-700" data-testid="propose-blocked">
          A proposal cannot replace this decision; the structural engineer can supersede it, with a reason.
        </p>
      )}
      {open && list.abilities.decide && clash.outcome && !decided && (refusal ? (
        <p className="rounded-md border border-board-200 bg-board-50 p-2 text-sm" data-testid="decide-refusal">
          {refusal}
        </p>
      ) : (
        <DecideForm key={`${clash.id}-decide-${clash.outcome}`} projectId={projectId} clash={clash} onDone={refresh} />
      ))}
      {list.abilities.decide && decided && <SupersedeForm key={`${clash.id}-supersede`} projectId={projectId} clash={clash} onDone={refresh} />}
      {!list.abilities.propose && !list.abilities.decide && <p className="text-sm text-board-700">Your role can follow the clashes; MEP and structural engineers propose, the structural engineer decides.</p>}
      <div>
        <h3 className="text-sm font-medium text-board-800">History</h3>
        <ClashHistory projectId={projectId} clashId={clash.id} />
      </div>
    </section>
  );
}
