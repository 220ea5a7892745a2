// The one fetcher of client components: JSON in and out, errors as ApiError carrying the server's issues.
import type { Issue } from "./errors";

/** An error answer from our API: status, message and per-field issues. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly issues: Issue[] = [],
  ) {
    super(message);
    this.name = "ApiError";
  }
}

/** Calls one of our route handlers; resolves with its JSON body or throws an ApiError. */
export async function apiFetch<T>(url: string, init: { method?: string; body?: unknown } = {}): Promise<T> {
  const response = await fetch(url, {
    method: init.method ?? "GET",
    headers: init.body === undefined ? undefined : { "content-type": "application/json" },
    body: init.body === undefined ? undefined : JSON.stringify(init.body),
    credentials: "same-origin",
  });
  const body = await response.json().catch(() => null);
  if (!response.ok) {
    throw new ApiError(response.status, body?.error ?? `The server answered ${response.status}.`, body?.issues ?? []);
  }
  return body as T;
}

/** Sends a file's bytes as the request body (IFC and BCF imports); resolves with the JSON answer or throws an ApiError. */
export async function apiUpload<T>(url: string, file: Blob): Promise<T> {
  const response = await fetch(url, { method: "POST", headers: { "content-type": "application/octet-stream" }, body: file, credentials: "same-origin" });
  const body = await response.json().catch(() => null);
  if (!response.ok) {
    throw new ApiError(response.status, body?.error ?? `The server answered ${response.status}.`, body?.issues ?? []);
  }
  return body as T;
}

/** Fetches a binary answer of our API (result columns); resolves with its bytes or throws an ApiError. */
export async function apiFetchBytes(url: string): Promise<ArrayBuffer> {
  const response = await fetch(url, { credentials: "same-origin" });
  if (!response.ok) {
    const body = await response.json().catch(() => null);
    throw new ApiError(response.status, body?.error ?? `The server answered ${response.status}.`, body?.issues ?? []);
  }
  return response.arrayBuffer();
}
