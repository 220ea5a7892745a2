// Reading the next-auth session from a request or a raw Cookie header. No database access, no "server-only"
// marker: the realtime server imports this to authenticate sockets with the same session as the web app.
import { getToken, type JWT } from "next-auth/jwt";
import { NextRequest } from "next/server";

/** The signed-in person, as every entry point sees them. */
export type SessionUser = { id: string; email: string; name: string };

function userFrom(token: JWT | null): SessionUser | null {
  if (!token?.userId) return null;
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
