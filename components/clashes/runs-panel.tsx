"use client";
// The revision's runs: what each is, with editing (its fields as JSON, checked by the server's run schema) and
// removal. Every change re-runs clash detection on the server.
import { useMutation } from "@tanstack/react-query";
import { useState } from "react";
import { Button, FormMessage } from "@/components/ui/form";
import type { RunView } from "@/db/queries/mep";
import type { Issue } from "@/lib/http/errors";
import { ApiError, apiFetch } from "@/lib/http/fetcher";

const length = (run: RunView) => run.points.slice(1).reduce((s, p, k) => s + Math.hypot(p.x - run.points[k].x, p.y - run.points[k].y, p.z - run.points[k].z), 0);
const section = (run: RunView) =>
  run.profile.shape === "round" ? `⌀${(run.profile.diameter * 1000).toFixed(0)}` : `${(run.profile.width * 1000).toFixed(0)}×${(run.profile.height * 1000).toFixed(0)} @${run.profile.rotation}°`;

function RunEditor({ projectId, revision, run, onDone }: { projectId: string; revision: number; run: RunView; onDone: () => void }) {
  // Everything but the id (clash ids depend on it) and the timestamp can be edited.
  const [text, setText] = useState(() => JSON.stringify({ name: run.name, system: run.system, profile: run.profile, insulation: run.insulation, clearance: run.clearance, weightPerMetre: run.weightPerMetre, points: run.points }, null, 1));
  const [issues, setIssues] = useState<Issue[]>([]);
  const save = useMutation({
    mutationFn: () => {
      let body: unknown;
      try {
        body = JSON.parse(text);
      } catch {
        throw new ApiError(400, "That is not valid JSON.");
      }
      return apiFetch(`/api/projects/${projectId}/runs/${run.id}`, { method: "PATCH", body: { ...(body as object), revision } });
    },
    onMutate: () => setIssues([]),
    onSuccess: onDone,
    onError: (error) => setIssues(error instanceof ApiError ? error.issues : []),
  });
  return (
    <div className="flex flex-col gap-2">
      <textarea className="h-48 rounded-md border border-board-200 p-2 font-mono text-xs" value={text} onChange={(e) => setText(e.target.value)} aria-label={`Run ${run.id} as JSON`} data-testid="run-editor" />
      <FormMessage message={save.error?.message} />
      {issues.map((issue, k) => (
        <p key={k} className="text-xs text-clash"><span className="font-mono">{issue.path}</span>: {issue.message}</p>
      ))}
      <Button type="button" onClick={() => save.mutate()} disabled={save.isPending} data-testid="run-editor-save">{save.isPending ? "Saving…" : "Save and re-detect"}</Button>
    </div>
  );
}

export function RunsPanel({ projectId, revision, runs, canEdit, onChanged }: { projectId: string; revision: number; runs: RunView[]; canEdit: boolean; onChanged: () => void }) {
  const [editing, setEditing] = useState<string | null>(null);
  const remove = useMutation({ mutationFn: (id: string) => apiFetch(`/api/projects/${projectId}/runs/${id}?revision=${revision}`, { method: "DELETE" }), onSuccess: onChanged });
  if (runs.length === 0) return <p className="text-sm text-board-700">No runs on this revision yet.</p>;
  return (
    <ul className="flex flex-col divide-y divide-board-200 text-sm" data-testid="runs-list">
      {runs.map((run) => (
        <li key={run.id} className="py-2">
          <div className="flex flex-wrap items-center gap-2">
            <span className="font-mono font-medium">{run.id}</span>
            <span>{run.system}</span>
            <span className="text-board-700">
              {section(run)} mm · {length(run).toFixed(1)} m · {run.weightPerMetre} kN/m · clearance {(run.clearance * 1000).toFixed(0)} mm
            </span>
            {canEdit && (
              <span className="ml-auto flex gap-2">
                <button type="button" className="text-xs text-tension underline" onClick={() => setEditing(editing === run.id ? null : run.id)}>{editing === run.id ? "Close" : "Edit"}</button>
                <button type="button" className="text-xs text-clash underline" onClick={() => window.confirm(`Remove run ${run.id}? Its clashes stay on record as cleared.`) && remove.mutate(run.id)}>Remove</button>
              </span>
            )}
          </div>
          {editing === run.id && (
            <RunEditor
              projectId={projectId}
              revision={revision}
              run={run}
              onDone={() => {
                setEditing(null);
                onChanged();
              }}
            />
          )}
        </li>
      ))}
    </ul>
  );
}
