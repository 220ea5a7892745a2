"use client";
// Duct, pipe and cable-tray runs from an IFC file: first a preview (count per system, fittings skipped, every
// element not read with its GlobalId and reason; the runs drawn in the viewer), then Confirm stores them. The
// server reads the file both times, so what is stored is exactly what the file holds.
import { useMutation } from "@tanstack/react-query";
import { useEffect, useState, type FormEvent } from "react";
import { ProblemList, readingLabel } from "@/components/interop/problem-list";
import { Button, FormMessage } from "@/components/ui/form";
import { ApiError, apiUpload } from "@/lib/http/fetcher";
import type { Run } from "@/lib/mep/schemas";
import { useRunPreviewStore } from "./run-preview-store";

interface IfcRunsPreview {
  runs: Run[];
  systems: Record<string, number>;
  skipped: { fittings: number };
  problems: { where: string; message: string }[];
}

interface IfcRunsImported {
  imported: string[];
  detection: { found: number; hard: number; clearance: number; cleared: number };
}

export function ImportIfcRunsForm({ projectId, revision, onImported }: { projectId: string; revision: number; onImported: () => void }) {
  const [file, setFile] = useState<File | null>(null);
  const [mode, setMode] = useState<"upsert" | "replace">("upsert");
  const url = (preview: "0" | "1") => `/api/projects/${projectId}/runs/ifc?revision=${revision}&mode=${mode}&preview=${preview}`;
  const preview = useMutation({
    mutationFn: (chosen: File) => apiUpload<IfcRunsPreview>(url("1"), chosen),
    onSuccess: (answer) => useRunPreviewStore.getState().show(answer.runs),
    onError: () => useRunPreviewStore.getState().clear(),
  });
  const confirm = useMutation({
    mutationFn: (chosen: File) => apiUpload<IfcRunsImported>(url("0"), chosen),
    onSuccess: () => {
      useRunPreviewStore.getState().clear();
      preview.reset();
      onImported();
    },
  });
  // The preview leaves the viewer with the form (another revision, another page).
  useEffect(() => () => useRunPreviewStore.getState().clear(), []);

  const read = (event: FormEvent) => {
    event.preventDefault();
    confirm.reset();
    if (file) preview.mutate(file);
  };
  const shown = preview.data;
  const failed = preview.error ?? confirm.error;
  const issues = failed instanceof ApiError ? failed.issues.map((i) => ({ where: i.path, message: i.message })) : [];
  const total = shown?.runs.length ?? 0;
  return (
    <form className="flex flex-col gap-2" onSubmit={read} data-testid="ifc-runs-form">
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col text-sm font-medium text-board-800">
          IFC file (.ifc, IFC2X3 or IFC4)
          <input
            type="file"
            accept=".ifc"
            className="mt-1 text-sm font-normal"
            onChange={(e) => {
              setFile(e.target.files?.[0] ?? null);
              preview.reset();
              confirm.reset();
              useRunPreviewStore.getState().clear();
            }}
            data-testid="ifc-runs-file"
          />
        </label>
        <Button type="submit" variant="quiet" disabled={!file || preview.isPending || confirm.isPending} data-testid="ifc-runs-preview">
          {preview.isPending ? readingLabel(file, "Reading") : "Preview runs"}
        </Button>
      </div>
      <p className="text-xs text-board-700">
        Duct, pipe and cable-tray segments become runs; fittings are skipped and counted. Nothing is stored until you confirm.
      </p>
      <FormMessage message={failed?.message} />
      <ProblemList problems={issues} testId="ifc-runs-errors" heading="What to fix in the file:" />
      {shown && (
        <div className="flex flex-col gap-2 rounded-md border border-board-200 p-3 text-sm" data-testid="ifc-runs-summary">
          <p>
            {total} run{total === 1 ? "" : "s"} read (drawn in the 3D view above); {shown.skipped.fittings} fitting{shown.skipped.fittings === 1 ? "" : "s"} skipped.
          </p>
          <ul className="list-disc pl-5" data-testid="ifc-runs-systems">
            {Object.entries(shown.systems).map(([system, count]) => (
              <li key={system}>
                {system}: {count}
              </li>
            ))}
          </ul>
          <ProblemList problems={shown.problems} testId="ifc-runs-problems" heading={`${shown.problems.length} element${shown.problems.length === 1 ? "" : "s"} not read (GlobalId and reason):`} />
          {shown.problems.length > 0 ? (
            <p className="text-board-700">Fix or remove these elements in the authoring tool and export again; a file with unread elements is not stored.</p>
          ) : total > 0 ? (
            <div className="flex flex-wrap items-end gap-3">
              <label className="flex flex-col text-sm font-medium text-board-800">
                Existing runs
                <select className="mt-1 rounded-md border border-board-200 bg-white px-2 py-1.5 font-normal" value={mode} onChange={(e) => setMode(e.target.value as "upsert" | "replace")}>
                  <option value="upsert">Keep; update runs from the same IFC elements</option>
                  <option value="replace">Replace all runs of this revision</option>
                </select>
              </label>
              <Button type="button" onClick={() => file && confirm.mutate(file)} disabled={confirm.isPending} data-testid="ifc-runs-confirm">
                {confirm.isPending ? "Storing and detecting clashes…" : `Confirm: store ${total} run${total === 1 ? "" : "s"}`}
              </Button>
            </div>
          ) : (
            <p className="text-board-700">The file holds no duct, pipe or cable-tray segments.</p>
          )}
        </div>
      )}
      {confirm.data && (
        <FormMessage
          tone="success"
          testId="ifc-runs-done"
          message={`Stored ${confirm.data.imported.length} run(s). Clashes found: ${confirm.data.detection.found} (${confirm.data.detection.hard} hard, ${confirm.data.detection.clearance} clearance); ${confirm.data.detection.cleared} cleared.`}
        />
      )}
    </form>
  );
}
