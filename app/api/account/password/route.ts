import { changePassword } from "@/db/queries/users";
import { changePasswordSchema } from "@/lib/auth/schemas";
import { ValidationError } from "@/lib/http/errors";
import { accountRoute } from "@/lib/http/route";

/** Changes the signed-in user's password after checking the current one. */
export const POST = accountRoute({ body: changePasswordSchema }, async ({ user, body }) => {
  const changed = await changePassword({ userId: user.id, currentPassword: body.currentPassword, newPassword: body.newPassword });
  if (!changed) throw new ValidationError([{ path: "currentPassword", message: "This is not your current password." }], "The current password is wrong.");
  return Response.json({ ok: true });
});
