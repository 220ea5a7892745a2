"use client";
// Find a member or node by its id: selects it and turns the camera to frame it (issue 17 item 8).
import { useState, type FormEvent } from "react";
import { FIND_MAX_LENGTH, findById } from "./find";
import type { PreparedModel } from "./prepare";
import { useViewerStore } from "./viewer-store";

export function FindBox({ prepared }: { prepared: PreparedModel }) {
  const [query, setQuery] = useState("");
  const [problem, setProblem] = useState<string | null>(null);
  const submit = (event: FormEvent) => {
    event.preventDefault();
    const found = findById(prepared, query);
    if (!found) {
      const typed = query.trim();
      // A pasted page of text is not echoed whole: the message quotes its start.
      const quoted = typed.length > 40 ? `${typed.slice(0, 40)}…` : typed;
      setProblem(typed ? `No member or node called "${quoted}" in this revision.` : "Type a member or node id, e.g. " + (prepared.memberIds[0] ?? "") + ".");
      return;
    }
    setProblem(null);
    const store = useViewerStore.getState();
    if (found.kind === "member") store.selectMember(found.id);
    else store.selectNode(found.id);
    // Frame it with some of the roof around it: at least two typical members across.
    store.frameOn(found.centre, Math.max(found.radius, prepared.unitLength) * 2);
  };
  return (
    <form className="relative flex items-center gap-1 text-xs text-board-700" onSubmit={submit} role="search" aria-label="Find a member or node">
      <label htmlFor="viewer-find">Find</label>
      <span className="flex gap-1">
        <input id="viewer-find" className="w-32 rounded border border-board-200 bg-white px-2 py-1 font-mono text-sm" value={query} maxLength={FIND_MAX_LENGTH} onChange={(e) => setQuery(e.target.value)} placeholder={prepared.memberIds[0]} data-testid="viewer-find" autoComplete="off" />
        <button type="submit" className="rounded border border-board-200 bg-white px-2 py-1 text-sm" data-testid="viewer-find-go">
          Go
        </button>
      </span>
      {problem ? (
        <span role="alert" className="absolute left-0 top-full z-30 mt-1 w-64 max-w-[calc(100vw-2rem)] rounded border border-board-200 bg-white p-1 text-clash shadow-sm" data-testid="viewer-find-problem">
          {problem}
        </span>
      ) : null}
    </form>
  );
}
