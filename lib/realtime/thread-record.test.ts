// The standing of a thread's record (issue 16 item 1): which decision stands, which proposal is open, and which
// steps the thread takes next. Rules from the issue text; no outside reference applies.
import { describe, expect, it } from "vitest";
import { threadStanding, threadStepConflict } from "./thread-record";

const step = (id: string, kind: "comment" | "proposal" | "decision" | "supersession", author = "a") => ({ id, kind, author: { id: author } });

describe("threadStanding", () => {
  it("has nothing standing on a thread of plain comments", () => {
    expect(threadStanding([step("1", "comment"), step("2", "comment")])).toEqual({ decisionId: null, proposal: null });
  });

  it("keeps the last proposal open until a decision answers it", () => {
    expect(threadStanding([step("1", "proposal", "mep"), step("2", "comment"), step("3", "proposal", "arch")])).toEqual({ decisionId: null, proposal: { id: "3", proposerId: "arch" } });
    expect(threadStanding([step("1", "proposal", "mep"), step("2", "decision", "se")])).toEqual({ decisionId: "2", proposal: null });
  });

  it("ends the standing decision with a supersession", () => {
    expect(threadStanding([step("1", "decision"), step("2", "supersession")])).toEqual({ decisionId: null, proposal: null });
    expect(threadStanding([step("1", "decision"), step("2", "supersession"), step("3", "proposal", "mep")]).proposal).toEqual({ id: "3", proposerId: "mep" });
  });
});

describe("threadStepConflict", () => {
  const decided = { decisionId: "d", proposal: null };
  const open = { decisionId: null, proposal: null };
  const proposed = { decisionId: null, proposal: { id: "p", proposerId: "mep" } };
  it("refuses a proposal or a second decision over a standing decision, a decision with nothing proposed, and a supersession without a decision", () => {
    expect(threadStepConflict("proposal", decided)).toMatch(/cannot replace a decision/);
    expect(threadStepConflict("decision", decided)).toMatch(/already decided/);
    expect(threadStepConflict("decision", open)).toMatch(/Nothing is proposed/);
    expect(threadStepConflict("supersession", open)).toMatch(/no standing decision/);
  });
  it("takes comments always, proposals on an undecided thread, a decision of an open proposal, a supersession of a standing decision", () => {
    expect(threadStepConflict("comment", decided)).toBeNull();
    expect(threadStepConflict("proposal", open)).toBeNull();
    expect(threadStepConflict("decision", proposed)).toBeNull();
    expect(threadStepConflict("supersession", decided)).toBeNull();
  });
});
