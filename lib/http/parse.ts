// zod parsing at the boundary: a failed parse throws a ValidationError (400 with issues).
import type { z } from "zod";
import { findUnstorableText } from "@/lib/text";
import { NotFoundError, ValidationError, issuesFrom } from "./errors";

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

/** Reads the request's JSON body and parses it with the schema; a body that is not JSON is a 400. */
export async function parseJson<S extends z.ZodType>(request: Request, schema: S): Promise<z.output<S>> {
  let body: unknown;
  try {
    body = await request.json();
  } catch {
    throw new ValidationError([{ path: "", message: "The request body must be JSON." }], "The request body must be JSON.");
  }
  return parseWith(schema, body);
}

/** Parses route params (already awaited) with the schema; malformed ids are a 404, not a 400. */
export function parseParams<S extends z.ZodType>(schema: S, params: unknown): z.output<S> {
  const result = schema.safeParse(params);
  if (!result.success) throw new NotFoundError();
  return result.data;
}
