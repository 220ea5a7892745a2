import { changePassword } from "@/db/queries/users";
import { freshSessionCookie } from "@/lib/auth/fresh-session";
import { changePasswordSchema } from "@/lib/auth/schemas";
import { ValidationError } from "@/lib/http/errors";
import { accountRoute } from "@/lib/http/route";

/**
 * Changes the signed-in user's password after checking the current one. Every other session ends; this device
 * gets a fresh session cookie.
 */
export const POST = accountRoute({ body: changePasswordSchema }, async ({ user, body }) => {
  const version = await changePassword({ userId: user.id, currentPassword: body.currentPassword, newPassword: body.newPassword });
  if (version === null) throw new ValidationError([{ path: "currentPassword", message: "This is not your current password." }], "The current password is wrong.");
  return Response.json({ ok: true }, { headers: { "set-cookie": await freshSessionCookie(user, version) } });
});
