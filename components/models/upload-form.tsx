"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { limitHints } from "@/lib/limit-hints";
import { useState, type FormEvent } from "react";
import { StepProgress } from "@/components/jobs/job-progress";
import { Button, FormMessage } from "@/components/ui/form";
import type { Issue } from "@/lib/http/errors";
import { ApiError, apiFetch } from "@/lib/http/fetcher";
import type { CreateRevisionInput } from "@/lib/models/schemas";
import { uploadToStorage } from "@/lib/storage/upload-client";
import { revisionsKey } from "./revision-list";

const contentTypeOf = (file: File) => (file.name.toLowerCase().endsWith(".json") ? "application/json" : "text/csv");

/**
 * Puts the chosen files (one .json model, or .csv tables) into object storage through presigned uploads, each
 * refused at once when too large, and returns the request naming them; the server keeps them byte for byte.
 */
/** The upload's phase and percent for the progress bar (files sent so far), until the server answers. */
type UploadStep = { phase: string; percent?: number };

async function requestFromFiles(projectId: string, files: File[], name: string, onStep: (step: UploadStep) => void): Promise<CreateRevisionInput> {
  const json = files.filter((f) => f.name.toLowerCase().endsWith(".json"));
  const csv = files.filter((f) => f.name.toLowerCase().endsWith(".csv"));
  if (!((json.length === 1 && csv.length === 0) || (csv.length > 0 && json.length === 0))) {
    throw new ApiError(400, "Choose one .json model file, or the .csv tables (nodes, members, sections, supports, loads…).");
  }
  const uploaded = [];
  for (const [k, file] of files.entries()) {
    onStep({ phase: `Uploading ${file.name} (file ${k + 1} of ${files.length})`, percent: Math.round((100 * k) / files.length) });
    uploaded.push(await uploadToStorage<{ attachment: { id: string } }>(projectId, file, { purpose: "model", contentType: contentTypeOf(file) }));
  }
  onStep({ phase: "Checking the model and queuing its analysis" });
  return { kind: "uploadFiles", name: name || (csv.length > 0 ? "Uploaded model" : undefined), attachmentIds: uploaded.map((u) => u.attachment.id) };
}

/** Upload a model file (our JSON format, or CSV tables); every validation problem is listed, nothing saved. */
export function UploadForm({ projectId, onSaved }: { projectId: string; onSaved: (number: number) => void }) {
  const queryClient = useQueryClient();
  const [files, setFiles] = useState<File[]>([]);
  const [name, setName] = useState("");
  const [step, setStep] = useState<UploadStep>({ phase: "Starting the upload" });
  const upload = useMutation({
    mutationFn: async () => {
      const body = await requestFromFiles(projectId, files, name.trim(), setStep);
      return apiFetch<{ revision: { number: number } }>(`/api/projects/${projectId}/models`, { method: "POST", body });
    },
    onSuccess: async ({ revision }) => {
      await queryClient.invalidateQueries({ queryKey: revisionsKey(projectId) });
      onSaved(revision.number);
    },
  });
  const issues: Issue[] = upload.error instanceof ApiError ? upload.error.issues : [];
  const submit = (event: FormEvent) => {
    event.preventDefault();
    upload.mutate();
  };
  return (
    <form onSubmit={submit} className="flex flex-col gap-3" data-testid="upload-form">
      <div className="flex flex-col gap-1">
        <label htmlFor="upload-name" className="text-sm font-medium text-board-800">
          Name (optional for JSON: the model&apos;s own name is used)
        </label>
        <input id="upload-name" value={name} onChange={(e) => setName(e.target.value)} className="rounded-md border border-board-200 bg-white px-3 py-2" />
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor="upload-files" className="text-sm font-medium text-board-800">
          Model file (.json) or CSV tables (.csv, several at once)
        </label>
        <input id="upload-files" type="file" multiple accept=".json,.csv,application/json,text/csv" onChange={(e) => setFiles(Array.from(e.target.files ?? []))} aria-describedby="upload-limits" data-testid="upload-files" />
        <p id="upload-limits" className="text-xs text-board-700" data-testid="upload-limits">
          {limitHints.upload} The files are kept as uploaded.
        </p>
      </div>
      <FormMessage message={upload.error?.message} />
      {upload.isPending ? <StepProgress phase={step.phase} percent={step.percent} /> : null}
      {issues.length > 0 ? (
        <ul className="max-h-64 list-disc overflow-y-auto pl-6 text-sm text-clash" data-testid="upload-problems">
          {issues.map((issue, k) => (
            <li key={k}>
              <span className="font-mono">{issue.path}</span>: {issue.message}
            </li>
          ))}
        </ul>
      ) : null}
      <Button type="submit" disabled={upload.isPending || files.length === 0} data-testid="upload-submit">
        {upload.isPending ? "Checking…" : "Upload, save and analyse"}
      </Button>
    </form>
  );
}
