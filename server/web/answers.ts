// The web process's own answers for what Next.js answers without a body or with its HTML page: every refusal of an
// API address or a server-action call carries the API's error shape `{ error }` with what to do (issue 21 item 7).
// Next writes its 405 (a method a route file does not export) as an empty body, its 404 for an unknown /api address
// as the HTML not-found page, and its server-action refusals as plain text; Node's HTTP parser answers 431 (headers
// over the limit) before Next sees the request. No Next option changes these, so the server that serves Next
// (server/web/main.ts) puts these answers in their place. Route handlers' own JSON answers pass through untouched.
import type { IncomingMessage, ServerResponse } from "node:http";
import type { Duplex } from "node:stream";
import { formatBytes, headerBytes } from "../../lib/limits";

/** Longest part of the request path echoed in a message (the path may be hostile and huge). */
const ECHOED_PATH_CHARS = 120;

function shownPath(url: string | undefined): string {
  const path = (url ?? "/").split("?")[0];
  return path.length > ECHOED_PATH_CHARS ? `${path.slice(0, ECHOED_PATH_CHARS)}…` : path;
}

/** True for requests whose refusals must be JSON: API addresses and server-action calls. */
export function wantsJsonErrors(request: IncomingMessage): boolean {
  return (request.url ?? "").startsWith("/api/") || request.url === "/api" || request.headers["next-action"] !== undefined;
}

/** The message for a refusal Next answered without a JSON body. */
export function refusalMessage(status: number, request: IncomingMessage): string {
  const method = request.method ?? "GET";
  const path = shownPath(request.url);
  if (status >= 500) return "Something went wrong on our side. Please try again.";
  if (request.headers["next-action"] !== undefined) {
    if (status === 413) return "This form sent more than a server action takes: send less, or use the upload form for files.";
    return "This page has no such action, or the call could not be read (the page may be older than the app): reload the page and try again.";
  }
  if (status === 404) return `There is no API address ${path}: check the address (the README lists the API's routes).`;
  if (status === 405) return `${path} does not take ${method} requests: check the method (an OPTIONS request lists the ones it takes in its Allow header).`;
  if (status === 413) return "The request body is larger than this address takes: send a smaller one.";
  if (status === 400) return "The request could not be read: check the address (no broken %-escapes), the method and the body.";
  return `The request was refused (HTTP ${status}): check the address, the method and the body.`;
}

function isJson(contentType: unknown): boolean {
  return typeof contentType === "string" && /json/i.test(contentType);
}

/** The content type in writeHead's optional headers argument (an object or a flat [name, value, …] list). */
function contentTypeIn(headers: unknown): unknown {
  if (Array.isArray(headers)) {
    for (let i = 0; i + 1 < headers.length; i += 2) if (String(headers[i]).toLowerCase() === "content-type") return headers[i + 1];
    return undefined;
  }
  if (headers && typeof headers === "object") {
    for (const [name, value] of Object.entries(headers)) if (name.toLowerCase() === "content-type") return value;
  }
  return undefined;
}

/** Headers of the replaced answer that described the body it replaces. */
const BODY_HEADERS = ["content-type", "content-length", "content-encoding", "transfer-encoding", "etag", "content-disposition", "vary"];

type End = ServerResponse["end"];
type Write = ServerResponse["write"];
type WriteHead = ServerResponse["writeHead"];

/**
 * Makes a refusal (4xx/5xx) of an API address or a server action that is not JSON go out as `{ error }` JSON with
 * the same status. Decided once, when the status line is about to be written (first writeHead, write or end), so
 * the body Next had prepared is dropped unread and never mixed with ours.
 */
export function answerRefusalsInJson(request: IncomingMessage, response: ServerResponse): void {
  if (!wantsJsonErrors(request)) return;
  const writeHead = response.writeHead.bind(response) as (status: number, headers?: unknown) => ServerResponse;
  const write = response.write.bind(response) as (...args: unknown[]) => boolean;
  const end = response.end.bind(response) as (...args: unknown[]) => ServerResponse;
  let decided = false;
  let body: Buffer | null = null;

  function decide(status: number, headers?: unknown) {
    if (decided) return;
    decided = true;
    if (status < 400 || isJson(contentTypeIn(headers) ?? response.getHeader("content-type"))) return;
    body = Buffer.from(JSON.stringify({ error: refusalMessage(status, request) }));
    response.statusCode = status;
    for (const name of BODY_HEADERS) response.removeHeader(name);
    response.setHeader("content-type", "application/json");
    response.setHeader("content-length", body.byteLength);
    response.setHeader("cache-control", "no-store");
  }

  response.writeHead = ((status: number, ...rest: unknown[]) => {
    decide(status, rest.find((arg) => typeof arg === "object"));
    // Replaced: the headers set in decide() stand; those passed here described Next's own body.
    return body ? writeHead(status) : (writeHead as (...args: unknown[]) => ServerResponse)(status, ...rest);
  }) as WriteHead;
  response.write = ((...args: unknown[]) => {
    decide(response.statusCode);
    if (!body) return write(...args);
    const callback = args.find((arg) => typeof arg === "function") as (() => void) | undefined;
    if (callback) queueMicrotask(callback);
    return true;
  }) as Write;
  response.end = ((...args: unknown[]) => {
    decide(response.statusCode);
    if (!body) return end(...args);
    const callback = args.find((arg) => typeof arg === "function");
    return callback ? end(body, callback) : end(body);
  }) as End;
}

/**
 * The answer to a request Node's HTTP parser refused before any handler ran (the server's `clientError` event):
 * headers over `headerBytes` get 431 with the limit and what to do; other unreadable requests a 400; both as JSON.
 */
export function answerClientError(error: Error & { code?: string }, socket: Duplex): void {
  // Node's guidance for clientError: a reset or unwritable socket has nobody to answer.
  if (error.code === "ECONNRESET" || !socket.writable) {
    socket.destroy();
    return;
  }
  const [status, reason, message] =
    error.code === "HPE_HEADER_OVERFLOW"
      ? [431, "Request Header Fields Too Large", `The request headers are larger than ${formatBytes(headerBytes)}: remove some cookies for this site (or sign out and in again) and retry.`]
      : error.code === "ERR_HTTP_REQUEST_TIMEOUT"
        ? [408, "Request Timeout", "The request took too long to arrive: try again."]
        : [400, "Bad Request", "The request could not be read as HTTP: check the client sending it."];
  const body = JSON.stringify({ error: message });
  socket.end(`HTTP/1.1 ${status} ${reason}\r\nContent-Type: application/json\r\nContent-Length: ${Buffer.byteLength(body)}\r\nCache-Control: no-store\r\nConnection: close\r\n\r\n${body}`);
}
