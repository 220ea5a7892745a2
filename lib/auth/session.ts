import "server-only";
import { getServerSession } from "next-auth";
import { redirect } from "next/navigation";
import { getSessionVersion } from "@/db/queries/users";
import { authOptions } from "./options";
import type { SessionUser } from "./session-cookie";

export { getRequestUser, verifySessionCookie, type SessionUser } from "./session-cookie";

/** The signed-in user in a server component or server action, or null (also when the session has been ended). */
export async function getSessionUser(): Promise<SessionUser | null> {
  const session = await getServerSession(authOptions);
  const user = session?.user;
  if (!user?.id || (await getSessionVersion({ userId: user.id })) !== session?.sessionVersion) return null;
  return { id: user.id, email: user.email, name: user.name };
}

/** The signed-in user for a page; signed-out visitors are sent to the sign-in page. */
export async function requirePageUser(callbackUrl: string): Promise<SessionUser> {
  const user = await getSessionUser();
  if (!user) redirect(`/sign-in?callbackUrl=${encodeURIComponent(callbackUrl)}`);
  return user;
}
