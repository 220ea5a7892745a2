import { raiseSessionVersion } from "@/db/queries/users";
import { freshSessionCookie } from "@/lib/auth/fresh-session";
import { UnauthorizedError } from "@/lib/http/errors";
import { accountRoute } from "@/lib/http/route";

/** Sign out everywhere else: every other session of the signed-in user ends; this device gets a fresh one. */
export const DELETE = accountRoute({}, async ({ user }) => {
  const version = await raiseSessionVersion({ userId: user.id });
  if (version === null) throw new UnauthorizedError();
  return Response.json({ ok: true }, { headers: { "set-cookie": await freshSessionCookie(user, version) } });
});
