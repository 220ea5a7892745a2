"use client";
// The selected clash: what it is, the member's forces and verdict, the decision history, and the forms the
// caller's role allows (propose an outcome; accept a proposed opening with written conditions). The standing
// caution is always shown.
import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useForm } from "react-hook-form";
import { Button, FieldError, FormMessage, showServerError } from "@/components/ui/form";
import { FORCE_STATE_LABELS } from "@/lib/clash/member-state";
import { CLASH_KIND_LABELS, CLASH_OUTCOME_LABELS, PROPOSABLE_OUTCOMES, acceptOpeningSchema, proposeOutcomeSchema, type AcceptOpeningInput, type ClashOutcome } from "@/lib/clash/outcomes";
import { apiFetch } from "@/lib/http/fetcher";
import type { ClashListResponse, ClashRowData } from "./types";

interface DecisionHistory {
  decisions: { id: string; outcome: ClashOutcome; note: string; conditions: string | null; caution: string; decidedBy: string | null; createdAt: string }[];
}

const when = (iso: string | null) => (iso ? new Date(iso).toLocaleString() : "");

function ProposeForm({ projectId, clash, onDone }: { projectId: string; clash: ClashRowData; onDone: () => void }) {
  const form = useForm({ resolver: zodResolver(proposeOutcomeSchema), defaultValues: { outcome: (clash.outcome && clash.outcome !== "opening_accepted" ? clash.outcome : "reroute_run") as (typeof PROPOSABLE_OUTCOMES)[number], note: "" } });
  const propose = useMutation({
    mutationFn: (body: { outcome: string; note: string }) => apiFetch(`/api/projects/${projectId}/clashes/${clash.id}/proposal`, { method: "POST", body }),
    onSuccess: () => {
      form.reset({ outcome: form.getValues("outcome"), note: "" });
      onDone();
    },
    onError: (error) => showServerError(form, error),
  });
  const errors = form.formState.errors;
  return (
    <form className="flex flex-col gap-2" onSubmit={form.handleSubmit((values) => propose.mutate(values))} data-testid="propose-form">
      <label className="flex flex-col text-sm font-medium text-board-800">
        Propose an outcome
        <select className="mt-1 rounded-md border border-board-200 bg-white px-2 py-1.5 font-normal" {...form.register("outcome")} data-testid="propose-outcome">
          {PROPOSABLE_OUTCOMES.map((o) => (
            <option key={o} value={o}>
              {CLASH_OUTCOME_LABELS[o]}
            </option>
          ))}
        </select>
      </label>
      <FieldError message={errors.outcome?.message} />
      <label className="flex flex-col text-sm font-medium text-board-800">
        Note (optional)
        <textarea className="mt-1 rounded-md border border-board-200 px-2 py-1.5 font-normal" rows={2} {...form.register("note")} data-testid="propose-note" />
      </label>
      <FieldError message={errors.note?.message} />
      <FormMessage message={errors.root?.message} />
      <Button type="submit" disabled={propose.isPending} data-testid="propose-submit">
        {propose.isPending ? "Saving…" : "Record proposal"}
      </Button>
    </form>
  );
}

function AcceptForm({ projectId, clash, onDone }: { projectId: string; clash: ClashRowData; onDone: () => void }) {
  const form = useForm<AcceptOpeningInput>({ resolver: zodResolver(acceptOpeningSchema), defaultValues: { conditions: "" } });
  const accept = useMutation({
    mutationFn: (body: AcceptOpeningInput) => apiFetch(`/api/projects/${projectId}/clashes/${clash.id}/acceptance`, { method: "POST", body }),
    onSuccess: onDone,
    onError: (error) => showServerError(form, error),
  });
  const error = form.formState.errors.conditions?.message;
  return (
    <form className="flex flex-col gap-2 rounded-md border border-board-200 p-3" onSubmit={form.handleSubmit((values) => accept.mutate(values))} data-testid="accept-form">
      <label htmlFor="accept-conditions" className="text-sm font-medium text-board-800">
        Accept the opening with these conditions
      </label>
      <textarea
        id="accept-conditions"
        className="rounded-md border border-board-200 px-2 py-1.5 text-sm aria-invalid:border-clash"
        rows={3}
        aria-invalid={error ? true : undefined}
        placeholder="Size and position of the opening, reinforcement, checks still to be made…"
        {...form.register("conditions")}
        data-testid="accept-conditions"
      />
      <FieldError message={error ?? undefined} id="accept-conditions-error" />
      <FormMessage message={form.formState.errors.root?.message} />
      <Button type="submit" disabled={accept.isPending} data-testid="accept-submit">
        {accept.isPending ? "Saving…" : "Accept opening with conditions"}
      </Button>
    </form>
  );
}

export function DecisionPanel({ projectId, clash, list }: { projectId: string; clash: ClashRowData; list: ClashListResponse }) {
  const queryClient = useQueryClient();
  const historyKey = ["projects", projectId, "clash", clash.id] as const;
  const history = useQuery({ queryKey: historyKey, queryFn: () => apiFetch<DecisionHistory>(`/api/projects/${projectId}/clashes/${clash.id}`) });
  const refresh = () => {
    void queryClient.invalidateQueries({ queryKey: ["projects", projectId, "clashes"] });
    void queryClient.invalidateQueries({ queryKey: historyKey });
  };
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
          Member: {clash.forceState ? FORCE_STATE_LABELS[clash.forceState] : "no results"}
          {clash.maxTension !== null ? ` · max tension ${clash.maxTension.toFixed(1)} kN · max compression ${(clash.maxCompression ?? 0).toFixed(1)} kN` : ""}
          {` · verdict: ${clash.verdict ?? "not reviewed"}`}
        </p>
        <p className="mt-1 text-sm" data-testid="clash-outcome">
          Outcome: <strong>{clash.outcome ? CLASH_OUTCOME_LABELS[clash.outcome as ClashOutcome] : "undecided"}</strong>
          {clash.proposedBy ? ` · proposed by ${clash.proposedBy}, ${when(clash.proposedAt)}` : ""}
          {clash.decidedBy ? ` · accepted by ${clash.decidedBy}, ${when(clash.decidedAt)}` : ""}
        </p>
        {clash.conditions && (
          <p className="mt-1 rounded bg-board-50 p-2 text-sm" data-testid="clash-conditions">
            Conditions: {clash.conditions}
          </p>
        )}
      </header>
      <p className="rounded-md border border-compression/30 bg-compression/5 px-3 py-2 text-xs text-board-800" data-testid="clash-caution">
        {list.caution}
      </p>
      {list.abilities.propose && <ProposeForm key={clash.id} projectId={projectId} clash={clash} onDone={refresh} />}
      {list.abilities.acceptOpening && clash.outcome === "opening_proposed" && <AcceptForm key={`${clash.id}-accept`} projectId={projectId} clash={clash} onDone={refresh} />}
      {!list.abilities.propose && !list.abilities.acceptOpening && <p className="text-sm text-board-700">Your role can follow the clashes; MEP and structural engineers decide them.</p>}
      <div>
        <h3 className="text-sm font-medium text-board-800">History</h3>
        {history.isPending ? (
          <p className="text-sm text-board-700">Loading…</p>
        ) : (history.data?.decisions.length ?? 0) === 0 ? (
          <p className="text-sm text-board-700">No decision yet.</p>
        ) : (
          <ol className="mt-1 flex flex-col gap-1 text-sm" data-testid="clash-history">
            {history.data?.decisions.map((d) => (
              <li key={d.id} className="border-l-2 border-board-200 pl-2">
                <span className="font-medium">{CLASH_OUTCOME_LABELS[d.outcome]}</span> · {d.decidedBy ?? "someone who left"} · {when(d.createdAt)}
                {d.note && <span className="block text-board-700">{d.note}</span>}
                {d.conditions && <span className="block text-board-700">Conditions: {d.conditions}</span>}
              </li>
            ))}
          </ol>
        )}
      </div>
    </section>
  );
}
