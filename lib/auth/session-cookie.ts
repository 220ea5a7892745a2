// Reading the next-auth session from a request or a raw Cookie header, for route handlers and the realtime server
// (which authenticates sockets with the same session as the web app). A session issued under an older session
// version of its user (raised by a password change, "sign out everywhere else" or signing out) is no session.
import { getToken, type JWT } from "next-auth/jwt";
import { NextRequest } from "next/server";
import { getSessionVersion } from "@/db/queries/users";

/** The signed-in person, as every entry point sees them. */
export type SessionUser = { id: string; email: string; name: string };

async function userFrom(token: JWT | null): Promise<SessionUser | null> {
  if (!token?.userId) return null;
  // Sessions issued before versions existed carry none: they count as version 0, the column's default.
  if ((await getSessionVersion({ userId: token.userId })) !== (token.sessionVersion ?? 0)) return null;
  return { id: token.userId, email: token.email ?? "", name: token.name ?? "" };
}

function secret(): string {
  const value = process.env.NEXTAUTH_SECRET;
  if (!value) throw new Error("NEXTAUTH_SECRET is not set.");
  return value;
}

/** The user of a route handler's request (a plain Request works too, for tests), or null when signed out. */
export async function getRequestUser(request: Request): Promise<SessionUser | null> {
  // getToken reads cookies through NextRequest's cookie API. A plain Request gets a header-only copy, so its
  // body stays unread for the handler.
  const req = request instanceof NextRequest ? request : new NextRequest(request.url, { headers: request.headers });
  return userFrom(await getToken({ req, secret: secret() }));
}

/** The user behind a Cookie header (the realtime server's handshake), or null when absent or invalid. */
export async function verifySessionCookie(cookieHeader: string | undefined | null): Promise<SessionUser | null> {
  if (!cookieHeader) return null;
  const req = new NextRequest("http://localhost/", { headers: { cookie: cookieHeader } });
  return userFrom(await getToken({ req, secret: secret() }));
}
