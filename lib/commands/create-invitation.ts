import "server-only";
import { hasPendingInvitation, insertInvitation, isEmailOnTeam, presentInvitation, type PresentedInvitation } from "@/db/queries/invitations";
import { ConflictError } from "@/lib/http/errors";
import type { Role } from "@/lib/permissions";
import { hashToken, INVITATION_TTL_MS, joinLink, newInvitationToken } from "@/lib/team/invitation-link";
import { runCommand } from "./command";
import { sendInvitationMail } from "./mail";

/**
 * Creates an invitation with its mail and returns it with the one-time token of its join link. Refuses an e-mail
 * already on the team or already holding a pending invitation.
 */
export async function createInvitation({ projectId, email, role, invitedBy }: { projectId: string; email: string; role: Role; invitedBy: string }): Promise<{ invitation: PresentedInvitation; token: string }> {
  const normalised = email.trim().toLowerCase();
  return runCommand(async ({ tx, audit }) => {
    if (await isEmailOnTeam({ db: tx, projectId, email: normalised })) throw new ConflictError("This person is already on the team.", [{ path: "email", message: "Already on the team." }]);
    const now = new Date();
    if (await hasPendingInvitation({ db: tx, projectId, email: normalised, now })) {
      throw new ConflictError("An invitation to this e-mail is still pending.", [{ path: "email", message: "An invitation is already pending." }]);
    }
    const token = newInvitationToken();
    const row = await insertInvitation({ db: tx, values: { projectId, email: normalised, role, invitedBy, tokenHash: hashToken(token), expiresAt: new Date(now.getTime() + INVITATION_TTL_MS) } });
    await audit({ projectId, actorId: invitedBy, action: "invitation.created", subjectType: "invitation", subjectId: row.id, details: { email: normalised, role } });
    await sendInvitationMail({ db: tx, invitationId: row.id, joinUrl: joinLink(token) });
    return { invitation: presentInvitation(row), token };
  });
}
