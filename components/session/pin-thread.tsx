"use client";
// One pin's thread: comments and the steps of its record (proposals, decisions, supersessions) oldest first, a
// reply box and the open / answered / closed state. What the reply may be follows the rule book
// (threadStepRefusal) and the thread's standing (lib/realtime/thread-record.ts), as the server does.
import { useEffect, useState, type FormEvent } from "react";
import { CommentAttachments } from "@/components/files/comment-attachments";
import { Button, FieldError } from "@/components/ui/form";
import { useViewerStore } from "@/components/viewer/viewer-store";
import { apiFetch } from "@/lib/http/fetcher";
import { mayMoveThread } from "@/lib/permissions";
import type { CommentKind, PresentedComment, PresentedPin, PinState, Vec3 } from "@/lib/realtime/events";
import { threadStanding } from "@/lib/realtime/thread-record";
import { ThreadEntry } from "./thread-entry";
import { ThreadReplyKind, replyKindsFor } from "./thread-reply-kind";
import { currentView, PinView } from "./pin-view";
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
  const [kind, setKind] = useState<CommentKind>("comment");
  const [conditions, setConditions] = useState("");
  const [attachView, setAttachView] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const standing = threadStanding(comments);
  const replyKinds = replyKindsFor(asker, standing);
  // A step the thread no longer takes (someone decided meanwhile) falls back to a comment.
  const chosen = replyKinds.allowed.includes(kind) ? kind : "comment";

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
    const withConditions = chosen === "decision" && conditions.trim() ? { conditions } : {};
    const view = attachView ? currentView() : null;
    if (attachView && !view) return setMessage("The 3D view is not ready yet; wait for the model to appear.");
    const ack = await send<PresentedComment>(socket, "comment:create", { id: crypto.randomUUID(), pinId: pin.id, body, kind: chosen, ...withConditions, ...(view ? { viewpoint: view } : {}) });
    if (!ack.ok) return setMessage(ack.issues?.[0]?.message ?? ack.error);
    useSessionStore.getState().addComments([ack.data]);
    setBody("");
    setKind("comment");
    setConditions("");
    setAttachView(false);
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
          <ThreadEntry key={c.id} comment={c} superseded={comments.some((other) => other.supersedesId === c.id)}>
            <CommentAttachments projectId={projectId} commentId={c.id} canAttach={Boolean(abilities["comment.create"]) && c.author.id === me?.id} />
          </ThreadEntry>
        ))}
      </ol>
      {abilities["comment.create"] ? (
        <form className="flex flex-col gap-1" onSubmit={handleReply}>
          <textarea className="rounded-md border border-board-200 px-2 py-1 text-sm" aria-label="Reply" placeholder="Reply (use @name to ask someone)" value={body} onChange={(e) => setBody(e.target.value)} data-testid="comment-body" />
          <ThreadReplyKind kinds={replyKinds} kind={chosen} onKind={setKind} conditions={conditions} onConditions={setConditions} />
          <label className="flex items-center gap-1 text-xs">
            <input type="checkbox" checked={attachView} onChange={(e) => setAttachView(e.target.checked)} data-testid="comment-attach-view" />
            Keep my current view with the reply (camera, result, colouring, section box)
          </label>
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
