// Pins and threads: every write is committed to PostgreSQL before it is acknowledged or broadcast.
import { requireSameProject } from "@/lib/commands/require-same-project";
import { listCommentsSince } from "@/db/queries/comments";
import { createPin } from "@/lib/commands/create-pin";
import { postComment } from "@/lib/commands/post-comment";
import type { WrittenComment } from "@/lib/commands/write-comment";
import { getPinById, listPinsChangedSince, setPinState } from "@/db/queries/pins";
import { ForbiddenError, NotFoundError } from "@/lib/http/errors";
import { commentCreateSchema, pinCreateSchema, pinSetStateSchema, syncSinceSchema } from "@/lib/realtime/events";
import { authorize, mayMoveThread } from "@/lib/permissions";
import { currentMember } from "./auth";
import { projectRoom, userRoom, type RealtimeServer } from "./context";
import { onEvent, type RealtimeSocket } from "./handle-event";

// Catch-up looks a little further back than the client's last server time: a transaction that began before that
// moment may have committed after it. Clients drop duplicates by id.
const CATCH_UP_MARGIN_MS = 5000;

/** Tells the room about a new comment and each mentioned member about their notification. */
function announceComment(io: RealtimeServer, socketId: string, projectId: string, written: WrittenComment) {
  io.to(projectRoom(projectId)).except(socketId).emit("comment:created", written.comment);
  for (const { userId, notification } of written.notifications) io.to(userRoom(userId)).emit("notification:created", notification);
}

/** Registers the pin and thread events of one socket. */
export function registerPinEvents(io: RealtimeServer, socket: RealtimeSocket): void {
  const { user, projectId } = socket.data;
  const room = projectRoom(projectId);

  onEvent(socket, "pin:create", pinCreateSchema, async (input) => {
    if (!authorize(await currentMember({ projectId, userId: user.id }), "pin.create")) throw new ForbiddenError();
    await requireSameProject(projectId, { revisionId: input.revisionId });
    const result = await createPin({ projectId, authorId: user.id, authorName: user.name, input });
    if (!result) throw new NotFoundError("That pin id is already used elsewhere.");
    if (result.created) {
      io.to(room).except(socket.id).emit("pin:created", result.pin);
      if (result.firstComment) announceComment(io, socket.id, projectId, result.firstComment);
    }
    return result.pin;
  });

  // The command asks the rule book (threadStepRefusal) with the author's membership read in its own transaction, so
  // a member removed a second ago is refused there; asking here first would cost a round trip per comment. The
  // pin's new comment count is not sent as a pin:updated: each client counts the comments it is told of
  // (commentCountOf in the session store), which halves a comment's fan-out.
  onEvent(socket, "comment:create", commentCreateSchema, async (input) => {
    const written = await postComment({ ...input, projectId, authorId: user.id, authorName: user.name });
    if (!written) throw new NotFoundError("No such pin in this project.");
    if (written.created) announceComment(io, socket.id, projectId, written);
    return written.comment;
  });

  onEvent(socket, "pin:set-state", pinSetStateSchema, async ({ pinId, state }) => {
    const member = await currentMember({ projectId, userId: user.id });
    const pin = await getPinById({ projectId, pinId });
    if (!pin) throw new NotFoundError("No such pin in this project.");
    const allowed = mayMoveThread(member, { state: pin.state, authorId: pin.author.id }, state);
    if (!allowed) throw new ForbiddenError();
    const updated = await setPinState({ projectId, pinId, state });
    if (!updated) throw new NotFoundError("No such pin in this project.");
    io.to(room).except(socket.id).emit("pin:updated", updated);
    return updated;
  });

  onEvent(socket, "sync:since", syncSinceSchema, async ({ since }) => {
    const serverTime = new Date().toISOString();
    const from = new Date(new Date(since).getTime() - CATCH_UP_MARGIN_MS);
    const [pins, comments] = await Promise.all([listPinsChangedSince({ projectId, since: from }), listCommentsSince({ projectId, since: from })]);
    return { pins, comments, serverTime };
  });
}
