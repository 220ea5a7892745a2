// One entry of a pin's thread: a comment, or a step of its record with who (and their role then), when, the
// revision it was judged on, the conditions or reason, and the caution shown; a superseded decision says so. Its
// steps are named with the words of a clash's history (CLASH_ENTRY_LABELS): one word for one idea. A comment written
// with the writer's view offers it back with one click.
import type { ReactNode } from "react";
import { CLASH_ENTRY_LABELS } from "@/lib/clash/outcomes";
import { ROLE_LABELS } from "@/lib/permissions";
import type { PresentedComment } from "@/lib/realtime/events";
import { isRecordStep } from "@/lib/realtime/thread-record";
import { restoreView } from "./pin-view";

export function ThreadEntry({ comment: c, superseded, children }: { comment: PresentedComment; superseded: boolean; children?: ReactNode }) {
  const step = isRecordStep(c.kind) ? c.kind : null;
  const accent = c.kind === "decision" ? "border-l-4 border-tension bg-tension/5" : step ? "border-l-4 border-compression bg-board-100" : "bg-board-100";
  return (
    <li className={`rounded px-2 py-1 text-sm ${accent}`} data-testid="comment" data-kind={c.kind}>
      <span className="block text-xs text-board-700">
        {step ? <span className="font-medium">{CLASH_ENTRY_LABELS[step]} · </span> : null}
        {c.author.name}
        {c.role ? ` (${ROLE_LABELS[c.role]})` : ""} · {new Date(c.createdAt).toLocaleString()}
        {step && c.revision !== null ? ` · judged on revision ${c.revision}` : ""}
        {superseded ? <span className="ml-1 rounded bg-board-200 px-1">superseded</span> : null}
      </span>
      <span className="whitespace-pre-wrap">{c.kind === "supersession" ? `Reason: ${c.body}` : c.body}</span>
      {c.conditions ? <span className="block text-board-700" data-testid="comment-conditions-shown">Conditions: {c.conditions}</span> : null}
      {step && step !== "supersession" && c.caution ? <span className="block text-xs text-board-700">Caution shown: {c.caution}</span> : null}
      {c.viewpoint ? (
        <button type="button" className="block text-xs underline" onClick={() => restoreView(c.viewpoint!)} data-testid="comment-view-restore">
          Show this view
        </button>
      ) : null}
      {children}
    </li>
  );
}
