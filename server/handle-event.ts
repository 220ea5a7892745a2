// One wrapper for every socket event: zod parse, the handler, then an acknowledgement or a "realtime:error"
// event. Nothing a client sends can throw past this point, so a bad payload never crashes the server.
import type { Socket } from "socket.io";
import type { z } from "zod";
import { errorBody, issuesFrom } from "@/lib/http/errors";
import { formatBytes, realtime } from "@/lib/limits";
import { findUnstorableText } from "@/lib/text";
import type { Ack, ClientToServerEvents, ServerToClientEvents } from "@/lib/realtime/events";
import type { SocketData } from "./context";

export type RealtimeSocket = Socket<ClientToServerEvents, ServerToClientEvents, Record<string, never>, SocketData>;

type EventName = keyof ClientToServerEvents;

function reply<T>(socket: RealtimeSocket, event: EventName, ack: unknown, result: Ack<T>) {
  if (typeof ack === "function") {
    ack(result);
  } else if (!result.ok) {
    socket.emit("realtime:error", { event, error: result.error, ...(result.issues ? { issues: result.issues } : {}) });
  }
}

/** Registers a handler whose payload is parsed with the schema; thrown HttpErrors become error replies. */
export function onEvent<S extends z.ZodType, T>(
  socket: RealtimeSocket,
  event: EventName,
  schema: S,
  handler: (payload: z.output<S>) => Promise<T>,
) {
  // socket.io's typed `on` cannot express one generic listener for several events; the payload is unknown anyway.
  (socket.on as (event: string, listener: (payload: unknown, ack?: unknown) => void) => void)(event, (payload, ack) => {
    const size = JSON.stringify(payload ?? null).length;
    if (size > realtime.socketPayloadBytes) {
      const error = `The message is ${formatBytes(size)}; messages are at most ${formatBytes(realtime.socketPayloadBytes)}.`;
      reply(socket, event, ack, { ok: false, error });
      return;
    }
    const unstorable = findUnstorableText(payload);
    if (unstorable.length) {
      const issues = unstorable.map((p) => ({ path: p.path.map(String).join("."), message: p.message }));
      reply(socket, event, ack, { ok: false, error: unstorable[0].message, issues });
      return;
    }
    const parsed = schema.safeParse(payload);
    if (!parsed.success) {
      reply(socket, event, ack, { ok: false, error: "The message was not understood.", issues: issuesFrom(parsed.error) });
      return;
    }
    handler(parsed.data).then(
      (data) => reply(socket, event, ack, { ok: true, data }),
      (error: unknown) => {
        const { body } = errorBody(error);
        reply(socket, event, ack, { ok: false, error: body.error, ...(body.issues ? { issues: body.issues } : {}) });
      },
    );
  });
}
