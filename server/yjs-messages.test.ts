// The Yjs message reader against lib0's varint format (lib0/encoding.js writeVarUint: 7 bits per byte, high bit
// set on every byte but the last), including non-canonical spellings a hostile client can send.
import * as encoding from "lib0/encoding";
import { describe, expect, it } from "vitest";
import { readClientMessage } from "./yjs-messages";

function bytes(prefix: number[], update?: Uint8Array): Uint8Array {
  const encoder = encoding.createEncoder();
  for (const byte of prefix) encoding.writeUint8(encoder, byte);
  if (update) encoding.writeVarUint8Array(encoder, update);
  return encoding.toUint8Array(encoder);
}

const UPDATE = new Uint8Array([1, 2, 3]);

describe("readClientMessage", () => {
  it.each([
    ["update", [0x00, 0x02]],
    ["step 2", [0x00, 0x01]],
    ["update, message type 0x80 0x00", [0x80, 0x00, 0x02]],
    ["step 2, sync type 0x81 0x00", [0x00, 0x81, 0x00]],
    ["update, both padded", [0x80, 0x80, 0x00, 0x82, 0x80, 0x00]],
  ])("reads a change however it is spelled: %s", (_label, prefix) => {
    expect(readClientMessage(bytes(prefix, UPDATE))).toEqual({ kind: "change", update: UPDATE });
  });

  it.each([
    ["sync step 1", [0x00, 0x00]],
    ["sync step 1, padded", [0x80, 0x00, 0x80, 0x00]],
    ["awareness", [0x01]],
    ["query awareness", [0x03]],
  ])("reads %s as a read", (_label, prefix) => {
    expect(readClientMessage(bytes(prefix, UPDATE))).toEqual({ kind: "read" });
  });

  it.each([
    ["empty", []],
    ["unknown sync type", [0x00, 0x07]],
    ["truncated varint", [0x80]],
    ["update with a length past the end", [0x00, 0x02, 0x10, 0x01]],
  ])("reads %s as malformed", (_label, prefix) => {
    expect(readClientMessage(bytes(prefix))).toEqual({ kind: "malformed" });
  });
});
