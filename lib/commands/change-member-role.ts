import "server-only";
import { listMembersByProject, lockTeam, setMembershipRole, type PresentedMember } from "@/db/queries/memberships";
import { ConflictError } from "@/lib/http/errors";
import type { Role } from "@/lib/permissions";
import { runCommand } from "./command";
import { memberToChange } from "./team-rules";

/**
 * An owner changes a member's role (the route and the team panel's server action both call this). Audited; the
 * member's open live connections are re-authorised by the realtime server from the live event.
 */
export function changeMemberRole({ projectId, userId, role, actorId }: { projectId: string; userId: string; role: Role; actorId: string }): Promise<PresentedMember> {
  return runCommand(async ({ tx, audit, live }) => {
    const team = await lockTeam({ projectId, db: tx });
    const current = memberToChange(team, userId, { demotesOwner: role !== "owner", field: "role" });
    if (current.role === role) throw new ConflictError("They already have this role.", [{ path: "role", message: "This is already their role." }]);
    await setMembershipRole({ membershipId: current.id, role, db: tx });
    await audit({ projectId, actorId, action: "member.role_changed", subjectType: "user", subjectId: userId, details: { from: current.role, to: role } });
    await live({ projectId, kind: "member", subjectId: userId });
    const [member] = (await listMembersByProject({ projectId, db: tx })).filter((m) => m.userId === userId);
    return member;
  });
}
