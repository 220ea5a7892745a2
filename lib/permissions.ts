// The one rule book of Strutroom: the role table (`can`) and the rules that also look at the thing acted on
// (`authorize`). Route handlers (projectRoute), server actions, socket events, the Yjs endpoint and the pages'
// buttons all ask here; nothing else decides who may do what.
import type { CommentKind } from "./realtime/events";

/** Project roles, a closed enum ordered from most to least authority. */
export const ROLES = ["owner", "structural_engineer", "architect", "mep_engineer", "viewer"] as const;
export type Role = (typeof ROLES)[number];

export const ACTIONS = [
  "project.read",
  "team.manage",
  "project.settings",
  "model.edit",
  "analysis.run",
  "review.decide",
  "session.present",
  "pin.create",
  "comment.create",
  "thread.close",
  "clash.propose",
  "clash.decide",
  "clash.assign",
  "revision.markCurrent",
  "runs.edit",
  "report.export",
  "report.make",
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
  // Making a report runs a job and stores a file: a write, so not the viewer's (they download the reports made).
  "report.make": ["owner", "structural_engineer", "architect", "mep_engineer"],
  "team.manage": ["owner"],
  // The project's settings (the deflection limit span/N): the owner who runs the project and the engineer whose check it is.
  "project.settings": ["owner", "structural_engineer"],
  "mail.viewCaptured": ["owner"],
  "model.edit": ["structural_engineer"],
  "analysis.run": ["structural_engineer"],
  "review.decide": ["structural_engineer"],
  // Decide a proposal (accept or refuse an opening, confirm another outcome) and supersede a decision. For an
  // opening, the proposer may not decide it too (see canDecideClash).
  "clash.decide": ["structural_engineer"],
  "clash.assign": ["mep_engineer", "structural_engineer"],
  "revision.markCurrent": ["structural_engineer"],
  "session.present": ["owner", "structural_engineer"],
  "pin.create": ["owner", "structural_engineer", "architect", "mep_engineer"],
  "comment.create": ["owner", "structural_engineer", "architect", "mep_engineer"],
  // The pin's author may also close their own thread (authorize with the pin as resource).
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
  return authorize(role ? { role, userId } : null, "thread.close", { kind: "pin", authorId: pinAuthorId });
}

/** Why a member may not decide a clash's open proposal, or null when they may (the two-person rule for openings). */
export function clashDecisionRefusal(asker: Asker, proposal: { outcome: string | null; proposerId: string | null }): string | null {
  if (authorize(asker, "clash.decide", { kind: "proposal", ...proposal })) return null;
  if (!authorize(asker, "clash.decide")) return "Only the structural engineer decides clashes.";
  return "You proposed this opening; another structural engineer must decide it (proposer and decider of an opening are two people).";
}

/**
 * Why a member may not add this kind of comment to a pin's thread, or null when they may. Comments and proposals:
 * whoever may comment; a decision: the structural engineer, never the proposer of the thread's open proposal (two
 * people); a supersession: the structural engineer. The socket event, the command and the thread's form ask here.
 */
export function threadStepRefusal(asker: Asker, kind: CommentKind, openProposerId: string | null): string | null {
  if (!authorize(asker, "comment.create")) return "Your role on this project does not allow this.";
  if (kind === "decision") {
    if (authorize(asker, "thread.decide", { kind: "proposal", outcome: null, proposerId: openProposerId })) return null;
    if (!authorize(asker, "review.decide")) return "Only the structural engineer records decisions.";
    return "You proposed this; another structural engineer must decide it (proposer and decider are two people).";
  }
  if (kind === "supersession" && !authorize(asker, "review.decide")) return "Only the structural engineer supersedes a decision.";
  return null;
}

/** Every action the role may perform, for the UI to enable buttons from the server's answer. */
export function abilitiesOf(role: Role | null | undefined): Record<Action, boolean> {
  return Object.fromEntries(ACTIONS.map((action) => [action, can(role, action)])) as Record<Action, boolean>;
}

/** Actions whose answer depends on the resource as well as the role (kept apart from the role table above). */
export const RESOURCE_ACTIONS = ["thread.reopen", "thread.decide", "session.steer", "session.drive", "notes.edit", "comment.attach", "pin.saveView"] as const;
export type ResourceAction = (typeof RESOURCE_ACTIONS)[number];

/** Who is asking: their role on the project and their user id (a membership row fits). */
export type Asker = { role: Role; userId: string } | null | undefined;

/** The thing an action is done to, when the rule looks at it. */
export type Resource =
  /** A pin and its thread: its author may close (or reopen) it. */
  | { kind: "pin"; authorId: string }
  /** The live review session: its presenter (null when none is live). */
  | { kind: "session"; presenterId: string | null }
  /** A comment: only its author attaches files to it. */
  | { kind: "comment"; authorId: string }
  /** The open proposal on a clash: whoever proposed an opening may not decide it. */
  | { kind: "proposal"; outcome: string | null; proposerId: string | null };

function ownsResource(asker: NonNullable<Asker>, resource: Resource | undefined, kind: Resource["kind"]): boolean {
  if (!resource || resource.kind !== kind) return false;
  const owner = resource.kind === "session" ? resource.presenterId : resource.kind === "proposal" ? resource.proposerId : resource.authorId;
  return owner === asker.userId;
}

/**
 * The one question every caller asks: may this member do this (to this resource)? Role-table actions need only the
 * role, except `thread.close`, which the pin's author may also do. Resource actions:
 * - `thread.reopen`: the same people who may close the pin's thread;
 * - `session.steer` (hand over, end): the presenter or an owner;
 * - `session.drive` (move everyone's view): the presenter only;
 * - `notes.edit` (the shared session notes): whoever may comment;
 * - `comment.attach`: the comment's author, while they may comment;
 * - `pin.saveView` (save the viewer's view and snapshot on a pin): whoever may comment, if they raised the pin or may
 *   close any thread (owner, structural engineer);
 * - `clash.decide` on a proposal: the structural engineer, but never the one who proposed that opening;
 * - `thread.decide` (record a decision in a pin's thread, given its open proposal if any): the structural engineer,
 *   but never the one who proposed it (any proposal in a thread may be an opening or a removal).
 */
export function authorize(asker: Asker, action: Action | ResourceAction, resource?: Resource): boolean {
  if (!asker) return false;
  switch (action) {
    case "thread.close":
    case "thread.reopen":
      return can(asker.role, "thread.close") || ownsResource(asker, resource, "pin");
    case "session.steer":
      return ownsResource(asker, resource, "session") || asker.role === "owner";
    case "session.drive":
      return ownsResource(asker, resource, "session");
    case "notes.edit":
      return can(asker.role, "comment.create");
    case "comment.attach":
      return can(asker.role, "comment.create") && ownsResource(asker, resource, "comment");
    case "pin.saveView":
      return can(asker.role, "comment.create") && (can(asker.role, "thread.close") || ownsResource(asker, resource, "pin"));
    case "clash.decide":
      return can(asker.role, "clash.decide") && !(resource?.kind === "proposal" && resource.outcome === "opening_proposed" && ownsResource(asker, resource, "proposal"));
    case "thread.decide":
      return can(asker.role, "review.decide") && !ownsResource(asker, resource, "proposal");
    default:
      return can(asker.role, action);
  }
}

/** The states a pin's thread takes (open, answered by someone, closed by the closer). */
type ThreadState = "open" | "answered" | "closed";

/**
 * May this member move a pin's thread to `to`? Closing, and anything that moves a closed thread (reopening it or
 * marking it answered), is the closer's call (`thread.close` / `thread.reopen`); marking an open thread answered, or an
 * answered one open again, is anyone's who may comment. The socket event and the thread's buttons both ask here.
 */
export function mayMoveThread(asker: Asker, pin: { state: ThreadState; authorId: string }, to: ThreadState): boolean {
  const resource = { kind: "pin", authorId: pin.authorId } as const;
  if (to === "closed") return authorize(asker, "thread.close", resource);
  if (pin.state === "closed") return authorize(asker, "thread.reopen", resource);
  return authorize(asker, "comment.create");
}

/** True for a string that names a role. */
export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}
