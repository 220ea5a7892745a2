import { z } from "zod";
import { acceptInvitation, checkInvitation } from "@/db/queries/invitations";
import { joinSchema } from "@/lib/auth/schemas";
import { getRequestUser } from "@/lib/auth/session";
import { NotFoundError, handleRoute } from "@/lib/http/errors";
import { tokenParamsSchema } from "@/lib/http/params";
import { parseJson, parseParams, parseWith } from "@/lib/http/parse";

type Context = RouteContext<"/api/invitations/[token]">;

/** The invitation behind a join link: pending, accepted or expired, and whether its e-mail has an account. */
export const GET = handleRoute(async (_request: Request, context: Context) => {
  const { token } = parseParams(tokenParamsSchema, await context.params);
  const invitation = await checkInvitation({ token });
  if (!invitation) throw new NotFoundError("This invitation link is not valid.");
  return Response.json({ invitation });
});

/**
 * Accepts the invitation: signed in as the invited e-mail (empty body), or as a newcomer with `{ name, password }`
 * (the account is created in the same transaction as the membership).
 */
export const POST = handleRoute(async (request: Request, context: Context) => {
  const { token } = parseParams(tokenParamsSchema, await context.params);
  const user = await getRequestUser(request);
  const body = await parseJson(request, z.object({}).loose());
  const newAccount = user ? undefined : parseWith(joinSchema, body);
  const accepted = await acceptInvitation({ token, userId: user?.id, newAccount });
  return Response.json(accepted, { status: 201 });
});
