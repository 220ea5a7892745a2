"use client";
// Pin a question where you click in 3D (a member, with the point on it, or a node), or on a member, node or clash
// by its id. The payload is checked with the same zod schema the server uses; each problem shows beside its field.
// The form shows only to those the rule book lets pin (abilities["pin.create"]); the server asks it again.
import { useState, type FormEvent } from "react";
import { useClashStore } from "@/components/clashes/clash-store";
import { Button, FormMessage } from "@/components/ui/form";
import { useViewerStore, type PickedThing } from "@/components/viewer/viewer-store";
import { roundToMillimetre } from "@/lib/realtime/anchors";
import { DISCIPLINES, pinCreateSchema, type PresentedPin } from "@/lib/realtime/events";
import { useSessionStore } from "./session-store";
import { send, type ReviewSocket } from "./use-review-socket";

const DISCIPLINE_LABELS = { structural: "Structural", architectural: "Architectural", mep: "MEP", general: "General" } as const;

/** What a pin typed by id hangs on (a pin on a point is placed with a click: PlaceInModel). */
const TYPED_ANCHOR_KINDS = ["member", "node", "clash"] as const;
type TypedAnchorKind = (typeof TYPED_ANCHOR_KINDS)[number];

function initialAnchorId(kind: TypedAnchorKind): string {
  if (kind === "member") return useViewerStore.getState().selectedMemberId ?? "";
  if (kind === "clash") return useClashStore.getState().selectedClashId ?? "";
  return "";
}

export function NewPinForm({ socket, revisionId }: { socket: ReviewSocket; revisionId: string | null }) {
  const selectedMemberId = useViewerStore((s) => s.selectedMemberId);
  const spot = useViewerStore((s) => s.pinSpot);
  const placing = useViewerStore((s) => s.tool === "pin");
  const [kind, setKind] = useState<TypedAnchorKind>("member");
  const [anchorId, setAnchorId] = useState("");
  const [title, setTitle] = useState("");
  const [discipline, setDiscipline] = useState<(typeof DISCIPLINES)[number]>("structural");
  const [body, setBody] = useState("");
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [pending, setPending] = useState(false);

  const effectiveAnchorId = anchorId || (kind === "member" ? (selectedMemberId ?? "") : initialAnchorId(kind));

  async function handleSubmit(event: FormEvent) {
    event.preventDefault();
    const placed = spot && spot !== "missed" ? spot : null;
    const anchor = placed ? { kind: placed.kind, id: placed.id, point: roundToMillimetre(placed.point) } : { kind, id: effectiveAnchorId };
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
    useViewerStore.getState().clearPinSpot();
  }

  return (
    <form className="flex flex-col gap-2 rounded-md border border-board-200 p-2" onSubmit={handleSubmit} data-testid="new-pin-form">
      <h3 className="text-xs font-semibold uppercase tracking-wide text-board-700">Pin a question</h3>
      <PlaceInModel spot={spot} placing={placing} />
      {spot && spot !== "missed" ? null : (
        <div className="flex gap-2">
          <select className="rounded-md border border-board-200 px-2 py-1 text-sm" aria-label="Anchor" value={kind} onChange={(e) => setKind(e.target.value as TypedAnchorKind)} data-testid="pin-anchor-kind">
            {TYPED_ANCHOR_KINDS.map((k) => (
              <option key={k} value={k}>
                {k}
              </option>
            ))}
          </select>
          <input
            className="min-w-0 flex-1 rounded-md border border-board-200 px-2 py-1 text-sm"
            aria-label={`${kind} id`}
            placeholder={kind === "member" ? "select a member or type its id" : `${kind} id`}
            value={effectiveAnchorId}
            onChange={(e) => setAnchorId(e.target.value)}
            data-testid="pin-anchor-id"
          />
        </div>
      )}
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

/** The "place in 3D" mode: the next click on the roof is where the pin goes; a miss says so. */
function PlaceInModel({ spot, placing }: { spot: PickedThing | "missed" | null; placing: boolean }) {
  const store = useViewerStore.getState();
  if (spot && spot !== "missed") {
    return (
      <p className="flex items-center justify-between gap-2 text-sm" data-testid="pin-spot" data-kind={spot.kind} data-id={spot.id}>
        <span>
          On {spot.kind} <span className="font-mono">{spot.id}</span> at {spot.point.map((v) => v.toFixed(2)).join(", ")} m
        </span>
        <button type="button" className="text-xs underline" onClick={() => store.clearPinSpot()} data-testid="pin-spot-clear">
          choose again
        </button>
      </p>
    );
  }
  return (
    <div className="flex flex-col gap-1">
      <Button type="button" variant="quiet" aria-pressed={placing} onClick={() => store.setTool(placing ? "select" : "pin")} data-testid="pin-place">
        {placing ? "Cancel placing" : "Place the pin in 3D"}
      </Button>
      {placing ? (
        <p className="text-xs text-board-700" role="status" data-testid="pin-place-hint">
          {spot === "missed" ? "That click was not on the roof: click on a member or a node." : "Click on a member or a node of the roof."}
        </p>
      ) : null}
    </div>
  );
}

export { DISCIPLINE_LABELS };
