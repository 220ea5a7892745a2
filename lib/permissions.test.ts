import { describe, expect, it } from "vitest";
import { ACTIONS, ROLES, abilitiesOf, can, canCloseThread, isRole, type Action, type Role } from "./permissions";

// The full role × action matrix, written out cell by cell from the team rules (the product owner's table), so a
// change to lib/permissions.ts that is not also a deliberate change here fails.
// Columns: owner, structural_engineer, architect, mep_engineer, viewer.
const MATRIX: Record<Action, [boolean, boolean, boolean, boolean, boolean]> = {
  "project.read":        [true,  true,  true,  true,  true],
  "report.export":       [true,  true,  true,  true,  true],
  "team.manage":         [true,  false, false, false, false],
  "mail.viewCaptured":   [true,  false, false, false, false],
  "model.edit":          [false, true,  false, false, false],
  "analysis.run":        [false, true,  false, false, false],
  "review.decide":       [false, true,  false, false, false],
  "clash.acceptOpening": [false, true,  false, false, false],
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

  it("recognises role strings", () => {
    expect(isRole("mep_engineer")).toBe(true);
    expect(isRole("admin")).toBe(false);
    expect(isRole(3)).toBe(false);
  });
});
