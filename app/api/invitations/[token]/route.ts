import { z } from "zod";
import { getInvitationByTokenHash } from "@/db/queries/invitations";
import { joinSchema } from "@/lib/auth/schemas";
import { acceptInvitation } from "@/lib/commands/accept-invitation";
import { NotFoundError } from "@/lib/http/errors";
import { tokenParamsSchema } from "@/lib/http/params";
import { parseWith } from "@/lib/http/parse";
import { publicRoute } from "@/lib/http/route";
import { hashToken, invitationCheck } from "@/lib/team/invitation-link";

/** The invitation behind a join link: pending, accepted or expired, and whether its e-mail has an account. */
export const GET = publicRoute({ params: tokenParamsSchema }, async ({ params }) => {
  const invitation = invitationCheck(await getInvitationByTokenHash({ tokenHash: hashToken(params.token) }));
  if (!invitation) throw new NotFoundError("This invitation link is not valid.");
  return Response.json({ invitation });
});

/**
 * Accepts the invitation: signed in as the invited e-mail (empty body), or as a newcomer with `{ name, password }`
 * (the account is created in the same transaction as the membership).
 */
export const POST = publicRoute({ params: tokenParamsSchema, body: z.object({}).loose() }, async ({ params, user, body }) => {
  const newAccount = user ? undefined : parseWith(joinSchema, body);
  const accepted = await acceptInvitation({ token: params.token, userId: user?.id, newAccount });
  return Response.json(accepted, { status: 201 });
});
