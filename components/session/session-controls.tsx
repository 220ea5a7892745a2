"use client";
// Start, hand over and end the review session; step out of following and back in.
import { useState } from "react";
import { Button, FieldError } from "@/components/ui/form";
import { authorize, can } from "@/lib/permissions";
import { useSessionStore } from "./session-store";
import { send, type ReviewSocket } from "./use-review-socket";

export function SessionControls({ socket }: { socket: ReviewSocket | null }) {
  const session = useSessionStore((s) => s.session);
  const me = useSessionStore((s) => s.me);
  const abilities = useSessionStore((s) => s.abilities);
  const following = useSessionStore((s) => s.following);
  const presence = useSessionStore((s) => s.presence);
  const [message, setMessage] = useState<string | null>(null);
  if (!socket || !me) return null;

  const presenting = session?.presenterId === me.id;
  const run = async (event: "session:start" | "session:end", payload: unknown = {}) => {
    const ack = await send(socket, event, payload);
    setMessage(ack.ok ? null : ack.error);
  };
  const handOver = async (toUserId: string) => {
    const ack = await send(socket, "session:handover", { toUserId });
    setMessage(ack.ok ? null : ack.error);
  };
  const setFollowing = async (value: boolean) => {
    useSessionStore.getState().setFollowing(value);
    await send(socket, "presence:follow", { following: value });
  };
  // The rule book decides who may steer the session and who may take it over; the server asks the same rules.
  const maySteer = session !== null && authorize({ role: me.role, userId: me.id }, "session.steer", { kind: "session", presenterId: session.presenterId });
  const candidates = presence.filter((p) => p.id !== me.id && p.id !== session?.presenterId && can(p.role, "session.present"));

  return (
    <section className="flex flex-col gap-2" aria-label="Review session">
      <p className="text-sm" data-testid="session-status">
        {session ? (presenting ? "You are presenting." : `${session.presenterName} is presenting.`) : "No review session is live."}
      </p>
      <div className="flex flex-wrap gap-2">
        {!session && abilities["session.present"] ? (
          <Button data-testid="session-start" onClick={() => void run("session:start")}>
            Start presenting
          </Button>
        ) : null}
        {session && !presenting ? (
          following ? (
            <Button variant="quiet" data-testid="session-step-out" onClick={() => void setFollowing(false)}>
              Step out and look around
            </Button>
          ) : (
            <Button data-testid="session-step-in" onClick={() => void setFollowing(true)}>
              Follow the presenter again
            </Button>
          )
        ) : null}
        {maySteer ? (
          <Button variant="quiet" data-testid="session-end" onClick={() => void run("session:end")}>
            End session
          </Button>
        ) : null}
      </div>
      {maySteer && candidates.length > 0 ? (
        <label className="flex items-center gap-2 text-sm">
          Hand over to
          <select
            className="rounded-md border border-board-200 px-2 py-1"
            data-testid="session-handover"
            value=""
            onChange={(event) => event.target.value && void handOver(event.target.value)}
          >
            <option value="">choose…</option>
            {candidates.map((c) => (
              <option key={c.id} value={c.id}>
                {c.name}
              </option>
            ))}
          </select>
        </label>
      ) : null}
      <FieldError message={message ?? undefined} />
    </section>
  );
}
