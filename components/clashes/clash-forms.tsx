"use client";
// The forms on a clash, each shown only when the server's abilities and the clash's state allow it: propose an
// outcome, decide the open proposal, supersede a standing decision (with a reason), assign with a due date.
import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation } from "@tanstack/react-query";
import { useForm, useWatch } from "react-hook-form";
import { Button, FieldError, FormMessage, showServerError } from "@/components/ui/form";
import {
  CLASH_OUTCOME_LABELS,
  PROPOSABLE_OUTCOMES,
  assignClashSchema,
  decideClashSchema,
  proposeOutcomeSchema,
  supersedeDecisionSchema,
  type AssignClashInput,
  type DecideClashInput,
  type ProposeOutcomeInput,
  type SupersedeDecisionInput,
} from "@/lib/clash/outcomes";
import { apiFetch } from "@/lib/http/fetcher";
import { ROLE_LABELS } from "@/lib/permissions";
import type { ClashListResponse, ClashRowData } from "./types";

type FormProps = { projectId: string; clash: ClashRowData; onDone: () => void };
const fieldClass = "mt-1 rounded-md border border-board-200 bg-white px-2 py-1.5 font-normal";
const labelClass = "flex flex-col text-sm font-medium text-board-800";

function useClashMutation<T>(url: string, method: "POST" | "PUT", onDone: () => void, onError: (error: unknown) => void) {
  return useMutation({ mutationFn: (body: T) => apiFetch(url, { method, body }), onSuccess: onDone, onError });
}

export function ProposeForm({ projectId, clash, onDone }: FormProps) {
  const form = useForm({ resolver: zodResolver(proposeOutcomeSchema), defaultValues: { outcome: "reroute_run" as ProposeOutcomeInput["outcome"], note: "" } });
  const propose = useClashMutation<ProposeOutcomeInput>(`/api/projects/${projectId}/clashes/${clash.id}/proposal`, "POST", () => {
    form.reset({ outcome: form.getValues("outcome"), note: "" });
    onDone();
  }, (error) => showServerError(form, error));
  const errors = form.formState.errors;
  return (
    <form className="flex flex-col gap-2" onSubmit={form.handleSubmit((values) => propose.mutate(values))} data-testid="propose-form">
      <label className={labelClass}>
        Propose an outcome
        <select className={fieldClass} {...form.register("outcome")} data-testid="propose-outcome">
          {PROPOSABLE_OUTCOMES.map((o) => (
            <option key={o} value={o}>
              {CLASH_OUTCOME_LABELS[o]}
            </option>
          ))}
        </select>
      </label>
      <FieldError message={errors.outcome?.message} />
      <label className={labelClass}>
        Note (optional)
        <textarea className={fieldClass} rows={2} {...form.register("note")} data-testid="propose-note" />
      </label>
      <FieldError message={errors.note?.message} />
      <FormMessage message={errors.root?.message} />
      <Button type="submit" disabled={propose.isPending} data-testid="propose-submit">
        {propose.isPending ? "Saving…" : "Record proposal"}
      </Button>
    </form>
  );
}

/** Decide the open proposal: an opening is accepted with conditions or refused with a reason; others confirmed. */
export function DecideForm({ projectId, clash, onDone }: FormProps) {
  const opening = clash.outcome === "opening_proposed";
  const form = useForm<{ choice: "opening_accepted" | "opening_refused"; text: string }>({ defaultValues: { choice: "opening_accepted", text: "" } });
  const decide = useClashMutation<DecideClashInput>(`/api/projects/${projectId}/clashes/${clash.id}/decision`, "POST", onDone, (error) => showServerError(form, error));
  const submit = form.handleSubmit(({ choice, text }) => {
    const body = opening ? (choice === "opening_accepted" ? { outcome: choice, conditions: text } : { outcome: choice, reason: text }) : { outcome: clash.outcome, note: text };
    const parsed = decideClashSchema.safeParse(body);
    if (!parsed.success) {
      form.setError("text", { message: parsed.error.issues[0]?.message });
      return;
    }
    decide.mutate(parsed.data);
  });
  const choice = useWatch({ control: form.control, name: "choice" });
  const error = form.formState.errors.text?.message;
  return (
    <form className="flex flex-col gap-2 rounded-md border border-board-200 p-3" onSubmit={submit} data-testid="decide-form">
      <p className="text-sm font-medium text-board-800">Decide the proposal</p>
      {opening ? (
        <fieldset className="flex flex-col gap-1 text-sm">
          <legend className="sr-only">Decision on the opening</legend>
          <label className="flex items-center gap-2">
            <input type="radio" value="opening_accepted" {...form.register("choice")} data-testid="decide-accept" /> Accept the opening with these conditions
          </label>
          <label className="flex items-center gap-2">
            <input type="radio" value="opening_refused" {...form.register("choice")} data-testid="decide-refuse" /> Refuse the opening, for this reason
          </label>
        </fieldset>
      ) : (
        <p className="text-sm text-board-700">Confirm “{clash.outcome ? CLASH_OUTCOME_LABELS[clash.outcome] : ""}” as the decision.</p>
      )}
      <label htmlFor="decide-text" className="sr-only">
        {opening ? (choice === "opening_accepted" ? "Conditions" : "Reason") : "Note"}
      </label>
      <textarea
        id="decide-text"
        className="rounded-md border border-board-200 px-2 py-1.5 text-sm aria-invalid:border-clash"
        rows={3}
        aria-invalid={error ? true : undefined}
        placeholder={opening ? (choice === "opening_accepted" ? "Size and position of the opening, reinforcement, checks still to be made…" : "Why the member cannot take an opening…") : "Note (optional)"}
        {...form.register("text")}
        data-testid="decide-text"
      />
      <FieldError message={error} id="decide-text-error" />
      <FormMessage message={form.formState.errors.root?.message} />
      <Button type="submit" disabled={decide.isPending} data-testid="decide-submit">
        {decide.isPending ? "Saving…" : opening ? (choice === "opening_accepted" ? "Accept opening with conditions" : "Refuse the opening") : "Confirm the decision"}
      </Button>
    </form>
  );
}

export function SupersedeForm({ projectId, clash, onDone }: FormProps) {
  const form = useForm<SupersedeDecisionInput>({ resolver: zodResolver(supersedeDecisionSchema), defaultValues: { reason: "" } });
  const supersede = useClashMutation<SupersedeDecisionInput>(`/api/projects/${projectId}/clashes/${clash.id}/supersession`, "POST", onDone, (error) => showServerError(form, error));
  const error = form.formState.errors.reason?.message;
  return (
    <form className="flex flex-col gap-2 rounded-md border border-compression/40 p-3" onSubmit={form.handleSubmit((values) => supersede.mutate(values))} data-testid="supersede-form">
      <label htmlFor="supersede-reason" className="text-sm font-medium text-board-800">
        Supersede this decision (the history keeps both)
      </label>
      <textarea id="supersede-reason" className="rounded-md border border-board-200 px-2 py-1.5 text-sm" rows={2} placeholder="Why the decision no longer holds…" {...form.register("reason")} data-testid="supersede-reason" />
      <FieldError message={error} />
      <FormMessage message={form.formState.errors.root?.message} />
      <Button type="submit" variant="quiet" disabled={supersede.isPending} data-testid="supersede-submit">
        {supersede.isPending ? "Saving…" : "Supersede the decision"}
      </Button>
    </form>
  );
}

export function AssignForm({ projectId, clash, team, onDone }: FormProps & { team: ClashListResponse["team"] }) {
  const form = useForm<{ assigneeId: string; dueOn: string }>({ defaultValues: { assigneeId: clash.assigneeId ?? "", dueOn: clash.dueOn ?? "" } });
  const assign = useClashMutation<AssignClashInput>(`/api/projects/${projectId}/clashes/${clash.id}/assignment`, "PUT", onDone, (error) => showServerError(form, error));
  const submit = form.handleSubmit(({ assigneeId, dueOn }) => {
    const parsed = assignClashSchema.safeParse({ assigneeId: assigneeId || null, dueOn: dueOn || null });
    if (parsed.success) assign.mutate(parsed.data);
    else form.setError("root", { message: parsed.error.issues[0]?.message });
  });
  return (
    <form className="flex flex-wrap items-end gap-2" onSubmit={submit} data-testid="assign-form">
      <label className={labelClass}>
        Assignee
        <select className={fieldClass} {...form.register("assigneeId")} data-testid="assign-assignee">
          <option value="">Nobody</option>
          {team.map((m) => (
            <option key={m.userId} value={m.userId}>
              {m.name} ({ROLE_LABELS[m.role]})
            </option>
          ))}
        </select>
      </label>
      <label className={labelClass}>
        Due
        <input type="date" className={fieldClass} {...form.register("dueOn")} data-testid="assign-due" />
      </label>
      <Button type="submit" variant="quiet" disabled={assign.isPending} data-testid="assign-submit">
        {assign.isPending ? "Saving…" : "Save"}
      </Button>
      <FormMessage message={form.formState.errors.root?.message} />
    </form>
  );
}
