"use client";
// A comment's files: images shown small (they open full size), PDFs as links, and, for the comment's author, an
// "Attach" button. The upload goes from the browser straight to object storage through a presigned URL; the server
// then checks the stored bytes and either makes the file visible or deletes it and says why (lib/storage).
import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useId, useState, type ChangeEvent } from "react";
import type { PresentedAttachment } from "@/db/queries/attachments";
import { apiFetch } from "@/lib/http/fetcher";
import { uploadToStorage } from "@/lib/storage/upload-client";

/** Sends one file for a comment: ticket, direct upload, confirmation by the server's content check. */
async function uploadFile(projectId: string, commentId: string, file: File): Promise<PresentedAttachment> {
  const { attachment } = await uploadToStorage<{ attachment: PresentedAttachment }>(projectId, file, { purpose: "comment", commentId, contentType: file.type || "application/octet-stream" });
  return attachment;
}

function size(bytes: number): string {
  return bytes < 1024 * 1024 ? `${Math.max(1, Math.round(bytes / 1024))} kB` : `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}

export function CommentAttachments({ projectId, commentId, canAttach }: { projectId: string; commentId: string; canAttach: boolean }) {
  const queryClient = useQueryClient();
  const inputId = useId();
  const queryKey = ["attachments", projectId, commentId];
  const { data } = useQuery({
    queryKey,
    queryFn: () => apiFetch<{ attachments: PresentedAttachment[] }>(`/api/projects/${projectId}/attachments?commentId=${commentId}`),
  });
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const attachments = data?.attachments ?? [];

  async function handleFile(event: ChangeEvent<HTMLInputElement>) {
    const file = event.target.files?.[0];
    event.target.value = "";
    if (!file) return;
    setBusy(true);
    setMessage(null);
    try {
      await uploadFile(projectId, commentId, file);
      await queryClient.invalidateQueries({ queryKey });
    } catch (error) {
      setMessage(error instanceof Error ? error.message : String(error));
    } finally {
      setBusy(false);
    }
  }

  if (attachments.length === 0 && !canAttach) return null;
  return (
    <div className="mt-1 flex flex-col gap-1" data-testid="comment-attachments">
      {attachments.length > 0 ? (
        <ul className="flex flex-wrap gap-2">
          {attachments.map((a) => {
            const href = `/api/projects/${projectId}/attachments/${a.id}`;
            return (
              <li key={a.id} data-testid="attachment">
                <a href={href} target="_blank" rel="noreferrer" className="flex items-center gap-1 text-xs text-tension underline">
                  {a.contentType.startsWith("image/") ? (
                    // eslint-disable-next-line @next/next/no-img-element -- served by a presigned redirect to object storage, not by next/image
                    <img src={href} alt={a.filename} className="h-16 w-16 rounded border border-board-200 object-cover" data-testid="attachment-image" />
                  ) : null}
                  <span>
                    {a.filename} ({size(a.sizeBytes)})
                  </span>
                </a>
              </li>
            );
          })}
        </ul>
      ) : null}
      {canAttach ? (
        <div>
          <label htmlFor={inputId} className="cursor-pointer text-xs text-board-700 underline">
            {busy ? "Uploading…" : "Attach an image or PDF"}
          </label>
          <input id={inputId} type="file" accept="image/png,image/jpeg,image/webp,application/pdf" className="sr-only" disabled={busy} onChange={handleFile} data-testid="attachment-input" />
        </div>
      ) : null}
      {message ? (
        <p role="alert" className="text-xs text-clash" data-testid="attachment-error">
          {message}
        </p>
      ) : null}
    </div>
  );
}
