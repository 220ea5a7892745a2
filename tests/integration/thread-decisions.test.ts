// Issue 16 item 1 for pins' threads: the record of a thread (proposals, decisions, supersessions) is append-only
// like a clash's history. Attacker cases first: a viewer, an outsider and a member removed a second ago are refused
// and nothing is stored; the proposer cannot decide their own proposal (two people, as for clash openings); a
// proposal or a second decision never replaces a standing decision; only the structural engineer supersedes, with
// a reason; the database refuses to rewrite or delete a step. Then what a step records: the role then, the
// conditions, the current revision and its result set, the standing caution (lib/review/caution.ts), and the mails.
import { randomUUID } from "node:crypto";
import { and, eq, like, sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as GET_THREAD } from "@/app/api/projects/[projectId]/pins/[pinId]/comments/route";
import { setCurrentRevision } from "@/db/queries/models";
import { analysisRuns, auditEvents, comments, mailOutbox, memberships, pins } from "@/db/schema";
import { generateRoof } from "@/lib/analysis/generator";
import { createRevisionWithAnalysis } from "@/lib/commands/create-analysed-revision";
import { postComment } from "@/lib/commands/post-comment";
import { analyseForStorage } from "@/lib/models/analyse";
import type { CommentKind, PresentedComment } from "@/lib/realtime/events";
import { STANDING_CAUTION } from "@/lib/review/caution";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createFixtureUser, createProjectFixture, type FixtureUser, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

let fx: ProjectFixture;
let secondEngineer: FixtureUser;
let first: { id: string; number: number };

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("thread-decisions");
  secondEngineer = await createFixtureUser("thread-decisions-se2");
  await getDb().insert(memberships).values({ projectId: fx.projectId, userId: secondEngineer.id, role: "structural_engineer" });
  const model = generateRoof({ name: "Thread roof", spanX: 9, spanY: 9, module: 3, depth: 2 });
  const { result, review } = analyseForStorage(model, "EN1993-1-1");
  const store = (name: string) => createRevisionWithAnalysis({ projectId: fx.projectId, name, model, source: "generated", createdBy: fx.users.structural_engineer.id, result, review });
  first = await store("r1");
  // A newer revision that is not current: steps are judged on the current one (revision 1), not the newest.
  await store("r2 (test upload)");
  await setCurrentRevision(getDb(), { projectId: fx.projectId, revisionId: first.id });
});
afterAll(closeDb);

async function newThread(): Promise<string> {
  const id = randomUUID();
  await getDb().insert(pins).values({ id, projectId: fx.projectId, anchorKind: "member", anchorId: "BCX-1-1", title: `Opening in BCX-1-1 ${id.slice(0, 4)}`, discipline: "mep", authorId: fx.users.architect.id });
  return id;
}

function say(pinId: string, user: FixtureUser, kind: CommentKind, body: string, conditions?: string) {
  return postComment({ id: randomUUID(), projectId: fx.projectId, pinId, authorId: user.id, authorName: user.name, body, kind, conditions });
}

async function stored(pinId: string) {
  return getDb().select().from(comments).where(eq(comments.pinId, pinId)).orderBy(comments.createdAt);
}

async function thread(pinId: string, user: FixtureUser): Promise<Response> {
  return GET_THREAD(await buildRequest(`/api/projects/${fx.projectId}/pins/${pinId}/comments`, { user }), routeContext({ projectId: fx.projectId, pinId }));
}

describe("who may add to a thread's record", () => {
  it("refuses a viewer, an outsider and a member removed a second ago, storing nothing", async () => {
    const pinId = await newThread();
    await expect(say(pinId, fx.users.viewer, "proposal", "Cut the chord.")).rejects.toMatchObject({ status: 403 });
    await expect(say(pinId, fx.users.viewer, "comment", "Looks fine.")).rejects.toMatchObject({ status: 403 });
    await expect(say(pinId, fx.users.outsider, "decision", "Accepted.")).rejects.toMatchObject({ status: 403 });
    const leaver = await createFixtureUser("thread-decisions-leaver");
    await getDb().insert(memberships).values({ projectId: fx.projectId, userId: leaver.id, role: "structural_engineer" });
    await getDb().delete(memberships).where(and(eq(memberships.projectId, fx.projectId), eq(memberships.userId, leaver.id)));
    await expect(say(pinId, leaver, "decision", "Opening accepted.")).rejects.toMatchObject({ status: 403 });
    expect(await stored(pinId)).toEqual([]);
    // Reading the thread: the outsider is refused, the viewer may read.
    expect((await thread(pinId, fx.users.outsider)).status).toBe(404);
    expect((await thread(pinId, fx.users.viewer)).status).toBe(200);
  });

  it("finds no pin of another project: a step sent with its pin id answers nothing and stores nothing there", async () => {
    const other = await createProjectFixture("thread-decisions-other");
    const theirs = randomUUID();
    await getDb().insert(pins).values({ id: theirs, projectId: other.projectId, anchorKind: "member", anchorId: "BCX-1-1", title: "Their thread", discipline: "mep", authorId: other.users.architect.id });
    for (const kind of ["proposal", "decision", "supersession", "comment"] as const) {
      expect(await postComment({ id: randomUUID(), projectId: fx.projectId, pinId: theirs, authorId: fx.users.structural_engineer.id, authorName: "x", body: "Opening accepted.", kind })).toBeNull();
    }
    expect(await stored(theirs)).toEqual([]);
  });

  it("lets only the structural engineer decide and supersede", async () => {
    const pinId = await newThread();
    await expect(say(pinId, fx.users.architect, "decision", "Accepted.")).rejects.toMatchObject({ status: 403, message: "Only the structural engineer records decisions." });
    await expect(say(pinId, fx.users.mep_engineer, "decision", "Accepted.")).rejects.toMatchObject({ status: 403 });
    await say(pinId, fx.users.mep_engineer, "proposal", "Opening of 300 mm through BCX-1-1.");
    await say(pinId, fx.users.structural_engineer, "decision", "No opening in BCX-1-1.");
    await expect(say(pinId, fx.users.mep_engineer, "supersession", "We need it.")).rejects.toMatchObject({ status: 403, message: "Only the structural engineer supersedes a decision." });
    expect((await stored(pinId)).map((c) => c.kind)).toEqual(["proposal", "decision"]);
  });

  it("refuses self-acceptance: the proposer may not decide their own proposal; another structural engineer may", async () => {
    const pinId = await newThread();
    await say(pinId, fx.users.structural_engineer, "proposal", "A 150 mm sleeve through BCX-1-1 at mid-length.");
    await expect(say(pinId, fx.users.structural_engineer, "decision", "Accepted.", "Sleeve 150 mm.")).rejects.toMatchObject({
      status: 403,
      message: "You proposed this; another structural engineer must decide it (proposer and decider are two people).",
    });
    const decided = await say(pinId, secondEngineer, "decision", "Accepted.", "Sleeve 150 mm at mid-length only.");
    expect(decided?.comment).toMatchObject({ kind: "decision", author: { id: secondEngineer.id }, conditions: "Sleeve 150 mm at mid-length only." });
  });

  it("refuses self-acceptance with nothing proposed: a decision answers someone else's open proposal (409), nothing stored", async () => {
    // Without this, the structural engineer could accept an opening on their own by deciding straight away.
    const refused = { status: 409, message: "Nothing is proposed on this thread: a decision answers someone else's proposal (proposer and decider are two people)." };
    const pinId = await newThread();
    await expect(say(pinId, fx.users.structural_engineer, "decision", "Opening accepted.", "Sleeve 150 mm.")).rejects.toMatchObject(refused);
    expect(await stored(pinId)).toEqual([]);
    // A superseded decision answered its proposal: deciding again needs a new one.
    await say(pinId, fx.users.mep_engineer, "proposal", "Opening of 150 mm through BCX-1-1.");
    await say(pinId, secondEngineer, "decision", "Opening refused.");
    await say(pinId, fx.users.structural_engineer, "supersession", "The duct was resized; the refusal was about the 300 mm one.");
    await expect(say(pinId, fx.users.structural_engineer, "decision", "Opening accepted.")).rejects.toMatchObject(refused);
    expect((await stored(pinId)).map((c) => c.kind)).toEqual(["proposal", "decision", "supersession"]);
  });
});

describe("a proposal never replaces a decision", () => {
  it("refuses a proposal and a second decision over a standing decision (409), and keeps its conditions", async () => {
    const pinId = await newThread();
    await say(pinId, fx.users.mep_engineer, "proposal", "Opening of 300 mm through BCX-1-1 for the supply duct.");
    const decision = await say(pinId, fx.users.structural_engineer, "decision", "Opening accepted.", "Sleeved, 300 mm, clear of the nodes by 500 mm.");
    await expect(say(pinId, fx.users.mep_engineer, "proposal", "Reroute the run instead.")).rejects.toMatchObject({
      status: 409,
      message: "This thread is decided. A proposal cannot replace a decision; the structural engineer can supersede it, with a reason.",
    });
    await expect(say(pinId, secondEngineer, "decision", "No opening.")).rejects.toMatchObject({ status: 409 });
    // A plain comment is still welcome.
    await say(pinId, fx.users.mep_engineer, "comment", "Thanks, ordering sleeves.");
    // A retried decision id with another text answers the stored one and changes nothing.
    const retry = await postComment({ id: decision!.comment.id, projectId: fx.projectId, pinId, authorId: secondEngineer.id, authorName: secondEngineer.name, body: "No opening.", kind: "decision" });
    expect(retry).toMatchObject({ created: false, comment: { body: "Opening accepted.", conditions: "Sleeved, 300 mm, clear of the nodes by 500 mm." } });
    expect((await stored(pinId)).map((c) => [c.kind, c.body])).toEqual([
      ["proposal", "Opening of 300 mm through BCX-1-1 for the supply duct."],
      ["decision", "Opening accepted."],
      ["comment", "Thanks, ordering sleeves."],
    ]);
  });

  it("the structural engineer supersedes with a reason; the history keeps both and proposals are taken again", async () => {
    const pinId = await newThread();
    await say(pinId, fx.users.mep_engineer, "proposal", "Opening of 200 mm through BCX-1-1.");
    const decision = await say(pinId, fx.users.structural_engineer, "decision", "Opening accepted.", "Sleeved, 200 mm.");
    const supersession = await say(pinId, secondEngineer, "supersession", "Revision 2 moves the duct onto the node; the opening would cut the gusset.");
    expect(supersession?.comment).toMatchObject({ kind: "supersession", supersedesId: decision!.comment.id, role: "structural_engineer" });
    await expect(say(pinId, secondEngineer, "supersession", "Again.")).rejects.toMatchObject({ status: 409, message: "There is no standing decision on this thread to supersede." });
    await say(pinId, fx.users.mep_engineer, "proposal", "Reroute below the bottom chord.");
    const answer = await (await thread(pinId, fx.users.viewer)).json();
    expect(answer.comments.map((c: PresentedComment) => c.kind)).toEqual(["proposal", "decision", "supersession", "proposal"]);
    expect(answer.comments[1]).toMatchObject({ body: "Opening accepted.", conditions: "Sleeved, 200 mm." });
  });
});

/** The database's refusal of a write (drizzle wraps PostgreSQL's error as its cause), or "written". */
function refusal(write: PromiseLike<unknown>): Promise<string> {
  return Promise.resolve(write).then(
    () => "written",
    (error: Error & { cause?: Error }) => error.cause?.message ?? error.message,
  );
}

describe("the database keeps the record", () => {
  it("refuses to change or delete a step, but not a plain comment; deleting the pin takes its thread", async () => {
    const pinId = await newThread();
    await say(pinId, fx.users.mep_engineer, "proposal", "Opening of 150 mm through BCX-1-1.");
    const decision = await say(pinId, fx.users.structural_engineer, "decision", "Opening accepted.", "Sleeved, 150 mm.");
    const chat = await say(pinId, fx.users.mep_engineer, "comment", "Noted.");
    const id = decision!.comment.id;
    const db = getDb();
    expect(await refusal(db.update(comments).set({ body: "Opening refused." }).where(eq(comments.id, id)))).toMatch(/append-only/);
    expect(await refusal(db.update(comments).set({ conditions: null }).where(eq(comments.id, id)))).toMatch(/append-only/);
    expect(await refusal(db.update(comments).set({ kind: "comment" }).where(eq(comments.id, id)))).toMatch(/append-only/);
    expect(await refusal(db.update(comments).set({ kind: "decision" }).where(eq(comments.id, chat!.comment.id)))).toMatch(/append-only/);
    expect(await refusal(db.execute(sql`delete from comments where id = ${id}`))).toMatch(/append-only/);
    await db.update(comments).set({ body: "Noted, thanks." }).where(eq(comments.id, chat!.comment.id));
    expect((await stored(pinId)).map((c) => [c.kind, c.body, c.conditions])).toEqual([
      ["proposal", "Opening of 150 mm through BCX-1-1.", null],
      ["decision", "Opening accepted.", "Sleeved, 150 mm."],
      ["comment", "Noted, thanks.", null],
    ]);
    await db.delete(pins).where(eq(pins.id, pinId));
    expect(await stored(pinId)).toEqual([]);
  });
});

describe("what a step records", () => {
  it("the role then, the conditions, the current revision and its result set, and the standing caution", async () => {
    const pinId = await newThread();
    const [run] = await getDb().select({ id: analysisRuns.id }).from(analysisRuns).where(eq(analysisRuns.revisionId, first.id));
    await say(pinId, fx.users.mep_engineer, "proposal", "Opening of 250 mm through BCX-1-1.");
    const decision = await say(pinId, fx.users.structural_engineer, "decision", "Opening accepted.", "Sleeved, 250 mm, mid-length only.");
    const expected = { role: "structural_engineer", conditions: "Sleeved, 250 mm, mid-length only.", revision: first.number, analysisRunId: run.id, caution: STANDING_CAUTION, supersedesId: null };
    expect(decision?.comment).toMatchObject(expected);
    const answer = await (await thread(pinId, fx.users.viewer)).json();
    expect(answer.comments[0]).toMatchObject({ kind: "proposal", role: "mep_engineer", revision: first.number, analysisRunId: run.id, caution: STANDING_CAUTION, conditions: null });
    expect(answer.comments[1]).toMatchObject(expected);
    // A plain comment records its writer's role, nothing of the record.
    const chat = await say(pinId, fx.users.architect, "comment", "Fine by the ceiling.");
    expect(chat?.comment).toMatchObject({ role: "architect", revision: null, analysisRunId: null, caution: null });
    // Conditions belong to a decision only.
    const proposal = await postComment({ id: randomUUID(), projectId: fx.projectId, pinId: await newThread(), authorId: fx.users.mep_engineer.id, authorName: "x", body: "p", kind: "proposal", conditions: "ignored" });
    expect(proposal?.comment.conditions).toBeNull();
    const audit = await getDb().select().from(auditEvents).where(and(eq(auditEvents.subjectId, pinId), eq(auditEvents.action, "thread.decision")));
    expect(audit).toHaveLength(1);
    expect(audit[0].details).toMatchObject({ conditions: "Sleeved, 250 mm, mid-length only.", revisionId: first.id, analysisRunId: run.id });
  });

  it("mails a proposal as a proposal to the structural engineers, and the decision with its conditions to the thread", async () => {
    const pinId = await newThread();
    const proposal = await say(pinId, fx.users.mep_engineer, "proposal", "Opening of 200 mm through BCX-1-1.");
    const proposalMails = await getDb().select().from(mailOutbox).where(like(mailOutbox.dedupeKey, `%:${proposal!.comment.id}:%`));
    expect(proposalMails.map((m) => m.kind)).toEqual(["proposal", "proposal"]);
    expect(proposalMails.map((m) => m.toAddress).sort()).toEqual([fx.users.structural_engineer.email, secondEngineer.email].sort());
    expect(proposalMails[0].textBody).toContain("This is a proposal, not a decision");
    const decision = await say(pinId, secondEngineer, "decision", "Opening accepted.", "Sleeved, 200 mm.");
    const decisionMails = await getDb().select().from(mailOutbox).where(like(mailOutbox.dedupeKey, `%:${decision!.comment.id}:%`));
    // The pin's author (architect) and the proposer (MEP engineer); never the decider.
    expect(decisionMails.map((m) => m.toAddress).sort()).toEqual([fx.users.architect.email, fx.users.mep_engineer.email].sort());
    expect(decisionMails.every((m) => m.kind === "decision")).toBe(true);
    expect(decisionMails[0].textBody).toContain("Conditions: Sleeved, 200 mm.");
    expect(decisionMails[0].textBody).toContain(STANDING_CAUTION);
  });
});
