import { getUserById, presentUser, updateUserName } from "@/db/queries/users";
import { requireUser } from "@/lib/auth/guard";
import { updateAccountSchema } from "@/lib/auth/schemas";
import { getRequestUser } from "@/lib/auth/session";
import { UnauthorizedError, handleRoute } from "@/lib/http/errors";
import { parseJson } from "@/lib/http/parse";

/** The signed-in user's account. */
export const GET = handleRoute(async (request: Request) => {
  const { id } = requireUser(await getRequestUser(request));
  const user = await getUserById({ id });
  if (!user) throw new UnauthorizedError();
  return Response.json({ user: presentUser(user) });
});

/** Renames the signed-in user. */
export const PATCH = handleRoute(async (request: Request) => {
  const { id } = requireUser(await getRequestUser(request));
  const { name } = await parseJson(request, updateAccountSchema);
  const user = await updateUserName({ userId: id, name });
  if (!user) throw new UnauthorizedError();
  return Response.json({ user });
});
