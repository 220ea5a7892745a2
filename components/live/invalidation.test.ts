import { describe, expect, it } from "vitest";
import { jobKey } from "@/components/jobs/job-progress";
import { settingsKey } from "@/components/project/use-project-settings";
import { reportsKey } from "@/components/report/use-revision-reports";
import { staleQueryKeys } from "./invalidation";

describe("staleQueryKeys", () => {
  it("refetches the clash list and that clash's history after a decision", () => {
    expect(staleQueryKeys("p1", { kind: "clash", id: "c1", revision: 2 })).toEqual([
      ["projects", "p1", "clashes"],
      ["projects", "p1", "clash", "c1"],
    ]);
  });

  it("refetches runs and clashes after a runs change, revisions after a new revision, the team after a team change", () => {
    expect(staleQueryKeys("p1", { kind: "runs", id: "r", revision: 1 })).toEqual([
      ["projects", "p1", "runs"],
      ["projects", "p1", "clashes"],
    ]);
    expect(staleQueryKeys("p1", { kind: "revision", id: "r", revision: 3 })).toEqual([["projects", "p1", "models"]]);
    expect(staleQueryKeys("p1", { kind: "member", id: "u", revision: null })).toEqual([["projects", "p1", "members"]]);
    expect(staleQueryKeys("p1", { kind: "pins", id: "p1", revision: null })).toEqual([["projects", "p1", "pins"]]);
  });

  it("refetches exactly the job a progress bar follows after that job moves", () => {
    expect(staleQueryKeys("p1", { kind: "job", id: "j1", revision: null })).toEqual([jobKey("p1", "j1")]);
  });

  it("refetches every revision's list of reports after a report is stored, and the settings after they change", () => {
    const [reports] = staleQueryKeys("p1", { kind: "report", id: "j1", revision: 2 });
    // a prefix: the list of the revision the page shows, whichever it is
    expect(reportsKey("p1", 2).slice(0, reports.length)).toEqual(reports);
    expect(reportsKey("p1", 5).slice(0, reports.length)).toEqual(reports);
    expect(staleQueryKeys("p1", { kind: "settings", id: "p1", revision: null })).toEqual([settingsKey("p1")]);
  });
});
