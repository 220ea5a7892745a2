// The per-resource rules of the rule book (the role table itself is checked cell by cell in permissions.test.ts).
import { describe, expect, it } from "vitest";
import { ACTIONS, ROLES, authorize, can } from "./permissions";

const member = (role: (typeof ROLES)[number], userId = "me") => ({ role, userId });

describe("authorize", () => {
  it("answers role-table actions exactly as the table does, and refuses non-members", () => {
    for (const role of ROLES) for (const action of ACTIONS) if (action !== "thread.close") expect(authorize(member(role), action)).toBe(can(role, action));
    for (const action of ACTIONS) expect(authorize(null, action)).toBe(false);
  });

  it("lets a pin's author close and reopen their own thread whatever their role, but not another's", () => {
    const own = { kind: "pin", authorId: "me" } as const;
    const other = { kind: "pin", authorId: "them" } as const;
    expect(authorize(member("viewer"), "thread.close", own)).toBe(true);
    expect(authorize(member("architect"), "thread.reopen", own)).toBe(true);
    expect(authorize(member("architect"), "thread.close", other)).toBe(false);
    expect(authorize(member("architect"), "thread.close")).toBe(false);
    expect(authorize(member("owner"), "thread.reopen", other)).toBe(true);
  });

  it("lets the presenter or an owner steer the session, and only the presenter drive the view", () => {
    const mine = { kind: "session", presenterId: "me" } as const;
    const theirs = { kind: "session", presenterId: "them" } as const;
    expect(authorize(member("structural_engineer"), "session.steer", mine)).toBe(true);
    expect(authorize(member("structural_engineer"), "session.steer", theirs)).toBe(false);
    expect(authorize(member("owner"), "session.steer", theirs)).toBe(true);
    expect(authorize(member("owner"), "session.drive", theirs)).toBe(false);
    expect(authorize(member("structural_engineer"), "session.drive", mine)).toBe(true);
    expect(authorize(member("architect"), "session.drive", { kind: "session", presenterId: null })).toBe(false);
  });

  it("lets whoever may comment edit the shared notes; viewers read them", () => {
    for (const role of ROLES) expect(authorize(member(role), "notes.edit")).toBe(role !== "viewer");
  });

  it("lets only a comment's author attach files to it, and not once they are a viewer", () => {
    expect(authorize(member("architect"), "comment.attach", { kind: "comment", authorId: "me" })).toBe(true);
    expect(authorize(member("owner"), "comment.attach", { kind: "comment", authorId: "them" })).toBe(false);
    expect(authorize(member("viewer"), "comment.attach", { kind: "comment", authorId: "me" })).toBe(false);
    expect(authorize(member("architect"), "comment.attach", { kind: "pin", authorId: "me" })).toBe(false);
  });

  it("lets a pin's author, the owner and the structural engineer save a view on a pin; not a viewer who raised one", () => {
    const own = { kind: "pin", authorId: "me" } as const;
    const other = { kind: "pin", authorId: "them" } as const;
    expect(authorize(member("architect"), "pin.saveView", own)).toBe(true);
    expect(authorize(member("mep_engineer"), "pin.saveView", other)).toBe(false);
    expect(authorize(member("structural_engineer"), "pin.saveView", other)).toBe(true);
    expect(authorize(member("owner"), "pin.saveView", other)).toBe(true);
    expect(authorize(member("viewer"), "pin.saveView", own)).toBe(false);
  });
});
