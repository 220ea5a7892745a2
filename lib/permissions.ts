// The one permission table of Strutroom. Every route handler, server action and socket event asks `can`.

/** Project roles, a closed enum ordered from most to least authority. */
export const ROLES = ["owner", "structural_engineer", "architect", "mep_engineer", "viewer"] as const;
export type Role = (typeof ROLES)[number];

export const ACTIONS = [
  "project.read",
  "team.manage",
  "model.edit",
  "analysis.run",
  "review.decide",
  "session.present",
  "pin.create",
  "comment.create",
  "thread.close",
  "clash.propose",
  "clash.acceptOpening",
  "runs.edit",
  "report.export",
  "mail.viewCaptured",
] as const;
export type Action = (typeof ACTIONS)[number];

/** Labels shown on screen for each role. */
export const ROLE_LABELS: Record<Role, string> = {
  owner: "Owner",
  structural_engineer: "Structural engineer",
  architect: "Architect",
  mep_engineer: "MEP engineer",
  viewer: "Viewer",
};

const ALL: readonly Role[] = ROLES;

const TABLE: Record<Action, readonly Role[]> = {
  "project.read": ALL,
  "report.export": ALL,
  "team.manage": ["owner"],
  "mail.viewCaptured": ["owner"],
  "model.edit": ["structural_engineer"],
  "analysis.run": ["structural_engineer"],
  "review.decide": ["structural_engineer"],
  "clash.acceptOpening": ["structural_engineer"],
  "session.present": ["owner", "structural_engineer"],
  "pin.create": ["owner", "structural_engineer", "architect", "mep_engineer"],
  "comment.create": ["owner", "structural_engineer", "architect", "mep_engineer"],
  // The pin's author may also close their own thread; the caller checks authorship (see canCloseThread).
  "thread.close": ["owner", "structural_engineer"],
  "clash.propose": ["mep_engineer", "structural_engineer"],
  "runs.edit": ["mep_engineer", "structural_engineer"],
};

/** True when a member with this role may perform the action on their project. */
export function can(role: Role | null | undefined, action: Action): boolean {
  if (!role) return false;
  return TABLE[action].includes(role);
}

/** thread.close: owners and structural engineers, plus the author of the pin whatever their role. */
export function canCloseThread(role: Role | null | undefined, userId: string, pinAuthorId: string): boolean {
  return can(role, "thread.close") || (role != null && userId === pinAuthorId);
}

/** Every action the role may perform, for the UI to enable buttons from the server's answer. */
export function abilitiesOf(role: Role | null | undefined): Record<Action, boolean> {
  return Object.fromEntries(ACTIONS.map((action) => [action, can(role, action)])) as Record<Action, boolean>;
}

/** True for a string that names a role. */
export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}
