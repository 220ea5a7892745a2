import { getUserById, presentUser, updateUserName } from "@/db/queries/users";
import { updateAccountSchema } from "@/lib/auth/schemas";
import { UnauthorizedError } from "@/lib/http/errors";
import { accountRoute } from "@/lib/http/route";

/** The signed-in user's account. */
export const GET = accountRoute({}, async ({ user: { id } }) => {
  const user = await getUserById({ id });
  if (!user) throw new UnauthorizedError();
  return Response.json({ user: presentUser(user) });
});

/** Renames the signed-in user. */
export const PATCH = accountRoute({ body: updateAccountSchema }, async ({ user: { id }, body }) => {
  const user = await updateUserName({ userId: id, name: body.name });
  if (!user) throw new UnauthorizedError();
  return Response.json({ user });
});
