// What a client's message on the Yjs endpoint asks for, read with the same lib0 / y-protocols decoders the Yjs
// server uses (so no spelling of a varint can mean one thing here and another there).
import * as decoding from "lib0/decoding";
import { messageYjsSyncStep1, messageYjsSyncStep2, messageYjsUpdate } from "y-protocols/sync";

/** y-websocket's top-level message types (y-websocket's protocol; y-protocols names only the sync sub-types). */
const MESSAGE_SYNC = 0;

export type ClientMessage =
  /** Sync step 2 or an update: it changes the document; `update` is the Yjs update it carries. */
  | { kind: "change"; update: Uint8Array }
  /** Sync step 1 (a state vector), awareness, or a type the server ignores: it changes nothing. */
  | { kind: "read" }
  /** Cannot be decoded: the server would fail on it too. */
  | { kind: "malformed" };

/** Decodes the message type, the sync type and, for a change, the update it carries. */
export function readClientMessage(message: Uint8Array): ClientMessage {
  try {
    const decoder = decoding.createDecoder(message);
    if (decoding.readVarUint(decoder) !== MESSAGE_SYNC) return { kind: "read" };
    const syncType = decoding.readVarUint(decoder);
    if (syncType === messageYjsSyncStep1) return { kind: "read" };
    if (syncType === messageYjsSyncStep2 || syncType === messageYjsUpdate) return { kind: "change", update: decoding.readVarUint8Array(decoder) };
    return { kind: "malformed" };
  } catch {
    return { kind: "malformed" };
  }
}
