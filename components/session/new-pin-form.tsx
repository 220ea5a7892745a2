"use client";
// Pin a question on the selected member, a node, a clash or a point. The payload is checked with the same zod
// schema the server uses; each problem shows beside its field.
import { useState, type FormEvent } from "react";
import { useClashStore } from "@/components/clashes/clash-store";
import { Button, FormMessage } from "@/components/ui/form";
import { useViewerStore } from "@/components/viewer/viewer-store";
import { ANCHOR_KINDS, DISCIPLINES, pinCreateSchema, type AnchorKind, type PresentedPin } from "@/lib/realtime/events";
import { useSessionStore } from "./session-store";
import { send, type ReviewSocket } from "./use-review-socket";

const DISCIPLINE_LABELS = { structural: "Structural", architectural: "Architectural", mep: "MEP", general: "General" } as const;

function initialAnchorId(kind: AnchorKind): string {
  if (kind === "member") return useViewerStore.getState().selectedMemberId ?? "";
  if (kind === "clash") return useClashStore.getState().selectedClashId ?? "";
  return "";
}

export function NewPinForm({ socket, revisionId }: { socket: ReviewSocket; revisionId: string | null }) {
  const selectedMemberId = useViewerStore((s) => s.selectedMemberId);
  const [kind, setKind] = useState<AnchorKind>("member");
  const [anchorId, setAnchorId] = useState("");
  const [title, setTitle] = useState("");
  const [discipline, setDiscipline] = useState<(typeof DISCIPLINES)[number]>("structural");
  const [body, setBody] = useState("");
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [pending, setPending] = useState(false);

  const effectiveAnchorId = anchorId || (kind === "member" ? (selectedMemberId ?? "") : initialAnchorId(kind));

  async function handleSubmit(event: FormEvent) {
    event.preventDefault();
    const target = useViewerStore.getState().cameraPose?.target ?? [0, 0, 0];
    const anchor = kind === "point" ? { kind, point: target } : { kind, id: effectiveAnchorId };
    const parsed = pinCreateSchema.safeParse({ id: crypto.randomUUID(), anchor, revisionId, title, discipline, body: body.trim() || undefined });
    if (!parsed.success) {
      setErrors(Object.fromEntries(parsed.error.issues.map((issue) => [issue.path[0] === "anchor" ? "anchor" : String(issue.path[0]), issue.message])));
      return;
    }
    setErrors({});
    setPending(true);
    const ack = await send<PresentedPin>(socket, "pin:create", parsed.data);
    setPending(false);
    if (!ack.ok) {
      setErrors({ root: ack.error, ...Object.fromEntries((ack.issues ?? []).map((i) => [i.path.split(".")[0], i.message])) });
      return;
    }
    useSessionStore.getState().upsertPins([ack.data]);
    useSessionStore.getState().selectPin(ack.data.id);
    setTitle("");
    setBody("");
    setAnchorId("");
  }

  return (
    <form className="flex flex-col gap-2 rounded-md border border-board-200 p-2" onSubmit={handleSubmit} data-testid="new-pin-form">
      <h3 className="text-xs font-semibold uppercase tracking-wide text-board-700">Pin a question</h3>
      <div className="flex gap-2">
        <select className="rounded-md border border-board-200 px-2 py-1 text-sm" aria-label="Anchor" value={kind} onChange={(e) => setKind(e.target.value as AnchorKind)} data-testid="pin-anchor-kind">
          {ANCHOR_KINDS.map((k) => (
            <option key={k} value={k}>
              {k === "point" ? "point (view centre)" : k}
            </option>
          ))}
        </select>
        {kind !== "point" ? (
          <input
            className="min-w-0 flex-1 rounded-md border border-board-200 px-2 py-1 text-sm"
            aria-label={`${kind} id`}
            placeholder={kind === "member" ? "select a member or type its id" : `${kind} id`}
            value={effectiveAnchorId}
            onChange={(e) => setAnchorId(e.target.value)}
            data-testid="pin-anchor-id"
          />
        ) : null}
      </div>
      {errors.anchor ? <p className="text-xs text-clash" role="alert">Choose what the pin hangs on.</p> : null}
      <input className="rounded-md border border-board-200 px-2 py-1 text-sm" aria-label="Title" placeholder="Question, in a line" value={title} onChange={(e) => setTitle(e.target.value)} data-testid="pin-title" />
      {errors.title ? <p className="text-xs text-clash" role="alert">{errors.title}</p> : null}
      <select className="rounded-md border border-board-200 px-2 py-1 text-sm" aria-label="Discipline" value={discipline} onChange={(e) => setDiscipline(e.target.value as typeof discipline)}>
        {DISCIPLINES.map((d) => (
          <option key={d} value={d}>
            {DISCIPLINE_LABELS[d]}
          </option>
        ))}
      </select>
      <textarea className="rounded-md border border-board-200 px-2 py-1 text-sm" aria-label="Details" placeholder="Details (use @name to ask someone)" value={body} onChange={(e) => setBody(e.target.value)} />
      <FormMessage message={errors.root} />
      <Button type="submit" disabled={pending} data-testid="pin-submit">
        {pending ? "Pinning…" : "Pin it"}
      </Button>
    </form>
  );
}

export { DISCIPLINE_LABELS };
