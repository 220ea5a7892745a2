"use client";
// Draw a new run in the viewer: choose its height and snap step, click points on the drawing plane, then save it
// as a run (round or rectangular) through the same import endpoint, which validates it and re-runs detection.
import { useMutation } from "@tanstack/react-query";
import { useState, type FormEvent } from "react";
import { Button, FormMessage } from "@/components/ui/form";
import type { Issue } from "@/lib/http/errors";
import { ApiError, apiFetch } from "@/lib/http/fetcher";
import { useRunDraftStore } from "./run-draft-store";

const input = "mt-1 w-24 rounded-md border border-board-200 px-2 py-1 font-normal";

export function DrawRunForm({ projectId, revision, onSaved }: { projectId: string; revision: number; onSaved: () => void }) {
  const draft = useRunDraftStore();
  const [fields, setFields] = useState({ id: "", system: "supply air", shape: "round", diameter: "0.3", width: "0.6", height: "0.3", rotation: "0", insulation: "0", clearance: "0.05", weightPerMetre: "0.3", z: "1.0", snap: "0.5" });
  const [issues, setIssues] = useState<Issue[]>([]);
  const set = (key: keyof typeof fields) => (e: { target: { value: string } }) => setFields({ ...fields, [key]: e.target.value });
  const save = useMutation({
    mutationFn: () => {
      const profile = fields.shape === "round" ? { shape: "round", diameter: Number(fields.diameter) } : { shape: "rectangular", width: Number(fields.width), height: Number(fields.height), rotation: Number(fields.rotation) };
      const run = { id: fields.id, system: fields.system, profile, insulation: Number(fields.insulation), clearance: Number(fields.clearance), weightPerMetre: Number(fields.weightPerMetre), points: draft.points };
      return apiFetch(`/api/projects/${projectId}/runs`, { method: "POST", body: { revision, fileName: "drawn-run.json", text: JSON.stringify({ format: "mep-runs/1", runs: [run] }), mode: "upsert" } });
    },
    onMutate: () => setIssues([]),
    onSuccess: () => {
      useRunDraftStore.getState().stop();
      onSaved();
    },
    onError: (error) => setIssues(error instanceof ApiError ? error.issues : []),
  });
  const handleSubmit = (event: FormEvent) => {
    event.preventDefault();
    save.mutate();
  };
  return (
    <form className="flex flex-col gap-2 text-sm" onSubmit={handleSubmit} data-testid="draw-run-form">
      <div className="flex flex-wrap gap-2">
        <label className="flex flex-col font-medium">Run id<input className={input} value={fields.id} onChange={set("id")} data-testid="draw-run-id" /></label>
        <label className="flex flex-col font-medium">System<input className="mt-1 w-32 rounded-md border border-board-200 px-2 py-1 font-normal" value={fields.system} onChange={set("system")} /></label>
        <label className="flex flex-col font-medium">
          Section
          <select className="mt-1 rounded-md border border-board-200 bg-white px-2 py-1 font-normal" value={fields.shape} onChange={set("shape")}>
            <option value="round">Round</option>
            <option value="rectangular">Rectangular</option>
          </select>
        </label>
        {fields.shape === "round" ? (
          <label className="flex flex-col font-medium">Diameter (m)<input className={input} value={fields.diameter} onChange={set("diameter")} /></label>
        ) : (
          <>
            <label className="flex flex-col font-medium">Width (m)<input className={input} value={fields.width} onChange={set("width")} /></label>
            <label className="flex flex-col font-medium">Height (m)<input className={input} value={fields.height} onChange={set("height")} /></label>
            <label className="flex flex-col font-medium">Rotation (°)<input className={input} value={fields.rotation} onChange={set("rotation")} /></label>
          </>
        )}
        <label className="flex flex-col font-medium">Insulation (m)<input className={input} value={fields.insulation} onChange={set("insulation")} /></label>
        <label className="flex flex-col font-medium">Clearance (m)<input className={input} value={fields.clearance} onChange={set("clearance")} /></label>
        <label className="flex flex-col font-medium">Weight (kN/m)<input className={input} value={fields.weightPerMetre} onChange={set("weightPerMetre")} /></label>
      </div>
      <div className="flex flex-wrap items-end gap-2">
        <label className="flex flex-col font-medium">Centreline height z (m)<input className={input} value={fields.z} onChange={set("z")} disabled={draft.active} /></label>
        <label className="flex flex-col font-medium">Snap to (m)<input className={input} value={fields.snap} onChange={set("snap")} disabled={draft.active} /></label>
        {draft.active ? (
          <>
            <Button type="button" variant="quiet" onClick={draft.undo} disabled={draft.points.length === 0}>Undo point</Button>
            <Button type="button" variant="quiet" onClick={draft.stop}>Cancel</Button>
            <Button type="submit" disabled={draft.points.length < 2 || save.isPending} data-testid="draw-run-save">{save.isPending ? "Saving…" : "Save run"}</Button>
          </>
        ) : (
          <Button type="button" variant="quiet" onClick={() => draft.start(Number(fields.z) || 0, Math.max(0, Number(fields.snap) || 0))} data-testid="draw-run-start">
            Start drawing
          </Button>
        )}
      </div>
      {draft.active && <p className="text-board-700" data-testid="draw-run-points">Click in the 3D view to add points ({draft.points.length} so far).</p>}
      <FormMessage message={save.error?.message} />
      {issues.length > 0 && (
        <ul className="rounded-md border border-clash/30 bg-clash/5 p-2 text-clash">
          {issues.map((issue, k) => (
            <li key={k}><span className="font-mono">{issue.path}</span>: {issue.message}</li>
          ))}
        </ul>
      )}
    </form>
  );
}
