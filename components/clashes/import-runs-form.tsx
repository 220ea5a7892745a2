"use client";
// Import duct and pipe runs from a CSV or JSON file onto the revision; every problem is listed by row and
// nothing is stored until the file is clean.
import { useMutation } from "@tanstack/react-query";
import { limitHints } from "@/lib/limit-hints";
import { useState, type FormEvent } from "react";
import { Button, FormMessage } from "@/components/ui/form";
import type { Issue } from "@/lib/http/errors";
import { ApiError, apiFetch } from "@/lib/http/fetcher";
import { RUN_CSV_COLUMNS } from "@/lib/mep/import";

interface ImportAnswer {
  imported: string[];
  detection: { found: number; hard: number; clearance: number; cleared: number };
}

export function ImportRunsForm({ projectId, revision, onImported }: { projectId: string; revision: number; onImported: () => void }) {
  const [file, setFile] = useState<File | null>(null);
  const [mode, setMode] = useState<"upsert" | "replace">("upsert");
  const [issues, setIssues] = useState<Issue[]>([]);
  const importRuns = useMutation({
    mutationFn: async (chosen: File) =>
      apiFetch<ImportAnswer>(`/api/projects/${projectId}/runs`, { method: "POST", body: { revision, fileName: chosen.name, text: await chosen.text(), mode } }),
    onMutate: () => setIssues([]),
    onSuccess: onImported,
    onError: (error) => setIssues(error instanceof ApiError ? error.issues : []),
  });
  const handleSubmit = (event: FormEvent) => {
    event.preventDefault();
    if (file) importRuns.mutate(file);
  };
  const answer = importRuns.data;
  return (
    <form className="flex flex-col gap-2" onSubmit={handleSubmit} data-testid="import-runs-form">
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col text-sm font-medium text-board-800">
          Runs file (.csv or .json)
          <input type="file" accept=".csv,.json,text/csv,application/json" className="mt-1 text-sm font-normal" onChange={(e) => setFile(e.target.files?.[0] ?? null)} data-testid="import-runs-file" />
        </label>
        <label className="flex flex-col text-sm font-medium text-board-800">
          Existing runs
          <select className="mt-1 rounded-md border border-board-200 bg-white px-2 py-1.5 font-normal" value={mode} onChange={(e) => setMode(e.target.value as "upsert" | "replace")}>
            <option value="upsert">Keep; update runs with the same id</option>
            <option value="replace">Replace all runs of this revision</option>
          </select>
        </label>
        <Button type="submit" disabled={!file || importRuns.isPending} data-testid="import-runs-submit">
          {importRuns.isPending ? "Importing…" : "Import runs"}
        </Button>
      </div>
      <p className="text-xs text-board-700">
        CSV: one row per point, columns <span className="font-mono">{RUN_CSV_COLUMNS.join(", ")}</span> (optional <span className="font-mono">name</span>); lengths in m, weight in kN/m, rotation in degrees. JSON: <span className="font-mono">{'{ "format": "mep-runs/1", "runs": [...] }'}</span>.
      </p>
      <p className="text-xs text-board-700" data-testid="import-runs-limits">
        {limitHints.runsImport}
      </p>
      <FormMessage message={importRuns.error?.message} />
      {issues.length > 0 && (
        <ul className="max-h-48 overflow-y-auto rounded-md border border-clash/30 bg-clash/5 p-2 text-sm text-clash" data-testid="import-runs-problems">
          {issues.map((issue, k) => (
            <li key={k}>
              <span className="font-mono">{issue.path}</span>: {issue.message}
            </li>
          ))}
        </ul>
      )}
      {answer && (
        <FormMessage
          tone="success"
          testId="import-runs-done"
          message={`Imported ${answer.imported.length} run(s). Clashes found: ${answer.detection.found} (${answer.detection.hard} hard, ${answer.detection.clearance} clearance); ${answer.detection.cleared} cleared.`}
        />
      )}
    </form>
  );
}
