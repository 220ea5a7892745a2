// zod parsing at the boundary: a failed parse throws a ValidationError (400 with issues).
import type { z } from "zod";
import { findUnstorableText } from "@/lib/text";
import { formatBytes, requestBytes } from "@/lib/limits";
import { NotFoundError, PayloadTooLargeError, ValidationError, issuesFrom } from "./errors";

/**
 * Parses a value with the schema or throws a ValidationError carrying each field's message. Text PostgreSQL cannot
 * store (null characters, unpaired surrogates) and "__proto__" keys are refused first, wherever they are.
 */
export function parseWith<S extends z.ZodType>(schema: S, value: unknown): z.output<S> {
  const unstorable = findUnstorableText(value);
  if (unstorable.length) {
    throw new ValidationError(unstorable.map((p) => ({ path: p.path.map(String).join("."), message: p.message })));
  }
  const result = schema.safeParse(value);
  if (!result.success) throw new ValidationError(issuesFrom(result.error));
  return result.data;
}

/**
 * Reads the request's JSON body and parses it with the schema. A body over `maxBytes` is a 413 before it is read
 * (by its Content-Length) or as soon as the stream passes the cap; a body that is not JSON is a 400.
 */
export async function parseJson<S extends z.ZodType>(request: Request, schema: S, maxBytes: number = requestBytes.json): Promise<z.output<S>> {
  const text = await readText(request, maxBytes);
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    throw new ValidationError([{ path: "", message: "The request body must be JSON." }], "The request body must be JSON.");
  }
  return parseWith(schema, body);
}

async function readText(request: Request, maxBytes: number): Promise<string> {
  const tooLarge = () => new PayloadTooLargeError(`The request is larger than ${formatBytes(maxBytes)}: send less at once.`);
  const declared = Number(request.headers.get("content-length") ?? NaN);
  if (declared > maxBytes) throw tooLarge();
  if (!request.body) return "";
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let received = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    received += value.byteLength;
    if (received > maxBytes) {
      await reader.cancel();
      throw tooLarge();
    }
    chunks.push(value);
  }
  const bytes = new Uint8Array(received);
  let offset = 0;
  for (const chunk of chunks) {
    bytes.set(chunk, offset);
    offset += chunk.byteLength;
  }
  return new TextDecoder().decode(bytes);
}

/**
 * Parses route params (already awaited) with the schema; malformed ids are a 404, not a 400. An id PostgreSQL cannot
 * store (a null character, an unpaired surrogate) can name nothing, so it is a 404 before any query sees it.
 */
export function parseParams<S extends z.ZodType>(schema: S, params: unknown): z.output<S> {
  if (findUnstorableText(params).length) throw new NotFoundError();
  const result = schema.safeParse(params);
  if (!result.success) throw new NotFoundError();
  return result.data;
}
