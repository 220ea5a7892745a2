// Issue 16, item 3: the revision comparison (GET …/models/compare?from=&to=, lib/models/compare-revisions.ts).
// Revision 2 of a generated 9 m × 9 m roof drops one diagonal, resizes one chord, adds one member and holds the
// west edge chord TCY-0-1's two ends along it (so, by statics, it carries nothing in any result: its state and its
// verdict change); its clashes: one kept but needing another look, one added, one closed with a reason.
import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as COMPARE } from "@/app/api/projects/[projectId]/models/compare/route";
import { createRevisionWithAnalysis } from "@/lib/commands/create-analysed-revision";
import { clashes } from "@/db/schema";
import { generateRoof } from "@/lib/analysis/generator";
import type { TrussModel } from "@/lib/analysis/model";
import { analyseForStorage } from "@/lib/models/analyse";
import type { RevisionComparison } from "@/lib/models/compare-revisions";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

let fx: ProjectFixture;
const key = () => `k-${randomUUID().slice(0, 8)}`;
const [kept, gone, fresh] = [key(), key(), key()];

async function store(name: string, model: TrussModel) {
  const { result, review } = analyseForStorage(model, "EN1993-1-1");
  expect(result.status).toBe("ok");
  return createRevisionWithAnalysis({ projectId: fx.projectId, name, model, source: "uploaded", createdBy: fx.users.structural_engineer.id, result, review });
}

function clash(revisionId: string, clashKey: string, memberId: string, extra: Partial<typeof clashes.$inferInsert> = {}) {
  return { projectId: fx.projectId, revisionId, clashKey, memberId, runId: "SA-01", segmentIndex: 0, kind: "hard" as const, gap: -0.02, depth: 0.02, requiredClearance: 0.05, pointX: 0, pointY: 0, pointZ: 1, ...extra };
}

const compare = async (query: string, user = fx.users.viewer) =>
  COMPARE(await buildRequest(`/api/projects/${fx.projectId}/models/compare?${query}`, { user }), routeContext({ projectId: fx.projectId }));

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("revision-comparison");
  const base = generateRoof({ name: "r1", spanX: 9, spanY: 9, module: 3, depth: 2 });
  const changed = structuredClone(base) as TrussModel;
  changed.members = changed.members.filter((m) => m.id !== "D-1-1-NE");
  const other = changed.sections.find((s) => s.id !== changed.members.find((m) => m.id === "TCX-1-1")!.section)!;
  changed.members = changed.members.map((m) => (m.id === "TCX-1-1" ? { ...m, section: other.id } : m));
  changed.members.push({ id: "X-1", i: "B-0-0", j: "B-1-1", section: other.id });
  changed.supports = changed.supports.map((s) => (s.node === "T-0-1" || s.node === "T-0-2" ? { ...s, uy: true } : s));
  const r1 = await store("r1", base);
  const r2 = await store("r2", changed);
  await getDb().insert(clashes).values([
    clash(r1.id, kept, "TCY-1-0"),
    clash(r1.id, gone, "D-1-1-NE"),
    clash(r2.id, kept, "TCY-1-0", { recheckReason: "TCY-1-0 now carries 12.4 kN compression in ULS-2." }),
    clash(r2.id, gone, "D-1-1-NE", { status: "closed", closedReason: "Member D-1-1-NE is not in revision 2." }),
    clash(r2.id, fresh, "X-1"),
  ]);
});
afterAll(closeDb);

describe("comparing two revisions", () => {
  it("lists members added, removed and resized, force-state and verdict changes per result, and the clashes' changes", async () => {
    const response = await compare("from=1&to=2");
    expect(response.status).toBe(200);
    const { comparison } = (await response.json()) as { comparison: RevisionComparison };
    expect(comparison.members.added).toEqual(["X-1"]);
    expect(comparison.members.removed).toEqual(["D-1-1-NE"]);
    expect(comparison.members.resized).toHaveLength(1);
    expect(comparison.members.resized[0].memberId).toBe("TCX-1-1");
    // Every result of both is compared; TCY-0-1 is zero in each of revision 2's (its ends are held along it).
    expect(comparison.results.map((r) => r.id).sort()).toEqual(["ULS-1", "ULS-2", "ULS-3", "SLS-1", "dead", "services", "snow", "wind-uplift"].sort());
    expect(comparison.resultsNotCompared).toEqual([]);
    for (const result of comparison.results) {
      const change = result.changes.find((c) => c.memberId === "TCY-0-1");
      expect(change?.b.state, result.id).toBe("zero-force");
      expect(change?.a.state).not.toBe("zero-force");
      expect(result.changes.some((c) => c.memberId === "D-1-1-NE" || c.memberId === "X-1")).toBe(false);
    }
    expect(comparison.verdicts).toContainEqual({ memberId: "TCY-0-1", from: "load-bearing", to: "idle" });
    expect(comparison.clashes.added.map((c) => c.clashKey)).toEqual([fresh]);
    expect(comparison.clashes.resolved.map((c) => [c.clashKey, c.why])).toEqual([[gone, "Member D-1-1-NE is not in revision 2."]]);
    expect(comparison.clashes.needsAnotherLook.map((c) => [c.clashKey, c.recheckReason])).toEqual([[kept, "TCY-1-0 now carries 12.4 kN compression in ULS-2."]]);
    expect(comparison.notes).toEqual([]);
  });

  it("refuses outsiders, a missing revision and the same revision twice", async () => {
    expect((await COMPARE(await buildRequest(`/api/projects/${fx.projectId}/models/compare?from=1&to=2`), routeContext({ projectId: fx.projectId }))).status).toBe(401);
    expect((await compare("from=1&to=2", fx.users.outsider)).status).toBe(404);
    const missing = await compare("from=1&to=9");
    expect(missing.status).toBe(404);
    expect((await missing.json()).error).toMatch(/Revision 9/);
    expect((await compare("from=2&to=2")).status).toBe(400);
    expect((await compare("from=1")).status).toBe(400);
  });
});
