import { describe, expect, it } from "vitest";
import { defaultRevision, revisionStage } from "./revision-stage";

describe("revision stage and the default revision (issue 16)", () => {
  it("opens the current revision, not the newest, and the newest when none is current", () => {
    const revisions = [
      { number: 4, isCurrent: false },
      { number: 3, isCurrent: true },
      { number: 1, isCurrent: false },
    ];
    expect(defaultRevision(revisions)?.number).toBe(3);
    expect(defaultRevision(revisions.map((r) => ({ ...r, isCurrent: false })))?.number).toBe(4);
    expect(defaultRevision([])).toBeUndefined();
  });

  it("labels unstable revisions unstable even when current; others current or draft", () => {
    expect(revisionStage({ isCurrent: true, analysisStatus: "unstable" })).toBe("unstable");
    expect(revisionStage({ isCurrent: false, analysisStatus: "unstable" })).toBe("unstable");
    expect(revisionStage({ isCurrent: true, analysisStatus: "ok" })).toBe("current");
    expect(revisionStage({ isCurrent: false, analysisStatus: null })).toBe("draft");
  });
});
