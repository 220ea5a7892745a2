import "server-only";
import { lockInvitationByTokenHash, markInvitationAccepted } from "@/db/queries/invitations";
import { addMember, getMembership } from "@/db/queries/memberships";
import { createUser, getUserByEmail, presentUser, type PresentedUser } from "@/db/queries/users";
import { ConflictError, ForbiddenError, GoneError, NotFoundError, UnauthorizedError } from "@/lib/http/errors";
import { hashToken, INVITATION_EXPIRED, INVITATION_USED } from "@/lib/team/invitation-link";
import { runCommand } from "./command";

/**
 * Accepts an invitation: marks it used, creates the account when `newAccount` is given (the e-mail must be new) or
 * uses the signed-in `userId` (whose e-mail must match), adds the membership, and tells open viewers the team changed.
 */
export async function acceptInvitation({ token, userId, newAccount }: { token: string; userId?: string; newAccount?: { name: string; password: string } }): Promise<{ user: PresentedUser; projectId: string }> {
  return runCommand(async ({ tx, audit, live }) => {
    const invitation = await lockInvitationByTokenHash({ db: tx, tokenHash: hashToken(token) });
    if (!invitation) throw new NotFoundError("This invitation link is not valid.");
    if (invitation.acceptedAt) throw new GoneError(INVITATION_USED);
    const now = new Date();
    if (invitation.expiresAt <= now) throw new GoneError(INVITATION_EXPIRED);

    const existing = await getUserByEmail({ email: invitation.email, db: tx });
    let user;
    if (existing) {
      if (!userId) throw new UnauthorizedError(`An account for ${invitation.email} already exists: sign in to accept.`);
      if (existing.id !== userId) throw new ForbiddenError(`This invitation is for ${invitation.email}: sign in with that account.`);
      user = existing;
    } else {
      if (userId) throw new ForbiddenError(`This invitation is for ${invitation.email}: sign out, then open the link again.`);
      if (!newAccount) throw new UnauthorizedError("Choose your name and a password to join.");
      user = await createUser({ db: tx, email: invitation.email, ...newAccount });
    }

    const { projectId } = invitation;
    if (await getMembership({ projectId, userId: user.id, db: tx })) throw new ConflictError("You are already on this project.");
    await addMember({ projectId, userId: user.id, role: invitation.role, db: tx });
    await markInvitationAccepted({ db: tx, invitationId: invitation.id, userId: user.id, at: now });
    await audit({ projectId, actorId: user.id, action: "invitation.accepted", subjectType: "invitation", subjectId: invitation.id, details: { email: invitation.email, role: invitation.role, newAccount: !existing } });
    await live({ projectId, kind: "member", subjectId: user.id });
    return { user: presentUser(user), projectId };
  });
}
