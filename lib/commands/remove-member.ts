import "server-only";
import { deleteMembership, lockTeam } from "@/db/queries/memberships";
import { runCommand } from "./command";
import { memberToChange } from "./team-rules";

/** An owner removes a member (never the last owner). Audited; the realtime server closes their live connections. */
export function removeMember({ projectId, userId, actorId }: { projectId: string; userId: string; actorId: string }): Promise<void> {
  return runCommand(async ({ tx, audit, live }) => {
    const current = memberToChange(await lockTeam({ projectId, db: tx }), userId, { demotesOwner: true });
    await deleteMembership({ membershipId: current.id, db: tx });
    await audit({ projectId, actorId, action: "member.removed", subjectType: "user", subjectId: userId, details: { role: current.role } });
    await live({ projectId, kind: "member", subjectId: userId });
  });
}
