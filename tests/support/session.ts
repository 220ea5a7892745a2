// Signed-in requests for tests: a next-auth session cookie minted with the app's NEXTAUTH_SECRET, exactly as
// next-auth's JWT strategy would set it after a credentials sign-in.
import { encode } from "next-auth/jwt";

export const SESSION_COOKIE = "next-auth.session-token";

/** sessionVersion: the user's version when the session is issued (users.session_version; 0 until first revoked). */
export type Person = { id: string; email: string; name: string; sessionVersion?: number };

/** The session token (the cookie's value) for this user. */
export async function sessionToken(user: Person): Promise<string> {
  const secret = process.env.NEXTAUTH_SECRET;
  if (!secret) throw new Error("NEXTAUTH_SECRET must be set to mint test sessions.");
  return encode({ token: { sub: user.id, userId: user.id, email: user.email, name: user.name, sessionVersion: user.sessionVersion ?? 0 }, secret });
}

/** A Cookie header carrying this user's session. */
export async function sessionCookie(user: Person): Promise<string> {
  return `${SESSION_COOKIE}=${await sessionToken(user)}`;
}

/** A Request to a route handler, signed in as `user` when given, with a JSON body when given. */
export async function buildRequest(path: string, { user, method = "GET", body, rawBody }: { user?: Person; method?: string; body?: unknown; rawBody?: string } = {}): Promise<Request> {
  const headers = new Headers();
  if (user) headers.set("cookie", await sessionCookie(user));
  if (body !== undefined || rawBody !== undefined) headers.set("content-type", "application/json");
  return new Request(new URL(path, "http://127.0.0.1"), { method, headers, body: rawBody ?? (body === undefined ? undefined : JSON.stringify(body)) });
}

/** Route handler context for dynamic segments (Next 16 passes params as a promise). */
export function routeContext<P extends Record<string, string>>(params: P): { params: Promise<P> } {
  return { params: Promise.resolve(params) };
}
