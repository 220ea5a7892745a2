// A job reads the request stored with it when it was queued. A row written by an older Strutroom, or changed by
// hand, may no longer fit the schema: the job then fails saying in plain words what is wrong and what to do, never
// with zod's own dump (a JSON list of issue codes and internal types, which reads as a crash).
import type { z } from "zod";

/** The job's stored request parsed by `schema`; else an Error naming the fields that are wrong and `whatToDo`. */
export function readStoredJobInput<S extends z.ZodType>(schema: S, input: unknown, whatToDo: string): z.output<S> {
  const parsed = schema.safeParse(input);
  if (parsed.success) return parsed.data;
  const named = (issue: z.core.$ZodIssue) => (issue.path.length ? [issue.path.map(String).join(".")] : issue.code === "unrecognized_keys" ? issue.keys.map((key) => `${key} (not expected)`) : ["the request as a whole"]);
  const fields = [...new Set(parsed.error.issues.flatMap(named))];
  throw new Error(`the request stored with this job cannot be read (wrong: ${fields.join(", ")}), so retrying it would fail the same way; ${whatToDo}`);
}
