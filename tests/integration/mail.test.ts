// Mail end to end: queued in the transaction of what it announces, sent by the outbox worker through nodemailer to
// the capturing SMTP fake, read back from the capture folder with mailparser. The invitation's link is followed to
// join the project through the API. Needs DATABASE_URL and the backing fakes (scripts/test.mjs starts both).
import { randomUUID } from "node:crypto";
import { and, eq, like } from "drizzle-orm";
import nodemailer from "nodemailer";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST as invite } from "@/app/api/projects/[projectId]/invitations/route";
import { POST as accept } from "@/app/api/invitations/[token]/route";
import { clashes, comments, mailOutbox, memberships, pins, projects, users } from "@/db/schema";
import { withTransaction } from "@/db/client";
import { decideClash } from "@/lib/commands/decide-clash";
import { proposeClashOutcome } from "@/lib/commands/propose-clash-outcome";
import { postComment } from "@/lib/commands/post-comment";
import { createRevisionWithAnalysis } from "@/lib/commands/create-analysed-revision";
import { analyzeModel } from "@/lib/analysis/analyze";
import { TRIPOD } from "@/tests/support/fixtures/report";
import { listCapturedMail } from "@/lib/mail/captured";
import { queueDailyDigests } from "@/lib/commands/queue-daily-digests";
import { notifyMention } from "@/lib/commands/mail";
import { processOutbox } from "@/server/jobs/mail-outbox";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

let fx: ProjectFixture;

/** Sends everything due, then finds the captured mail to `to` whose subject matches. */
async function deliveredTo(to: string, subject: RegExp) {
  await processOutbox({ limit: 100 });
  const mails = await listCapturedMail({ to, limit: 500 });
  const mail = mails.find((m) => subject.test(m.subject));
  if (!mail) throw new Error(`No captured mail to ${to} matching ${subject}; got: ${mails.map((m) => m.subject).join(" | ")}`);
  return mail;
}

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("mail");
});
afterAll(closeDb);

describe("invitation mail", () => {
  it("is captured with a join link that lets a new person join the project", async () => {
    const email = `newcomer-${randomUUID().slice(0, 8)}@fixture.test`;
    const created = await invite(
      await buildRequest(`/api/projects/${fx.projectId}/invitations`, { method: "POST", user: fx.users.owner, body: { email, role: "architect" } }),
      routeContext({ projectId: fx.projectId }),
    );
    expect(created.status).toBe(201);

    const mail = await deliveredTo(email, /invited you to/);
    expect(mail.subject).toBe(`${fx.users.owner.name} invited you to ${await projectName()} on Strutroom`);
    expect(mail.from).toContain("no-reply@strutroom.test");
    const link = mail.text.match(/https?:\/\/\S+\/join\/\S+/)?.[0];
    expect(link, "join link in the text part").toBeDefined();
    expect(mail.html).toContain(`href="${link}"`);

    const token = decodeURIComponent(new URL(link!).pathname.split("/").pop()!);
    const joined = await accept(
      await buildRequest(`/api/invitations/${token}`, { method: "POST", body: { name: "Nadia Brandt", password: "a-long-enough-password" } }),
      routeContext({ token }),
    );
    expect(joined.status).toBe(201);
    const [user] = await getDb().select().from(users).where(eq(users.email, email));
    const [membership] = await getDb().select().from(memberships).where(eq(memberships.userId, user.id));
    expect(membership).toMatchObject({ projectId: fx.projectId, role: "architect" });
  });
});

async function projectName() {
  const [row] = await getDb().select({ name: projects.name }).from(projects).where(eq(projects.id, fx.projectId));
  return row.name;
}

describe("mention, decision and digest mails", () => {
  let pinId: string;

  beforeAll(async () => {
    pinId = randomUUID();
    await getDb().insert(pins).values({ id: pinId, projectId: fx.projectId, anchorKind: "clash", anchorId: "C-7", title: "Supply duct at grid D", discipline: "mep", authorId: fx.users.mep_engineer.id });
  });

  it("mention: one mail per mentioned member, linking to the thread", async () => {
    const commentId = randomUUID();
    await withTransaction(async (tx) => {
      await tx.insert(comments).values({ id: commentId, pinId, authorId: fx.users.architect.id, body: "@Tomasz can the duct pass here?" });
      await notifyMention({
        db: tx,
        projectId: fx.projectId,
        pinId,
        commentId,
        byName: fx.users.architect.name,
        excerpt: "can the duct pass here?",
        recipients: [{ userId: fx.users.structural_engineer.id, email: fx.users.structural_engineer.email, name: fx.users.structural_engineer.name }],
      });
    });
    const mail = await deliveredTo(fx.users.structural_engineer.email, /mentioned you/);
    expect(mail.subject).toContain('"Supply duct at grid D"');
    expect(mail.text).toContain(`/projects/${fx.projectId}/viewer?pin=${pinId}`);
  });

  it("decision in a thread: one mail per pin author and thread writer, never the decider; plain comments queue none", async () => {
    const threadPin = randomUUID();
    await getDb().insert(pins).values({ id: threadPin, projectId: fx.projectId, anchorKind: "member", anchorId: "B-41", title: "Opening in chord B-41", discipline: "mep", authorId: fx.users.architect.id });
    const decisionMails = async () => (await getDb().select().from(mailOutbox).where(and(eq(mailOutbox.projectId, fx.projectId), eq(mailOutbox.kind, "decision")))).length;
    const say = (author: keyof ProjectFixture["users"], body: string, kind: "comment" | "proposal" | "decision") =>
      postComment({ id: randomUUID(), projectId: fx.projectId, pinId: threadPin, authorId: fx.users[author].id, authorName: fx.users[author].name, body, kind });

    const before = await decisionMails();
    await say("mep_engineer", "The 300 mm duct needs to pass B-41.", "comment");
    await say("structural_engineer", "Checking the chord force first.", "comment");
    await say("mep_engineer", "Thanks.", "comment");
    expect(await decisionMails(), "plain comments queue no decision mail").toBe(before);

    // A decision answers a proposal (the MEP engineer's); the proposal itself is mailed as a proposal, not a decision.
    await say("mep_engineer", "A 300 mm opening in B-41 for the duct.", "proposal");
    expect(await decisionMails()).toBe(before);
    const decision = await say("structural_engineer", "No opening in B-41; reroute the duct below the bottom chord.", "decision");
    const queued = await getDb().select().from(mailOutbox).where(like(mailOutbox.dedupeKey, `decision:${decision!.comment.id}:%`));
    // The pin's author (architect) and the other writer (MEP engineer), once each; not the decider, not the owner or
    // viewer who never wrote in the thread.
    expect(queued.map((m) => m.toAddress).sort()).toEqual([fx.users.architect.email, fx.users.mep_engineer.email].sort());
    expect(await decisionMails()).toBe(before + 2);
    expect(queued[0].subject).toContain('Decision on the thread "Opening in chord B-41"');
    expect(queued[0].textBody).toContain("reroute the duct below the bottom chord");
    expect(queued[0].textBody).toContain("Advisory results for coordination.");
    expect(queued[0].textBody).toContain(`/projects/${fx.projectId}/viewer?pin=${threadPin}`);
  });

  it("digest: queued once per member and day, listing the open thread", async () => {
    const now = new Date();
    expect(await queueDailyDigests({ now })).toBeGreaterThanOrEqual(5);
    expect(await queueDailyDigests({ now })).toBe(0);
    const mail = await deliveredTo(fx.users.viewer.email, /open thread/);
    expect(mail.text).toContain("Supply duct at grid D — open");
  });

  it("a mail the SMTP server refuses is kept and retried with back-off; the comment it announces stays", async () => {
    const commentId = randomUUID();
    await withTransaction(async (tx) => {
      await tx.insert(comments).values({ id: commentId, pinId, authorId: fx.users.owner.id, body: "@Lucas please check" });
      await notifyMention({ db: tx, projectId: fx.projectId, pinId, commentId, byName: fx.users.owner.name, excerpt: "please check", recipients: [{ userId: fx.users.mep_engineer.id, email: fx.users.mep_engineer.email, name: fx.users.mep_engineer.name }] });
    });
    // A transport pointed at a closed port: the SMTP server is down.
    const down = nodemailer.createTransport({ host: "127.0.0.1", port: 9, connectionTimeout: 2000, ignoreTLS: true });
    const run = await processOutbox({ limit: 100, transport: down });
    expect(run.sent).toBe(0);
    expect(run.retrying).toBeGreaterThanOrEqual(1);
    const [queued] = await getDb().select().from(mailOutbox).where(eq(mailOutbox.dedupeKey, `mention:${commentId}:${fx.users.mep_engineer.id}`));
    expect(queued).toMatchObject({ state: "pending", attempts: 1 });
    expect(queued.lastError).toBeTruthy();
    expect(queued.nextAttemptAt.getTime()).toBeGreaterThan(queued.updatedAt.getTime());
    expect(await getDb().select().from(comments).where(eq(comments.id, commentId))).toHaveLength(1);

    // Once due again and the server is back, it goes out.
    await getDb().update(mailOutbox).set({ nextAttemptAt: new Date(0) }).where(eq(mailOutbox.id, queued.id));
    const mail = await deliveredTo(fx.users.mep_engineer.email, /mentioned you/);
    expect(mail.text).toContain("please check");
    const [sent] = await getDb().select().from(mailOutbox).where(eq(mailOutbox.id, queued.id));
    expect(sent).toMatchObject({ state: "sent", attempts: 2 });
  });

  it("the comment and clash queries queue their mails in their own transactions (the hooks other areas call)", async () => {
    const written = await postComment({ id: randomUUID(), projectId: fx.projectId, pinId, authorId: fx.users.mep_engineer.id, authorName: fx.users.mep_engineer.name, body: `@${fx.users.owner.name} the duct is 400 mm wide`, kind: "comment" });
    expect(written?.mentioned.map((m) => m.userId)).toEqual([fx.users.owner.id]);
    expect((await deliveredTo(fx.users.owner.email, /mentioned you/)).text).toContain("the duct is 400 mm wide");

    const revision = await createRevisionWithAnalysis({ projectId: fx.projectId, name: "Lantern", model: TRIPOD, source: "uploaded", createdBy: fx.users.structural_engineer.id, result: analyzeModel(TRIPOD), review: null });
    const [clash] = await getDb()
      .insert(clashes)
      .values({ projectId: fx.projectId, revisionId: revision.id, clashKey: "c-mail1", memberId: "AB", runId: "SA-01", segmentIndex: 0, kind: "hard", gap: -0.01, depth: 0.01, requiredClearance: 0.05, pointX: 0, pointY: 0, pointZ: 0 })
      .returning();
    await proposeClashOutcome({ projectId: fx.projectId, clashId: clash.id, actor: { userId: fx.users.mep_engineer.id, role: "mep_engineer" }, input: { outcome: "opening_proposed", note: "Sleeve near mid-length" } });
    await decideClash({ projectId: fx.projectId, clashId: clash.id, actor: { userId: fx.users.structural_engineer.id, role: "structural_engineer" }, input: { outcome: "opening_accepted", conditions: "Sleeve 100 mm, stiffened, at mid-length only" } });
    // Issue 16: a proposal is mailed as a proposal to the structural engineer who decides it; the decision as a
    // decision to the proposer; nobody else on the team (architect, owner, viewer) is mailed about this clash.
    const proposed = await deliveredTo(fx.users.structural_engineer.email, /^Proposed on clash c-mail1/);
    expect(proposed.text).toContain("Sleeve near mid-length");
    expect(proposed.text).toContain("This is a proposal, not a decision");
    const accepted = await deliveredTo(fx.users.mep_engineer.email, /^Decided on clash c-mail1/);
    expect(accepted.subject).toContain("clash c-mail1 (member AB, run SA-01): opening accepted with conditions");
    expect(accepted.text).toContain("Conditions: Sleeve 100 mm, stiffened, at mid-length only");
    expect(accepted.text).toContain("Advisory results for coordination.");
    for (const bystander of [fx.users.architect, fx.users.owner, fx.users.viewer]) {
      const theirs = await getDb().select().from(mailOutbox).where(and(eq(mailOutbox.toAddress, bystander.email), like(mailOutbox.subject, "%c-mail1%")));
      expect(theirs, bystander.email).toEqual([]);
    }
  });
});
