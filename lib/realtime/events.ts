// The realtime protocol between the browser (components/session) and the realtime server (server/): every
// payload in either direction has a zod schema here, so client and server share one definition.
import { z } from "zod";
import { ROLES } from "../permissions";
import type { Invalidation } from "./live-events";
import { vec3Schema, type Vec3 } from "./vec3";
import { viewpointSchema } from "./viewpoint";

export const PIN_STATES = ["open", "answered", "closed"] as const;
export type PinState = (typeof PIN_STATES)[number];

export const ANCHOR_KINDS = ["member", "node", "clash", "point"] as const;
export type AnchorKind = (typeof ANCHOR_KINDS)[number];

/** The discipline a pin is raised for: who is expected to answer it. */
export const DISCIPLINES = ["structural", "architectural", "mep", "general"] as const;
export type Discipline = (typeof DISCIPLINES)[number];

/**
 * What a comment of a thread is: a plain comment, or a step of the thread's record (a proposal, a decision, or the
 * supersession of a decision), which is append-only (lib/realtime/thread-record.ts).
 */
export const COMMENT_KINDS = ["comment", "proposal", "decision", "supersession"] as const;
export type CommentKind = (typeof COMMENT_KINDS)[number];

export { vec3Schema, type Vec3 };

const elementId = z.string().trim().min(1).max(120);

/**
 * What a pin hangs on: a member, node or clash by its stable id, or a free point in model space (m). A pin placed
 * with a click in 3D also keeps the point clicked on the member's axis (or the node), so its marker sits there.
 */
export const anchorSchema = z.discriminatedUnion("kind", [
  z.object({ kind: z.literal("member"), id: elementId, point: vec3Schema.optional() }),
  z.object({ kind: z.literal("node"), id: elementId, point: vec3Schema.optional() }),
  z.object({ kind: z.literal("clash"), id: elementId }),
  z.object({ kind: z.literal("point"), point: vec3Schema }),
]);
export type Anchor = z.infer<typeof anchorSchema>;

/** The camera of the presenter: where it is and what it looks at, in model coordinates (m). */
export const cameraPoseSchema = z.object({ position: vec3Schema, target: vec3Schema });
export type CameraPose = z.infer<typeof cameraPoseSchema>;

// ---- client → server ----

export const sessionStartSchema = z.object({}).strict();
export const sessionHandoverSchema = z.object({ toUserId: z.uuid() });
export const sessionEndSchema = z.object({}).strict();

/** The presenter's view; followers apply it. Camera updates are throttled by the sender. */
export const sessionViewSchema = z.object({
  camera: cameraPoseSchema,
  selectedMemberId: elementId.nullable(),
  resultId: elementId.nullable(),
});
export type SessionView = z.infer<typeof sessionViewSchema>;

export const presenceFollowSchema = z.object({ following: z.boolean() });

/** A pointer in model space; seq lets receivers notice gaps. */
export const cursorMoveSchema = z.object({ point: vec3Schema, seq: z.number().int().nonnegative() });

const title = z.string().trim().min(1, "Give the pin a short title.").max(200);
const body = z.string().trim().min(1, "Write something first.").max(10_000);

/** Ids are made by the client so a retried or offline-queued write is applied once. */
export const pinCreateSchema = z.object({
  id: z.uuid(),
  anchor: anchorSchema,
  revisionId: z.uuid().nullable(),
  title,
  discipline: z.enum(DISCIPLINES),
  body: body.optional(),
});
export type PinCreateInput = z.infer<typeof pinCreateSchema>;

/**
 * A comment or a step of the thread's record; a supersession's body is its reason, a decision may carry conditions;
 * any of them may carry the writer's view.
 */
export const commentCreateSchema = z
  .object({
    id: z.uuid(),
    pinId: z.uuid(),
    body,
    kind: z.enum(COMMENT_KINDS).default("comment"),
    conditions: z.string().trim().max(4000).optional(),
    /** The viewer's view when the comment was written, kept with it ("Show this view"). */
    viewpoint: viewpointSchema.optional(),
  })
  .refine((input) => !input.conditions || input.kind === "decision", { path: ["conditions"], message: "Only a decision carries conditions." });
export type CommentCreateInput = z.infer<typeof commentCreateSchema>;

export const pinSetStateSchema = z.object({ pinId: z.uuid(), state: z.enum(PIN_STATES) });

/** Catch-up after a reconnect: everything changed after `since` (ISO time the client last heard from us). */
// PostgreSQL timestamps cannot hold year 0000; anything before 1970 or after 9999 is refused here, not by the database.
export const syncSinceSchema = z.object({
  since: z.iso.datetime({ offset: true }).refine((value) => {
    const time = Date.parse(value);
    return time >= 0 && time < Date.UTC(10_000, 0, 1);
  }, "Give a time between 1970 and 9999."),
});

/** Pin list filters, shared by the socket catch-up and GET /api/projects/[projectId]/pins. */
export const pinFilterSchema = z.object({
  state: z.enum(PIN_STATES).optional(),
  discipline: z.enum(DISCIPLINES).optional(),
  authorId: z.uuid().optional(),
});
export type PinFilter = z.infer<typeof pinFilterSchema>;

// ---- server → client (presented objects) ----

export const presentedUserSchema = z.object({ id: z.uuid(), name: z.string(), role: z.enum(ROLES) });

export const pinSchema = z.object({
  id: z.uuid(),
  projectId: z.uuid(),
  anchor: anchorSchema,
  revisionId: z.uuid().nullable(),
  title: z.string(),
  state: z.enum(PIN_STATES),
  discipline: z.enum(DISCIPLINES),
  author: z.object({ id: z.uuid(), name: z.string() }),
  commentCount: z.number().int(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type PresentedPin = z.infer<typeof pinSchema>;

export const commentSchema = z.object({
  id: z.uuid(),
  pinId: z.uuid(),
  kind: z.enum(COMMENT_KINDS),
  body: z.string(),
  author: z.object({ id: z.uuid(), name: z.string() }),
  mentions: z.array(z.uuid()),
  createdAt: z.string(),
  // The record a step keeps (null on plain comments and imported ones): the author's role then, a decision's
  // conditions, the revision (number) and result set (analysis run) it was judged on, the caution shown, and for a
  // supersession the decision it supersedes.
  role: z.enum(ROLES).nullable(),
  conditions: z.string().nullable(),
  revision: z.number().int().nullable(),
  analysisRunId: z.uuid().nullable(),
  caution: z.string().nullable(),
  supersedesId: z.uuid().nullable(),
  viewpoint: viewpointSchema.nullable(),
});
export type PresentedComment = z.infer<typeof commentSchema>;

export const notificationSchema = z.object({
  id: z.uuid(),
  kind: z.enum(["mention"]),
  payload: z.object({ projectId: z.uuid(), pinId: z.uuid(), commentId: z.uuid(), byName: z.string(), excerpt: z.string() }),
  readAt: z.string().nullable(),
  createdAt: z.string(),
});
export type PresentedNotification = z.infer<typeof notificationSchema>;

export const presenceEntrySchema = presentedUserSchema.extend({
  connections: z.number().int(),
  following: z.boolean(),
  presenting: z.boolean(),
});
export type PresenceEntry = z.infer<typeof presenceEntrySchema>;

export const reviewSessionSchema = z.object({
  id: z.uuid(),
  presenterId: z.uuid(),
  presenterName: z.string(),
  view: sessionViewSchema.nullable(),
  startedAt: z.string(),
});
export type PresentedReviewSession = z.infer<typeof reviewSessionSchema>;

/** One cursor move as relayed to the room. */
export type CursorMove = { userId: string; socketId: string; point: Vec3; seq: number };

/** Every acknowledgement: the created/updated object, or an error shaped like the HTTP API's. */
export type Ack<T> = { ok: true; data: T } | { ok: false; error: string; issues?: { path: string; message: string }[] };

/** Sent on "realtime:error" when an event was refused and the sender gave no acknowledgement callback. */
export type RealtimeError = { event: string; error: string; issues?: { path: string; message: string }[] };

export type Welcome = {
  user: z.infer<typeof presentedUserSchema>;
  abilities: Record<string, boolean>;
  session: PresentedReviewSession | null;
  serverTime: string;
};

export type CatchUp = { pins: PresentedPin[]; comments: PresentedComment[]; serverTime: string };

/** Event names and payloads, typed for socket.io's Server<…> and Socket<…> generics. */
export interface ServerToClientEvents {
  welcome: (welcome: Welcome) => void;
  presence: (entries: PresenceEntry[]) => void;
  "session:state": (session: PresentedReviewSession | null) => void;
  "session:view": (view: SessionView & { presenterId: string }) => void;
  /** Cursor moves of the last few tens of milliseconds, oldest first (including the receiver's own). */
  cursors: (moves: CursorMove[]) => void;
  "pin:created": (pin: PresentedPin) => void;
  "pin:updated": (pin: PresentedPin) => void;
  "comment:created": (comment: PresentedComment) => void;
  "notification:created": (notification: PresentedNotification) => void;
  "realtime:error": (error: RealtimeError) => void;
  /** Something of the project changed through the web app: refetch it (lib/realtime/live-events.ts). */
  "live:invalidate": (invalidation: Invalidation) => void;
  /** The person's role on the project changed: what they may do now (the server already applies it). */
  "access:changed": (access: Pick<Welcome, "user" | "abilities">) => void;
  /** The person was removed from the project; the server closes the connection right after. */
  "access:revoked": (notice: { message: string }) => void;
}

type AckFn<T> = (ack: Ack<T>) => void;

export interface ClientToServerEvents {
  "session:start": (payload: unknown, ack?: AckFn<PresentedReviewSession>) => void;
  "session:handover": (payload: unknown, ack?: AckFn<PresentedReviewSession>) => void;
  "session:end": (payload: unknown, ack?: AckFn<null>) => void;
  "session:view": (payload: unknown, ack?: AckFn<null>) => void;
  "presence:follow": (payload: unknown, ack?: AckFn<null>) => void;
  "cursor:move": (payload: unknown, ack?: AckFn<null>) => void;
  "pin:create": (payload: unknown, ack?: AckFn<PresentedPin>) => void;
  "pin:set-state": (payload: unknown, ack?: AckFn<PresentedPin>) => void;
  "comment:create": (payload: unknown, ack?: AckFn<PresentedComment>) => void;
  "sync:since": (payload: unknown, ack?: AckFn<CatchUp>) => void;
}

/** Every client event, as a value: the hostile-input suite sends bad payloads to each (completeness checked below). */
export const CLIENT_EVENTS = [
  "session:start",
  "session:handover",
  "session:end",
  "session:view",
  "presence:follow",
  "cursor:move",
  "pin:create",
  "pin:set-state",
  "comment:create",
  "sync:since",
] as const satisfies readonly (keyof ClientToServerEvents)[];
// A compile error here means an event of ClientToServerEvents is missing from CLIENT_EVENTS.
export type MissingClientEvents = Exclude<keyof ClientToServerEvents, (typeof CLIENT_EVENTS)[number]>;
export const clientEventsComplete: [MissingClientEvents] extends [never] ? true : never = true;

/** The socket.io path and the Yjs path prefix of the realtime server (one port for both). */
export const SOCKET_PATH = "/socket.io";
export const YJS_PATH_PREFIX = "/yjs/";
/** Close code of the Yjs endpoint for a change the shared notes cannot take (y-websocket does not reconnect after 4400–4499). */
export const DOCUMENT_FULL_CODE = 4413;

/** The Yjs document name of a project's live session. */
export function yjsRoomPath(projectId: string): string {
  return `${YJS_PATH_PREFIX}${projectId}`;
}
