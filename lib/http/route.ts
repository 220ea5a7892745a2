import "server-only";
// The only way to write a route handler under app/api (tests/integration/route-wrappers.test.ts checks it): the
// preamble every handler needs — cross-site writes refused, params, signed-in user, membership read once, the rule book, query and body
// parsed with their zod schemas — then the handler, with every thrown error answered as `{ error, issues? }`.
import { z } from "zod";
import { requireMembership, requireUser } from "@/lib/auth/guard";

/** The caller's membership of the project in the URL, as the guard reads it. */
type Membership = Awaited<ReturnType<typeof requireMembership>>;
import { getRequestUser, type SessionUser } from "@/lib/auth/session";
import { authorize, type Action } from "@/lib/permissions";
import { ForbiddenError, handleRoute } from "./errors";
import { parseJson, parseParams, parseWith } from "./parse";
import { mayChangeFrom } from "./same-origin";

/** Cross-site writes are refused before anything else (CSRF); server actions keep Next's own origin check. */
function refuseCrossSite(request: Request) {
  if (!mayChangeFrom(request)) throw new ForbiddenError("This request came from another site and was refused.");
}

/** What Next passes as the second argument of a route handler (typed routes narrow the params). */
type NextContext = { params: Promise<unknown> };
type Parsed<S> = S extends z.ZodType ? z.output<S> : undefined;

type Inputs<P, Q, B> = {
  /** Route params; a malformed id is "not found". */
  params?: P;
  /** Search params, read as a flat object (or by `readQuery` when a key may repeat). */
  query?: Q;
  readQuery?: (search: URLSearchParams) => unknown;
  /** The JSON body; a body that is not JSON, or does not match, is a 400 with issues. */
  body?: B;
  /** The body's cap in bytes (413 beyond it); ordinary JSON routes get requestBytes.json. */
  bodyBytes?: number;
};

type Handled<P, Q, B> = { request: Request; params: Parsed<P>; query: Parsed<Q>; body: Parsed<B> };

async function parseInputs<P extends z.ZodType | undefined, Q extends z.ZodType | undefined, B extends z.ZodType | undefined>(
  spec: Inputs<P, Q, B>,
  request: Request,
) {
  const query = spec.query ? parseWith(spec.query, (spec.readQuery ?? Object.fromEntries)(new URL(request.url).searchParams)) : undefined;
  const body = spec.body ? await parseJson(request, spec.body, spec.bodyBytes) : undefined;
  return { query: query as Parsed<Q>, body: body as Parsed<B> };
}

/** What a handler reads, kept on it so tests can aim hostile input at each route's params, query and body. */
export type RouteInputs = { params?: z.ZodType; query?: z.ZodType; body?: z.ZodType; bodyBytes?: number };

function described(spec: RouteInputs, handler: (request: Request, context?: NextContext) => Promise<Response>) {
  return Object.assign(handleRoute(handler), { inputs: { params: spec.params, query: spec.query, body: spec.body, bodyBytes: spec.bodyBytes } as RouteInputs });
}

/**
 * A route under /api/projects/[projectId]: params (a projectId and any others), signed in (401), on the team (404,
 * so outsiders cannot probe which projects exist), allowed by the rule book (403), then query and body (400).
 * `action` may be one action, several (all needed), or chosen from the parsed body (the body is then parsed first).
 */
export function projectRoute<
  P extends z.ZodObject<{ projectId: z.ZodType<string> }>,
  Q extends z.ZodType | undefined = undefined,
  B extends z.ZodType | undefined = undefined,
>(
  spec: Inputs<P, Q, B> & { params: P; action: Action | readonly Action[] | ((body: Parsed<B>) => Action) },
  handler: (input: Handled<P, Q, B> & { user: SessionUser; membership: Membership }) => Promise<Response>,
) {
  return described(spec, async (request: Request, context?: NextContext) => {
    refuseCrossSite(request);
    const params = parseParams(spec.params, await context?.params) as Parsed<P>;
    const user = requireUser(await getRequestUser(request));
    const membership = await requireMembership(user, params.projectId);
    const byBody = typeof spec.action === "function";
    const check = (actions: readonly Action[]) => {
      if (!actions.every((action) => authorize(membership, action))) throw new ForbiddenError();
    };
    if (!byBody) check(typeof spec.action === "string" ? [spec.action] : (spec.action as readonly Action[]));
    const { query, body } = await parseInputs(spec, request);
    if (byBody) check([(spec.action as (body: Parsed<B>) => Action)(body)]);
    return handler({ request, params, query, body, user, membership });
  });
}

/** A route for the signed-in person's own things (account, notifications, their project list): 401 when signed out. */
export function accountRoute<P extends z.ZodType | undefined = undefined, Q extends z.ZodType | undefined = undefined, B extends z.ZodType | undefined = undefined>(
  spec: Inputs<P, Q, B>,
  handler: (input: Handled<P, Q, B> & { user: SessionUser }) => Promise<Response>,
) {
  return described(spec, async (request: Request, context?: NextContext) => {
    refuseCrossSite(request);
    const params = (spec.params ? parseParams(spec.params, await context?.params) : undefined) as Parsed<P>;
    const user = requireUser(await getRequestUser(request));
    const { query, body } = await parseInputs(spec, request);
    return handler({ request, params, query, body, user });
  });
}

/**
 * A route anyone may call (the join link): the handler gets the signed-in person or null and decides with the
 * resource in hand (an invitation names who may accept it).
 */
export function publicRoute<P extends z.ZodType | undefined = undefined, Q extends z.ZodType | undefined = undefined, B extends z.ZodType | undefined = undefined>(
  spec: Inputs<P, Q, B>,
  handler: (input: Handled<P, Q, B> & { user: SessionUser | null }) => Promise<Response>,
) {
  return described(spec, async (request: Request, context?: NextContext) => {
    refuseCrossSite(request);
    const params = (spec.params ? parseParams(spec.params, await context?.params) : undefined) as Parsed<P>;
    const user = await getRequestUser(request);
    const { query, body } = await parseInputs(spec, request);
    return handler({ request, params, query, body, user });
  });
}
