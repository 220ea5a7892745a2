import "server-only";
import { z } from "zod";
import { getSessionUser, type SessionUser } from "@/lib/auth/session";
import { requireProjectRole, requireUser } from "@/lib/auth/guard";
import type { Membership } from "@/db/schema";
import type { Action } from "@/lib/permissions";
import { errorBody, type Issue } from "./errors";
import { parseParams, parseWith } from "./parse";

const projectIdSchema = z.object({ projectId: z.uuid() });

/** What every server action returns: never a thrown error or a stack trace. */
export type ActionResult<T> = { ok: true; data: T } | { ok: false; error: string; issues?: Issue[] };

function toInput(raw: unknown): unknown {
  return raw instanceof FormData ? Object.fromEntries(raw.entries()) : raw;
}

/**
 * The one server-action wrapper: session, then (when `action` is given) membership and permission on the input's
 * projectId (an unknown or malformed id is "not found"), then the zod parse, then the body. Errors become `{ ok: false, error, issues? }`.
 */
export function serverAction<S extends z.ZodType, T>(
  options: { schema: S; action?: Action },
  body: (input: z.output<S>, context: { user: SessionUser; membership: Membership | null }) => Promise<T>,
): (raw: unknown) => Promise<ActionResult<T>> {
  return async (raw) => {
    try {
      const user = requireUser(await getSessionUser());
      const values = toInput(raw);
      let membership: Membership | null = null;
      if (options.action) {
        const { projectId } = parseParams(projectIdSchema, values);
        membership = await requireProjectRole(user, projectId, options.action);
      }
      const input = parseWith(options.schema, values);
      return { ok: true, data: await body(input, { user, membership }) };
    } catch (error) {
      const { body: failure } = errorBody(error);
      return { ok: false, ...failure };
    }
  };
}
