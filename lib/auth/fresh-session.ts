import "server-only";
// A new session cookie for the device that just ended every other session (password change, "sign out everywhere
// else"), issued under the new session version in next-auth's own format, name and lifetime.
import { encode } from "next-auth/jwt";
import { authOptions } from "./options";
import type { SessionUser } from "./session-cookie";

/** The Set-Cookie value of a fresh next-auth session for this user and session version. */
export async function freshSessionCookie(user: SessionUser, sessionVersion: number): Promise<string> {
  const secret = process.env.NEXTAUTH_SECRET;
  if (!secret) throw new Error("NEXTAUTH_SECRET is not set.");
  const maxAge = authOptions.session?.maxAge ?? 30 * 24 * 60 * 60;
  // next-auth names its cookie with the __Secure- prefix (and marks it Secure) when the app is served over https.
  const secure = (process.env.NEXTAUTH_URL ?? "").startsWith("https://");
  const token = await encode({ token: { sub: user.id, userId: user.id, email: user.email, name: user.name, sessionVersion }, secret, maxAge });
  return `${secure ? "__Secure-" : ""}next-auth.session-token=${token}; Path=/; HttpOnly; SameSite=Lax; Max-Age=${maxAge}${secure ? "; Secure" : ""}`;
}
