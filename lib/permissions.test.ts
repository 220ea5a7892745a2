import { describe, expect, it } from "vitest";
import { ACTIONS, ROLES, abilitiesOf, can, authorize, canCloseThread, clashDecisionRefusal, isRole, threadStepRefusal, mayMoveThread, type Action, type Role } from "./permissions";

// The full role × action matrix, written out cell by cell from the team rules (the product owner's table), so a
// change to lib/permissions.ts that is not also a deliberate change here fails.
// Columns: owner, structural_engineer, architect, mep_engineer, viewer.
const MATRIX: Record<Action, [boolean, boolean, boolean, boolean, boolean]> = {
  "project.read":        [true,  true,  true,  true,  true],
  "report.export":       [true,  true,  true,  true,  true],
  "report.make":         [true,  true,  true,  true,  false],
  "team.manage":         [true,  false, false, false, false],
  "project.settings":    [true,  true,  false, false, false],
  "mail.viewCaptured":   [true,  false, false, false, false],
  "model.edit":          [false, true,  false, false, false],
  "analysis.run":        [false, true,  false, false, false],
  "review.decide":       [false, true,  false, false, false],
  "clash.decide":        [false, true,  false, false, false],
  "clash.assign":        [false, true,  false, true,  false],
  "revision.markCurrent":[false, true,  false, false, false],
  "session.present":     [true,  true,  false, false, false],
  "pin.create":          [true,  true,  true,  true,  false],
  "comment.create":      [true,  true,  true,  true,  false],
  "thread.close":        [true,  true,  false, false, false],
  "clash.propose":       [false, true,  false, true,  false],
  "runs.edit":           [false, true,  false, true,  false],
};
const COLUMNS: Role[] = ["owner", "structural_engineer", "architect", "mep_engineer", "viewer"];

describe("permission table", () => {
  it("has the closed, ordered role enum", () => {
    expect(ROLES).toEqual(COLUMNS);
  });

  it("covers every action exactly once", () => {
    expect([...ACTIONS].sort()).toEqual(Object.keys(MATRIX).sort());
  });

  const cells = ACTIONS.flatMap((action) => COLUMNS.map((role, column) => [role, action, MATRIX[action][column]] as const));
  it.each(cells)("%s may %s: %s", (role, action, allowed) => {
    expect(can(role, action)).toBe(allowed);
    expect(abilitiesOf(role)[action]).toBe(allowed);
  });

  it("refuses everything to someone with no role", () => {
    for (const action of ACTIONS) {
      expect(can(null, action)).toBe(false);
      expect(can(undefined, action)).toBe(false);
    }
  });

  it("lets a pin's author close their own thread whatever their role, but not others' threads", () => {
    expect(canCloseThread("architect", "u1", "u1")).toBe(true);
    expect(canCloseThread("viewer", "u1", "u1")).toBe(true);
    expect(canCloseThread("architect", "u1", "u2")).toBe(false);
    expect(canCloseThread("owner", "u1", "u2")).toBe(true);
    expect(canCloseThread(null, "u1", "u1")).toBe(false);
  });

  it("keeps proposer and decider of an opening two different people", () => {
    const opening = { kind: "proposal", outcome: "opening_proposed", proposerId: "se1" } as const;
    expect(authorize({ role: "structural_engineer", userId: "se1" }, "clash.decide", opening)).toBe(false);
    expect(clashDecisionRefusal({ role: "structural_engineer", userId: "se1" }, { outcome: opening.outcome, proposerId: opening.proposerId })).toMatch(/two people/);
    expect(authorize({ role: "structural_engineer", userId: "se2" }, "clash.decide", opening)).toBe(true);
    expect(clashDecisionRefusal({ role: "structural_engineer", userId: "se2" }, { outcome: opening.outcome, proposerId: opening.proposerId })).toBeNull();
    expect(authorize({ role: "mep_engineer", userId: "mep1" }, "clash.decide", opening)).toBe(false);
    expect(clashDecisionRefusal({ role: "mep_engineer", userId: "se1" }, { outcome: opening.outcome, proposerId: opening.proposerId })).toMatch(/Only the structural engineer/);
    // The rule is about openings: the structural engineer may confirm a reroute they proposed themselves.
    expect(authorize({ role: "structural_engineer", userId: "se1" }, "clash.decide", { kind: "proposal", outcome: "reroute_run", proposerId: "se1" })).toBe(true);
  });

  it("thread records: anyone who may comment proposes; the structural engineer decides, never their own proposal, and supersedes", () => {
    const se1 = { role: "structural_engineer", userId: "se1" } as const;
    const se2 = { role: "structural_engineer", userId: "se2" } as const;
    const architect = { role: "architect", userId: "ar1" } as const;
    const viewer = { role: "viewer", userId: "v1" } as const;
    for (const kind of ["comment", "proposal", "decision", "supersession"] as const) expect(threadStepRefusal(viewer, kind, null)).not.toBeNull();
    expect(threadStepRefusal(null, "comment", null)).not.toBeNull();
    expect(threadStepRefusal(architect, "proposal", null)).toBeNull();
    expect(threadStepRefusal(architect, "decision", null)).toBe("Only the structural engineer records decisions.");
    expect(threadStepRefusal(architect, "supersession", null)).toMatch(/Only the structural engineer/);
    expect(threadStepRefusal(se1, "decision", null)).toBeNull();
    expect(threadStepRefusal(se1, "decision", "ar1")).toBeNull();
    expect(threadStepRefusal(se1, "decision", "se1")).toMatch(/two people/);
    expect(authorize(se1, "thread.decide", { kind: "proposal", outcome: null, proposerId: "se1" })).toBe(false);
    expect(threadStepRefusal(se2, "decision", "se1")).toBeNull();
    expect(threadStepRefusal(se1, "supersession", null)).toBeNull();
  });

  it("lets the same people move a thread as the socket server does: viewers never, closers close and reopen, commenters answer", () => {
    const closed = { state: "closed", authorId: "a1" } as const;
    const open = { state: "open", authorId: "a1" } as const;
    // A viewer sees no Reopen, Close or Mark answered (issue 17 item 6: the viewer was shown Reopen and got an error).
    for (const to of ["open", "answered", "closed"] as const) {
      expect(mayMoveThread({ role: "viewer", userId: "v1" }, closed, to)).toBe(false);
      expect(mayMoveThread({ role: "viewer", userId: "v1" }, open, to)).toBe(false);
    }
    expect(mayMoveThread(null, open, "answered")).toBe(false);
    // An architect who did not write the pin may mark it answered but not close or reopen it.
    expect(mayMoveThread({ role: "architect", userId: "x" }, open, "answered")).toBe(true);
    expect(mayMoveThread({ role: "architect", userId: "x" }, open, "closed")).toBe(false);
    expect(mayMoveThread({ role: "architect", userId: "x" }, closed, "open")).toBe(false);
    expect(mayMoveThread({ role: "architect", userId: "x" }, closed, "answered")).toBe(false);
    // The pin's author and the structural engineer may close and reopen.
    expect(mayMoveThread({ role: "architect", userId: "a1" }, closed, "open")).toBe(true);
    expect(mayMoveThread({ role: "structural_engineer", userId: "se" }, open, "closed")).toBe(true);
    expect(mayMoveThread({ role: "structural_engineer", userId: "se" }, closed, "open")).toBe(true);
  });

  it("recognises role strings", () => {
    expect(isRole("mep_engineer")).toBe(true);
    expect(isRole("admin")).toBe(false);
    expect(isRole(3)).toBe(false);
  });
});
