// Issue 16, item 1: decisions on clashes are append-only. Overwrite attempts are refused, the proposer of an
// opening cannot decide it, only the structural engineer supersedes (with a reason), and the database itself
// refuses to rewrite a history entry. Attacker cases first: outsider, viewer, wrong role, self-acceptance.
import { randomUUID } from "node:crypto";
import { eq, sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { PUT as ASSIGN } from "@/app/api/projects/[projectId]/clashes/[clashId]/assignment/route";
import { POST as DECIDE } from "@/app/api/projects/[projectId]/clashes/[clashId]/decision/route";
import { POST as PROPOSE } from "@/app/api/projects/[projectId]/clashes/[clashId]/proposal/route";
import { GET as GET_CLASH } from "@/app/api/projects/[projectId]/clashes/[clashId]/route";
import { POST as SUPERSEDE } from "@/app/api/projects/[projectId]/clashes/[clashId]/supersession/route";
import { createRevisionWithAnalysis } from "@/lib/commands/create-analysed-revision";
import { clashDecisions, clashes, memberships } from "@/db/schema";
import { generateRoof } from "@/lib/analysis/generator";
import { analyseForStorage } from "@/lib/models/analyse";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createFixtureUser, createProjectFixture, type FixtureUser, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

let fx: ProjectFixture;
let secondEngineer: FixtureUser;
let revisionId: string;

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("clash-decisions");
  secondEngineer = await createFixtureUser("clash-decisions-se2");
  await getDb().insert(memberships).values({ projectId: fx.projectId, userId: secondEngineer.id, role: "structural_engineer" });
  const model = generateRoof({ name: "Decisions roof", spanX: 9, spanY: 9, module: 3, depth: 2 });
  const { result, review } = analyseForStorage(model, "EN1993-1-1");
  revisionId = (await createRevisionWithAnalysis({ projectId: fx.projectId, name: "r1", model, source: "generated", createdBy: fx.users.structural_engineer.id, result, review })).id;
});
afterAll(closeDb);

async function newClash(memberId = "TCY-1-0") {
  const [row] = await getDb()
    .insert(clashes)
    .values({ projectId: fx.projectId, revisionId, clashKey: `k-${randomUUID().slice(0, 8)}`, memberId, runId: "SA-01", segmentIndex: 0, kind: "hard", gap: -0.02, depth: 0.02, requiredClearance: 0.05, pointX: 1.5, pointY: 0, pointZ: 2 })
    .returning();
  const base = `/api/projects/${fx.projectId}/clashes/${row.id}`;
  const cctx = routeContext({ projectId: fx.projectId, clashId: row.id });
  type Handler = (request: Request, context: typeof cctx) => Promise<Response>;
  const post = (handler: Handler, step: string, user: FixtureUser | undefined, body: unknown) => buildRequest(`${base}/${step}`, { method: "POST", body, user }).then((r) => handler(r, cctx));
  return {
    id: row.id,
    propose: (user: FixtureUser | undefined, body: unknown) => post(PROPOSE, "proposal", user, body),
    decide: (user: FixtureUser | undefined, body: unknown) => post(DECIDE, "decision", user, body),
    supersede: (user: FixtureUser | undefined, body: unknown) => post(SUPERSEDE, "supersession", user, body),
    assign: (user: FixtureUser | undefined, body: unknown) => buildRequest(`${base}/assignment`, { method: "PUT", body, user }).then((r) => ASSIGN(r, cctx)),
    read: async () => (await GET_CLASH(await buildRequest(base, { user: fx.users.viewer }), cctx)).json(),
  };
}

const OPENING = { outcome: "opening_proposed", note: "Duct cannot drop: ceiling height." };
const CONDITIONS = { outcome: "opening_accepted", conditions: "Sleeved opening 250 mm at mid-length, no welding on site." };

describe("a proposal never replaces a decision", () => {
  it("refuses a reroute proposal over an accepted opening (409) and keeps the conditions", async () => {
    const clash = await newClash();
    expect((await clash.propose(fx.users.mep_engineer, OPENING)).status).toBe(200);
    expect((await clash.decide(fx.users.structural_engineer, CONDITIONS)).status).toBe(200);

    const overwrite = await clash.propose(fx.users.mep_engineer, { outcome: "reroute_run", note: "Actually, reroute." });
    expect(overwrite.status).toBe(409);
    expect((await overwrite.json()).error).toMatch(/cannot replace a decision/);
    // The structural engineer cannot overwrite by proposing either, nor decide a second time.
    expect((await clash.propose(fx.users.structural_engineer, { outcome: "no_conflict" })).status).toBe(409);
    expect((await clash.decide(secondEngineer, { outcome: "opening_refused", reason: "Changed my mind on this one." })).status).toBe(409);

    const { clash: after, history } = await clash.read();
    expect(after).toMatchObject({ outcome: "opening_accepted", conditions: CONDITIONS.conditions, decidedBy: fx.users.structural_engineer.name });
    expect(history.map((h: { kind: string }) => h.kind)).toEqual(["proposal", "decision"]);
  });

  it("refuses the proposal roles and outsiders, and unknown clashes", async () => {
    const clash = await newClash();
    expect((await clash.propose(undefined, OPENING)).status).toBe(401);
    expect((await clash.propose(fx.users.outsider, OPENING)).status).toBe(404);
    for (const role of ["viewer", "architect", "owner"] as const) expect((await clash.propose(fx.users[role], OPENING)).status).toBe(403);
    const ghost = routeContext({ projectId: fx.projectId, clashId: randomUUID() });
    const missing = await PROPOSE(await buildRequest(`/api/projects/${fx.projectId}/clashes/x/proposal`, { method: "POST", body: OPENING, user: fx.users.mep_engineer }), ghost);
    expect(missing.status).toBe(404);
  });
});

describe("proposer and decider of an opening are two people", () => {
  it("refuses a structural engineer accepting the opening they proposed; another structural engineer may", async () => {
    const clash = await newClash();
    expect((await clash.propose(fx.users.structural_engineer, OPENING)).status).toBe(200);
    const self = await clash.decide(fx.users.structural_engineer, CONDITIONS);
    expect(self.status).toBe(403);
    expect((await self.json()).error).toMatch(/two people/);
    expect((await clash.decide(fx.users.structural_engineer, { outcome: "opening_refused", reason: "Refusing my own proposal." })).status).toBe(403);
    for (const role of ["mep_engineer", "owner", "architect", "viewer"] as const) expect((await clash.decide(fx.users[role], CONDITIONS)).status).toBe(403);
    expect((await clash.read()).history.map((h: { kind: string }) => h.kind)).toEqual(["proposal"]);

    expect((await clash.decide(secondEngineer, CONDITIONS)).status).toBe(200);
  });

  it("decides only what was proposed: an opening is accepted or refused, other outcomes confirmed", async () => {
    const clash = await newClash();
    expect((await clash.decide(fx.users.structural_engineer, CONDITIONS)).status, "nothing proposed yet").toBe(409);
    await clash.propose(fx.users.mep_engineer, { outcome: "reroute_run", note: "Drop below the bottom chord." });
    expect((await clash.decide(fx.users.structural_engineer, CONDITIONS)).status).toBe(409);
    expect((await clash.decide(fx.users.structural_engineer, { outcome: "no_conflict" })).status).toBe(409);
    const noReason = await clash.decide(fx.users.structural_engineer, { outcome: "opening_refused", reason: "" });
    expect(noReason.status).toBe(400);
    expect((await clash.decide(fx.users.structural_engineer, { outcome: "reroute_run" })).status).toBe(200);
    expect((await clash.read()).clash).toMatchObject({ outcome: "reroute_run", decidedBy: fx.users.structural_engineer.name });
  });

  it("records a refused opening with its reason", async () => {
    const clash = await newClash();
    await clash.propose(fx.users.mep_engineer, OPENING);
    const refused = await clash.decide(fx.users.structural_engineer, { outcome: "opening_refused", reason: "Works in compression under wind uplift." });
    expect(refused.status).toBe(200);
    const { clash: after, history } = await clash.read();
    expect(after).toMatchObject({ outcome: "opening_refused", note: "Works in compression under wind uplift.", conditions: null });
    expect(history[1]).toMatchObject({ kind: "decision", outcome: "opening_refused", reason: "Works in compression under wind uplift.", role: "structural_engineer", revision: 1 });
  });
});

describe("only the structural engineer supersedes a decision, with a reason", () => {
  it("keeps the decision and the supersession side by side, then allows a new proposal", async () => {
    const clash = await newClash();
    await clash.propose(fx.users.mep_engineer, OPENING);
    await clash.decide(fx.users.structural_engineer, CONDITIONS);
    for (const role of ["mep_engineer", "owner", "architect", "viewer"] as const) expect((await clash.supersede(fx.users[role], { reason: "I would like to reroute instead." })).status).toBe(403);
    expect((await clash.supersede(fx.users.structural_engineer, { reason: "" })).status).toBe(400);
    expect((await clash.supersede(fx.users.structural_engineer, { reason: "Ceiling lowered: the duct can pass below the grid." })).status).toBe(200);
    expect((await clash.supersede(fx.users.structural_engineer, { reason: "Twice is not possible." })).status, "nothing stands any more").toBe(409);

    const { clash: after, history } = await clash.read();
    expect(after).toMatchObject({ outcome: null, decidedBy: null, conditions: null });
    expect(history.map((h: { kind: string }) => h.kind)).toEqual(["proposal", "decision", "supersession"]);
    expect(history[2]).toMatchObject({ outcome: "opening_accepted", reason: "Ceiling lowered: the duct can pass below the grid.", supersedesId: history[1].id });
    expect(history[1]).toMatchObject({ conditions: CONDITIONS.conditions });

    expect((await clash.propose(fx.users.mep_engineer, { outcome: "reroute_run" })).status).toBe(200);
  });

  it("the database refuses to rewrite a history entry", async () => {
    const clash = await newClash();
    await clash.propose(fx.users.mep_engineer, OPENING);
    await expect(getDb().update(clashDecisions).set({ note: "rewritten" }).where(eq(clashDecisions.clashId, clash.id))).rejects.toThrow();
    const [entry] = await getDb().select().from(clashDecisions).where(eq(clashDecisions.clashId, clash.id));
    expect(entry.note).toBe(OPENING.note);
    // Clearing a deleted account's reference (ON DELETE SET NULL) stays possible.
    await getDb().execute(sql`update clash_decisions set decided_by = null where clash_id = ${clash.id}`);
  });
});

describe("assignee and due date", () => {
  it("sets them for MEP and structural engineers, only to team members", async () => {
    const clash = await newClash();
    const body = { assigneeId: fx.users.mep_engineer.id, dueOn: "2027-01-15" };
    expect((await clash.assign(fx.users.viewer, body)).status).toBe(403);
    expect((await clash.assign(fx.users.architect, body)).status).toBe(403);
    expect((await clash.assign(fx.users.structural_engineer, { assigneeId: fx.users.outsider.id, dueOn: null })).status).toBe(400);
    expect((await clash.assign(fx.users.structural_engineer, { assigneeId: fx.users.mep_engineer.id, dueOn: "15/01/2027" })).status).toBe(400);
    expect((await clash.assign(fx.users.structural_engineer, body)).status).toBe(200);
    expect((await clash.read()).clash).toMatchObject({ assigneeId: fx.users.mep_engineer.id, assignee: fx.users.mep_engineer.name, dueOn: "2027-01-15" });
  });
});
