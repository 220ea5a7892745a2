import "server-only";
// The team rules shared by the role-change and removal commands.
import type { Membership } from "@/db/schema";
import { ConflictError, NotFoundError } from "@/lib/http/errors";

/** The member being changed, from the locked team; a project always keeps at least one owner (`field` names the form field to mark). */
export function memberToChange(team: Membership[], userId: string, { demotesOwner, field }: { demotesOwner: boolean; field?: string }): Membership {
  const current = team.find((m) => m.userId === userId);
  if (!current) throw new NotFoundError("That person is not on this project.");
  if (demotesOwner && current.role === "owner" && team.filter((m) => m.role === "owner").length <= 1) {
    const message = "A project needs at least one owner: make someone else owner first.";
    throw new ConflictError(message, field ? [{ path: field, message: "A project needs at least one owner." }] : undefined);
  }
  return current;
}
