"use client";
// Shared notes of the review, typed by everyone at once (Y.Text in the live document). Viewers read them only:
// the server drops their changes, and the field is read-only for them here.
import { useEffect, useState } from "react";
import type * as Y from "yjs";
import { useLiveDocument } from "./use-live-document";

/** Applies the edit between two strings to the Y.Text as one delete and one insert (keeps others' edits). */
function applyDiff(text: Y.Text, before: string, after: string) {
  let start = 0;
  while (start < before.length && start < after.length && before[start] === after[start]) start += 1;
  let endBefore = before.length;
  let endAfter = after.length;
  while (endBefore > start && endAfter > start && before[endBefore - 1] === after[endAfter - 1]) {
    endBefore -= 1;
    endAfter -= 1;
  }
  text.doc?.transact(() => {
    if (endBefore > start) text.delete(start, endBefore - start);
    if (endAfter > start) text.insert(start, after.slice(start, endAfter));
  });
}

export function SessionNotes({ projectId, realtimeUrl, canEdit }: { projectId: string; realtimeUrl: string; canEdit: boolean }) {
  const { doc, status, synced, refusal } = useLiveDocument(projectId, realtimeUrl);
  const [value, setValue] = useState("");

  useEffect(() => {
    if (!doc) return;
    const text = doc.getText("notes");
    const sync = () => setValue(text.toString());
    text.observe(sync);
    sync();
    return () => text.unobserve(sync);
  }, [doc]);

  return (
    <section className="flex flex-col gap-1" aria-label="Session notes">
      <div className="flex items-center justify-between">
        <h3 className="text-xs font-semibold uppercase tracking-wide text-board-700">Session notes</h3>
        <span className="text-xs text-board-600" data-testid="notes-status">
          {refusal ? "last change not saved" : status === "connected" ? (synced ? "saved live" : "syncing…") : status === "connecting" ? "connecting…" : "offline: edits will merge"}
        </span>
      </div>
      {refusal ? (
        <p role="alert" className="rounded-md border border-clash/40 bg-clash/5 p-2 text-xs text-board-900" data-testid="notes-refused">
          {refusal} Copy your last change elsewhere and reload the page; remove older notes to make room.
        </p>
      ) : null}
      <textarea
        className="min-h-24 rounded-md border border-board-200 p-2 text-sm"
        data-testid="session-notes"
        value={value}
        readOnly={!canEdit || !doc || refusal !== null}
        placeholder={canEdit ? "Agenda, actions, who does what…" : "Notes appear here as the team writes them."}
        onChange={(event) => {
          if (!doc) return;
          applyDiff(doc.getText("notes"), value, event.target.value);
        }}
      />
    </section>
  );
}
