import { changePassword } from "@/db/queries/users";
import { requireUser } from "@/lib/auth/guard";
import { changePasswordSchema } from "@/lib/auth/schemas";
import { getRequestUser } from "@/lib/auth/session";
import { ValidationError, handleRoute } from "@/lib/http/errors";
import { parseJson } from "@/lib/http/parse";

/** Changes the signed-in user's password after checking the current one. */
export const POST = handleRoute(async (request: Request) => {
  const { id } = requireUser(await getRequestUser(request));
  const input = await parseJson(request, changePasswordSchema);
  const changed = await changePassword({ userId: id, currentPassword: input.currentPassword, newPassword: input.newPassword });
  if (!changed) throw new ValidationError([{ path: "currentPassword", message: "This is not your current password." }], "The current password is wrong.");
  return Response.json({ ok: true });
});
