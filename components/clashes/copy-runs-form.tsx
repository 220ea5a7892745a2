"use client";
// After a model change the new revision has no runs yet: bring them over from an earlier revision (clash ids stay
// the same where the same member and run segment still clash, so threads follow).
import { useMutation } from "@tanstack/react-query";
import { useState } from "react";
import { Button, FormMessage } from "@/components/ui/form";
import { apiFetch } from "@/lib/http/fetcher";

export function CopyRunsForm({ projectId, revision, sources, onCopied }: { projectId: string; revision: number; sources: number[]; onCopied: () => void }) {
  const [from, setFrom] = useState(sources[0]);
  const copy = useMutation({
    mutationFn: () => apiFetch(`/api/projects/${projectId}/clashes`, { method: "POST", body: { revision, copyRunsFrom: from } }),
    onSuccess: onCopied,
  });
  return (
    <div className="flex flex-col gap-2" data-testid="copy-runs">
      <p className="text-sm text-board-700">This revision has no runs yet.</p>
      <div className="flex items-end gap-2">
        <label className="flex flex-col text-sm font-medium text-board-800">
          Bring the runs of revision
          <select className="mt-1 rounded-md border border-board-200 bg-white px-2 py-1.5 font-normal" value={from} onChange={(e) => setFrom(Number(e.target.value))}>
            {sources.map((n) => (
              <option key={n} value={n}>
                {n}
              </option>
            ))}
          </select>
        </label>
        <Button type="button" variant="quiet" onClick={() => copy.mutate()} disabled={copy.isPending} data-testid="copy-runs-submit">
          {copy.isPending ? "Copying…" : "Copy runs and detect clashes"}
        </Button>
      </div>
      <FormMessage message={copy.error?.message} />
    </div>
  );
}
