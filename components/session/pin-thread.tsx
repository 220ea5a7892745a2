"use client";
// One pin's thread: comments oldest first, a reply box (decisions for the structural engineer) and the
// open / answered / closed state. Its buttons follow the rule book (mayMoveThread), as the server does.
import { useEffect, useState, type FormEvent } from "react";
import { CommentAttachments } from "@/components/files/comment-attachments";
import { Button, FieldError } from "@/components/ui/form";
import { useViewerStore } from "@/components/viewer/viewer-store";
import { apiFetch } from "@/lib/http/fetcher";
import { mayMoveThread } from "@/lib/permissions";
import type { PresentedComment, PresentedPin, PinState, Vec3 } from "@/lib/realtime/events";
import { PinView } from "./pin-view";
import { useSessionStore } from "./session-store";
import { send, type ReviewSocket } from "./use-review-socket";

const EMPTY: PresentedComment[] = [];

export function PinThread({ socket, projectId, pin, position }: { socket: ReviewSocket; projectId: string; pin: PresentedPin; position: Vec3 | null }) {
  const comments = useSessionStore((s) => s.comments[pin.id] ?? EMPTY);
  const abilities = useSessionStore((s) => s.abilities);
  const me = useSessionStore((s) => s.me);
  const asker = me ? { role: me.role, userId: me.id } : null;
  const thread = { state: pin.state, authorId: pin.author.id };
  const [body, setBody] = useState("");
  const [decision, setDecision] = useState(false);
  const [message, setMessage] = useState<string | null>(null);

  useEffect(() => {
    let cancelled = false;
    apiFetch<{ comments: PresentedComment[] }>(`/api/projects/${projectId}/pins/${pin.id}/comments`)
      .then((answer) => !cancelled && useSessionStore.getState().addComments(answer.comments))
      .catch((error: Error) => !cancelled && setMessage(error.message));
    return () => {
      cancelled = true;
    };
  }, [projectId, pin.id]);

  async function handleReply(event: FormEvent) {
    event.preventDefault();
    const ack = await send<PresentedComment>(socket, "comment:create", { id: crypto.randomUUID(), pinId: pin.id, body, kind: decision ? "decision" : "comment" });
    if (!ack.ok) return setMessage(ack.issues?.[0]?.message ?? ack.error);
    useSessionStore.getState().addComments([ack.data]);
    setBody("");
    setDecision(false);
    setMessage(null);
  }

  async function changeState(state: PinState) {
    const ack = await send<PresentedPin>(socket, "pin:set-state", { pinId: pin.id, state });
    if (!ack.ok) return setMessage(ack.error);
    useSessionStore.getState().upsertPins([ack.data]);
    setMessage(null);
  }

  return (
    <section className="flex flex-col gap-2 rounded-md border border-selection/40 p-2" aria-label={`Thread: ${pin.title}`} data-testid="pin-thread">
      <div className="flex items-start justify-between gap-2">
        <h3 className="text-sm font-semibold">{pin.title}</h3>
        <button type="button" className="text-xs underline" onClick={() => useSessionStore.getState().selectPin(null)}>
          close
        </button>
      </div>
      <p className="text-xs text-board-700" data-testid="pin-state">
        {pin.state} · raised by {pin.author.name}
        {position ? (
          <>
            {" · "}
            <button type="button" className="underline" onClick={() => useViewerStore.getState().flyTo(position)}>
              show in the model
            </button>
          </>
        ) : null}
      </p>
      <PinView projectId={projectId} pinId={pin.id} />
      <ol className="flex max-h-64 flex-col gap-2 overflow-y-auto" data-testid="comment-list">
        {comments.map((c) => (
          <li key={c.id} className={`rounded px-2 py-1 text-sm ${c.kind === "decision" ? "border-l-4 border-tension bg-tension/5" : "bg-board-100"}`} data-testid="comment">
            <span className="block text-xs text-board-700">
              {c.author.name}
              {c.kind === "decision" ? " · decision" : ""} · {new Date(c.createdAt).toLocaleString()}
            </span>
            <span className="whitespace-pre-wrap">{c.body}</span>
            <CommentAttachments projectId={projectId} commentId={c.id} canAttach={Boolean(abilities["comment.create"]) && c.author.id === me?.id} />
          </li>
        ))}
      </ol>
      {abilities["comment.create"] ? (
        <form className="flex flex-col gap-1" onSubmit={handleReply}>
          <textarea className="rounded-md border border-board-200 px-2 py-1 text-sm" aria-label="Reply" placeholder="Reply (use @name to ask someone)" value={body} onChange={(e) => setBody(e.target.value)} data-testid="comment-body" />
          {abilities["review.decide"] ? (
            <label className="flex items-center gap-1 text-xs">
              <input type="checkbox" checked={decision} onChange={(e) => setDecision(e.target.checked)} /> record as a decision
            </label>
          ) : null}
          <Button type="submit" data-testid="comment-submit">
            Reply
          </Button>
        </form>
      ) : null}
      <div className="flex flex-wrap gap-1">
        {pin.state !== "answered" && mayMoveThread(asker, thread, "answered") ? (
          <Button variant="quiet" onClick={() => void changeState("answered")} data-testid="pin-mark-answered">
            Mark answered
          </Button>
        ) : null}
        {pin.state !== "closed" && mayMoveThread(asker, thread, "closed") ? (
          <Button variant="quiet" onClick={() => void changeState("closed")} data-testid="pin-close">
            Close thread
          </Button>
        ) : null}
        {pin.state === "closed" && mayMoveThread(asker, thread, "open") ? (
          <Button variant="quiet" onClick={() => void changeState("open")} data-testid="pin-reopen">
            Reopen
          </Button>
        ) : null}
      </div>
      <FieldError message={message ?? undefined} />
    </section>
  );
}
