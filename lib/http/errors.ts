// The one error module: error kinds → HTTP status and the message users see. Nothing else is echoed.
import type { ZodError } from "zod";
import { reportedProblems } from "@/lib/limits";

export type Issue = { path: string; message: string };

/** An error the user may see, with its HTTP status and optional per-field issues. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly issues?: Issue[],
  ) {
    super(message);
    this.name = "HttpError";
  }
}

export class UnauthorizedError extends HttpError {
  constructor(message = "Sign in to continue.") {
    super(401, message);
  }
}

export class ForbiddenError extends HttpError {
  constructor(message = "Your role on this project does not allow this.") {
    super(403, message);
  }
}

export class NotFoundError extends HttpError {
  constructor(message = "Not found.") {
    super(404, message);
  }
}

export class ValidationError extends HttpError {
  constructor(issues: Issue[], message = "Some fields need attention.") {
    super(400, message, capIssues(issues));
  }
}

/** The first `reportedProblems` issues and one more line counting the rest, so a huge bad file gets a small answer. */
export function capIssues(issues: Issue[]): Issue[] {
  if (issues.length <= reportedProblems) return issues;
  const rest = issues.length - reportedProblems;
  return [...issues.slice(0, reportedProblems), { path: "", message: `…and ${rest.toLocaleString("en")} more problem${rest === 1 ? "" : "s"} not listed.` }];
}

/** A request body over its route's cap (lib/limits.ts, requestBytes). */
export class PayloadTooLargeError extends HttpError {
  constructor(message: string) {
    super(413, message);
  }
}

/** A request that conflicts with what is stored (duplicate e-mail, last owner, …). */
export class ConflictError extends HttpError {
  constructor(message: string, issues?: Issue[]) {
    super(409, message, issues);
  }
}

/** Something that existed but can no longer be used (an accepted or expired invitation). */
export class GoneError extends HttpError {
  constructor(message: string) {
    super(410, message);
  }
}

/** zod issues as `{ path: "a.b", message }`, the shape forms put beside their fields. */
export function issuesFrom(error: ZodError): Issue[] {
  return error.issues.map((issue) => ({ path: issue.path.map(String).join("."), message: issue.message }));
}

/** PostgreSQL's SQLSTATE of a database error (drizzle wraps the driver's error as its cause). */
function sqlState(error: unknown): string | undefined {
  for (let current = error, depth = 0; current && typeof current === "object" && depth < 3; current = (current as { cause?: unknown }).cause, depth++) {
    const code = (current as { code?: unknown }).code;
    if (typeof code === "string" && /^[0-9A-Z]{5}$/.test(code)) return code;
  }
  return undefined;
}

/** The JSON body and status for any thrown value; unknown errors are logged and answered with a plain 500. */
export function errorBody(error: unknown): { status: number; body: { error: string; issues?: Issue[] } } {
  if (error instanceof HttpError) {
    return { status: error.status, body: error.issues ? { error: error.message, issues: error.issues } : { error: error.message } };
  }
  // A unique violation lost to a concurrent request (two sign-ups with one e-mail): a conflict, not a crash.
  if (sqlState(error) === "23505") {
    console.error("[strutroom] unique violation", error);
    return { status: 409, body: { error: "This already exists: reload and try again." } };
  }
  console.error("[strutroom] unexpected error", error);
  return { status: 500, body: { error: "Something went wrong on our side. Please try again." } };
}

/** A JSON error response `{ error, issues? }` for any thrown value. */
export function jsonError(error: unknown): Response {
  const { status, body } = errorBody(error);
  return Response.json(body, { status });
}

/** Wraps a route handler so every thrown error becomes a JSON error response (never a stack trace). */
export function handleRoute<Context>(handler: (request: Request, context: Context) => Promise<Response>) {
  return async (request: Request, context: Context): Promise<Response> => {
    try {
      return await handler(request, context);
    } catch (error) {
      return jsonError(error);
    }
  };
}
