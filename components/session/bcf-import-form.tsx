"use client";
// Pins and threads from a BCF 3.0 archive: topics not seen before become pins, known topics gain only their new
// comments, so importing the same file twice adds nothing. Any problem in the archive is listed and nothing is stored.
import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { ProblemList, readingLabel } from "@/components/interop/problem-list";
import { Button, FormMessage } from "@/components/ui/form";
import { ApiError, apiUpload } from "@/lib/http/fetcher";

interface BcfImportAnswer {
  pinsCreated: number;
  commentsAdded: number;
  topicsKnown: number;
}

const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? "" : "s"}`;

export function BcfImportForm({ projectId }: { projectId: string }) {
  const router = useRouter();
  const [file, setFile] = useState<File | null>(null);
  const upload = useMutation({
    mutationFn: (chosen: File) => apiUpload<BcfImportAnswer>(`/api/projects/${projectId}/pins/bcf`, chosen),
    // The pin table is rendered on the server.
    onSuccess: () => router.refresh(),
  });
  const submit = (event: FormEvent) => {
    event.preventDefault();
    if (file) upload.mutate(file);
  };
  const issues = upload.error instanceof ApiError ? upload.error.issues.map((i) => ({ where: i.path, message: i.message })) : [];
  const done = upload.data;
  return (
    <form onSubmit={submit} className="flex flex-col gap-2" data-testid="bcf-import-form">
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col text-sm font-medium text-board-800">
          BCF file (.bcf or .bcfzip, BCF 3.0)
          <input
            type="file"
            accept=".bcf,.bcfzip"
            className="mt-1 text-sm font-normal"
            onChange={(e) => {
              setFile(e.target.files?.[0] ?? null);
              upload.reset();
            }}
            data-testid="bcf-import-file"
          />
        </label>
        <Button type="submit" disabled={!file || upload.isPending} data-testid="bcf-import-submit">
          {upload.isPending ? readingLabel(file, "Importing") : "Import topics"}
        </Button>
      </div>
      <p className="text-xs text-board-700">Topics become pins and their comments a thread; a topic already here gains only comments it does not have yet.</p>
      <FormMessage message={upload.error?.message} />
      <ProblemList problems={issues} testId="bcf-import-problems" heading="What to fix in the archive:" />
      {done && (
        <FormMessage
          tone="success"
          testId="bcf-import-done"
          message={`${plural(done.pinsCreated, "topic")} added as pins, ${plural(done.commentsAdded, "comment")} added; ${plural(done.topicsKnown, "topic")} already here${done.pinsCreated + done.commentsAdded === 0 ? " — nothing new in this file" : ""}.`}
        />
      )}
    </form>
  );
}
