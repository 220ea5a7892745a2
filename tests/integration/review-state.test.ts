// Issue 17 item 16: the project overview says where the review stands (threads by state, the revision under review
// and its clashes by outcome, the last session). The counts are checked against rows this test writes itself.
import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db/client";
import { getReviewState } from "@/db/queries/review-state";
import { clashes, modelRevisions, pins, reviewSessions } from "@/db/schema";
import { generateRoof } from "@/lib/analysis/generator";
import { closeDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";

let fx: ProjectFixture;
let other: ProjectFixture;

async function addRevision(projectId: string, number: number, isCurrent: boolean) {
  const model = generateRoof({ name: `r${number}`, spanX: 6, spanY: 6, module: 3, depth: 1.5 });
  const [row] = await getDb()
    .insert(modelRevisions)
    .values({ projectId, number, name: `r${number}`, model, source: "generated", memberCount: model.members.length, isCurrent })
    .returning();
  return row.id;
}

function clash(projectId: string, revisionId: string, key: string, extra: Partial<typeof clashes.$inferInsert> = {}) {
  return { projectId, revisionId, clashKey: key, memberId: "D-0-0-SW", runId: "SA-01", segmentIndex: 0, kind: "hard" as const, gap: -0.01, depth: 0.01, requiredClearance: 0.05, pointX: 0, pointY: 0, pointZ: 1, ...extra };
}

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("review-state");
  other = await createProjectFixture("review-state-other");
  const db = getDb();
  const current = await addRevision(fx.projectId, 1, true);
  const newer = await addRevision(fx.projectId, 2, false);
  await db.insert(clashes).values([
    clash(fx.projectId, current, "a"),
    clash(fx.projectId, current, "b", { outcome: "reroute_run" }),
    clash(fx.projectId, current, "c", { outcome: "reroute_run", recheckReason: "now carries 12.4 kN in wind uplift" }),
    clash(fx.projectId, current, "d", { outcome: "opening_accepted", status: "closed" }),
    // On the newer revision, which is not the one under review: not counted.
    clash(fx.projectId, newer, "e", { outcome: "opening_refused" }),
  ]);
  const pin = (projectId: string, authorId: string, state: "open" | "answered" | "closed") => ({ id: randomUUID(), projectId, anchorKind: "member" as const, anchorId: "D-0-0-SW", title: "Can this go?", state, discipline: "mep" as const, authorId });
  await db.insert(pins).values([pin(fx.projectId, fx.users.architect.id, "open"), pin(fx.projectId, fx.users.architect.id, "open"), pin(fx.projectId, fx.users.mep_engineer.id, "closed"), pin(other.projectId, other.users.architect.id, "answered")]);
  await db.insert(reviewSessions).values([
    { projectId: fx.projectId, presenterId: fx.users.owner.id, startedAt: new Date("2026-11-30T09:00:00Z"), endedAt: new Date("2026-11-30T10:00:00Z") },
    { projectId: fx.projectId, presenterId: fx.users.structural_engineer.id, startedAt: new Date("2026-12-01T09:00:00Z"), endedAt: new Date("2026-12-01T11:30:00Z") },
  ]);
});

afterAll(async () => {
  await closeDb();
});

describe("getReviewState", () => {
  it("counts threads, the current revision's active clashes by outcome and re-checks, and names the last session", async () => {
    const state = await getReviewState({ db: getDb(), projectId: fx.projectId });
    expect(state.threads).toEqual({ open: 2, answered: 0, closed: 1 });
    expect(state.revision).toMatchObject({ number: 1, name: "r1", isCurrent: true });
    expect(state.clashes.total).toBe(3);
    expect(state.clashes.needsAnotherLook).toBe(1);
    expect(Object.fromEntries(state.clashes.byOutcome.map((row) => [String(row.outcome), row.count]))).toEqual({ null: 1, reroute_run: 2 });
    expect(state.lastSession).toEqual({ presenterName: fx.users.structural_engineer.name, startedAt: "2026-12-01T09:00:00.000Z", endedAt: "2026-12-01T11:30:00.000Z" });
  });

  it("falls back to the newest revision when none is current, and is empty for a project with nothing yet", async () => {
    await addRevision(other.projectId, 1, false);
    await addRevision(other.projectId, 2, false);
    const state = await getReviewState({ db: getDb(), projectId: other.projectId });
    expect(state.revision).toMatchObject({ number: 2, isCurrent: false });
    expect(state.threads).toEqual({ open: 0, answered: 1, closed: 0 });
    expect(state.clashes).toEqual({ byOutcome: [], needsAnotherLook: 0, total: 0 });
    expect(state.lastSession).toBeNull();
    const empty = await createProjectFixture("review-state-empty");
    expect(await getReviewState({ db: getDb(), projectId: empty.projectId })).toEqual({ threads: { open: 0, answered: 0, closed: 0 }, revision: null, clashes: { byOutcome: [], needsAnotherLook: 0, total: 0 }, lastSession: null });
  });
});
