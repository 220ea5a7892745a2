"use client";
// The project's Yjs live document (shared session notes), through y-websocket: the provider is created in an
// effect and destroyed on cleanup; it reconnects with exponential back-off (up to maxBackoffTime) and merges
// edits made while offline when it syncs again.
import { useEffect, useState } from "react";
import { WebsocketProvider } from "y-websocket";
import * as Y from "yjs";
import { DOCUMENT_FULL_CODE, YJS_PATH_PREFIX } from "@/lib/realtime/events";

export type LiveDocumentStatus = "connecting" | "connected" | "disconnected";

/** The live document of the project and its connection status (null doc until the effect has run). */
export function useLiveDocument(projectId: string, realtimeUrl: string) {
  const [state, setState] = useState<{ doc: Y.Doc | null; status: LiveDocumentStatus; synced: boolean; refusal: string | null }>({
    doc: null,
    status: "connecting",
    synced: false,
    refusal: null,
  });

  useEffect(() => {
    const doc = new Y.Doc();
    const base = realtimeUrl.replace(/^http/, "ws") + YJS_PATH_PREFIX.replace(/\/$/, "");
    const provider = new WebsocketProvider(base, projectId, doc, { maxBackoffTime: 10_000 });
    let refusal: string | null = null;
    const update = () => setState({ doc, status: provider.wsconnected ? "connected" : provider.wsconnecting ? "connecting" : "disconnected", synced: provider.synced, refusal });
    // The server closes with DOCUMENT_FULL_CODE and its reason when the notes are full; the provider then stays away.
    provider.on("connection-close", (event) => {
      if (event?.code === DOCUMENT_FULL_CODE) {
        refusal = event.reason || "The shared notes are full: your last change was not stored.";
        update();
      }
    });
    provider.on("status", update);
    provider.on("sync", update);
    update();
    return () => {
      provider.destroy();
      doc.destroy();
    };
  }, [projectId, realtimeUrl]);

  return state;
}
