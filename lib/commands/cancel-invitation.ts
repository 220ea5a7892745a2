import "server-only";
import { deleteInvitation, lockInvitation } from "@/db/queries/invitations";
import { ConflictError, NotFoundError } from "@/lib/http/errors";
import { runCommand } from "./command";

/** Cancels a pending invitation of the project (its join link stops working) and records it. */
export async function cancelInvitation({ projectId, invitationId, actorId }: { projectId: string; invitationId: string; actorId: string }): Promise<void> {
  await runCommand(async ({ tx, audit }) => {
    const invitation = await lockInvitation({ db: tx, projectId, invitationId });
    if (!invitation) throw new NotFoundError("No such invitation on this project.");
    if (invitation.acceptedAt) throw new ConflictError("This invitation has already been accepted: remove the member instead.");
    await deleteInvitation({ db: tx, invitationId: invitation.id });
    await audit({ projectId, actorId, action: "invitation.cancelled", subjectType: "invitation", subjectId: invitation.id, details: { email: invitation.email, role: invitation.role } });
  });
}
