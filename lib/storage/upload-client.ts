// The browser's side of a presigned upload: ask for a ticket (the declared size is checked at once), put the bytes
// straight into object storage, then have the server check the stored bytes (lib/commands/stored-files.ts).
import { apiFetch } from "@/lib/http/fetcher";
import type { FilePurpose } from "./content-check";

type UploadTicket = { attachmentId: string; uploadUrl: string; method: "PUT"; headers: Record<string, string> };

/** Uploads one file for the project and returns the confirmed attachment's answer. */
export async function uploadToStorage<T>(projectId: string, file: File, ticket: { purpose: FilePurpose; contentType: string; commentId?: string }): Promise<T> {
  const base = `/api/projects/${projectId}/attachments`;
  const granted = await apiFetch<UploadTicket>(base, { method: "POST", body: { ...ticket, filename: file.name, sizeBytes: file.size } });
  const put = await fetch(granted.uploadUrl, { method: granted.method, headers: granted.headers, body: file });
  if (!put.ok) throw new Error(`The file store refused the upload (${put.status}). Try again.`);
  return apiFetch<T>(`${base}/${granted.attachmentId}/confirm`, { method: "POST", body: {} });
}
