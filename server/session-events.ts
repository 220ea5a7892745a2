// Review session events: start, hand over, end, the presenter's view, following and cursors.
import { getMembership } from "@/db/queries/memberships";
import { endSession, getLiveSession, handOverSession, startSession } from "@/db/queries/review-sessions";
import { ConflictError, ForbiddenError, NotFoundError } from "@/lib/http/errors";
import {
  cursorMoveSchema,
  presenceFollowSchema,
  sessionEndSchema,
  sessionHandoverSchema,
  sessionStartSchema,
  sessionViewSchema,
} from "@/lib/realtime/events";
import { authorize } from "@/lib/permissions";
import { currentMember } from "./auth";
import { HEARTBEAT_TIMEOUT_MS, tellOtherNodes } from "./cluster";
import type { CursorBatcher } from "./cursor-batcher";
import { projectRoom, type RealtimeServer } from "./context";
import { onEvent, type RealtimeSocket } from "./handle-event";
import { forgetPresenter, presenterOf, rememberView } from "./live-session-state";
import { presenceOf } from "./presence";

async function sendPresence(io: RealtimeServer, projectId: string): Promise<void> {
  const presenterId = await presenterOf(projectId);
  io.to(projectRoom(projectId)).emit("presence", await presenceOf(io, projectId, presenterId));
}

/** Sends the project's presence list to everyone in its room (on every node). */
export async function broadcastPresence(io: RealtimeServer, projectId: string): Promise<void> {
  try {
    await sendPresence(io, projectId);
  } catch {
    // With several nodes, one killed outright is still asked for its sockets until its heartbeats are missed:
    // ask once more after that.
    await new Promise((resolve) => setTimeout(resolve, HEARTBEAT_TIMEOUT_MS + 1000));
    await sendPresence(io, projectId);
  }
}

async function broadcastSession(io: RealtimeServer, projectId: string) {
  forgetPresenter(projectId);
  // Sent before the new state: the other nodes forget theirs before their clients hear of the change.
  tellOtherNodes(io, "session:changed", { projectId });
  const session = await getLiveSession({ projectId });
  io.to(projectRoom(projectId)).emit("session:state", session);
  await broadcastPresence(io, projectId);
  return session;
}

/** Makes this node forget its cached presenter whenever another node changes a session. */
export function followSessionChanges(io: RealtimeServer): void {
  io.on("session:changed", ({ projectId }) => forgetPresenter(projectId));
}

/** Registers the review-session events of one socket. */
export function registerSessionEvents(io: RealtimeServer, socket: RealtimeSocket, cursors: CursorBatcher): void {
  const { user, projectId } = socket.data;
  const room = projectRoom(projectId);

  onEvent(socket, "session:start", sessionStartSchema, async () => {
    if (!authorize(await currentMember({ projectId, userId: user.id }), "session.present")) throw new ForbiddenError();
    const session = await startSession({ projectId, presenterId: user.id });
    if (!session) throw new ConflictError("The session could not be started; try again.");
    if (session.presenterId !== user.id) throw new ConflictError(`${session.presenterName} is presenting; ask them to hand over.`);
    socket.data.following = true;
    return (await broadcastSession(io, projectId)) ?? session;
  });

  onEvent(socket, "session:handover", sessionHandoverSchema, async ({ toUserId }) => {
    const member = await currentMember({ projectId, userId: user.id });
    const presenterId = await presenterOf(projectId);
    if (!presenterId) throw new NotFoundError("No review session is live.");
    if (!authorize(member, "session.steer", { kind: "session", presenterId })) throw new ForbiddenError("Only the presenter or an owner can hand over.");
    const target = await getMembership({ projectId, userId: toUserId });
    if (!target) throw new NotFoundError("That person is not on this project's team.");
    if (!authorize(target, "session.present")) throw new ForbiddenError("That person's role cannot present.");
    const session = await handOverSession({ projectId, toUserId });
    if (!session) throw new NotFoundError("No review session is live.");
    return (await broadcastSession(io, projectId)) ?? session;
  });

  onEvent(socket, "session:end", sessionEndSchema, async () => {
    const member = await currentMember({ projectId, userId: user.id });
    const presenterId = await presenterOf(projectId);
    if (!presenterId) return null;
    if (!authorize(member, "session.steer", { kind: "session", presenterId })) throw new ForbiddenError("Only the presenter or an owner can end the session.");
    await endSession({ projectId });
    await broadcastSession(io, projectId);
    return null;
  });

  onEvent(socket, "session:view", sessionViewSchema, async (view) => {
    const asker = { role: socket.data.role, userId: user.id };
    const drives = async () => authorize(asker, "session.drive", { kind: "session", presenterId: await presenterOf(projectId) });
    // A refusal is checked once more against PostgreSQL: the cached presenter may predate a hand-over made through
    // another node a moment ago.
    let allowed = await drives();
    if (!allowed) {
      forgetPresenter(projectId);
      allowed = await drives();
    }
    if (!allowed) throw new ForbiddenError("Only the presenter drives the view.");
    socket.to(room).emit("session:view", { ...view, presenterId: user.id });
    rememberView(projectId, user.id, view);
    return null;
  });

  onEvent(socket, "presence:follow", presenceFollowSchema, async ({ following }) => {
    socket.data.following = following;
    await broadcastPresence(io, projectId);
    return null;
  });

  onEvent(socket, "cursor:move", cursorMoveSchema, async ({ point, seq }) => {
    cursors.add(projectId, { userId: user.id, socketId: socket.id, point, seq });
    return null;
  });
}
