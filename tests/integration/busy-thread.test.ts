// Issue 14 (the comment fan-out target): plain comments on one busy thread must not queue behind each other. Each
// holds its pin and marks it changed; when either took the pin row's lock exclusively, every comment waited for the
// one before it to commit, and under load the queue grew without bound (bench:realtime, 100 clients on one thread).
// Here a transaction does what a plain comment in flight does (holds the pin, marks it) and stays open: a comment
// posted meanwhile must be stored without waiting for it, and the pin still ends up marked no earlier than before.
// (Steps of the thread's record still go one at a time: tests/integration/thread-decisions.test.ts.)
import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { withTransaction } from "@/db/client";
import { getPinById, lockPinInProject, touchPin } from "@/db/queries/pins";
import { createPin } from "@/lib/commands/create-pin";
import { postComment } from "@/lib/commands/post-comment";
import { closeDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";

let fx: ProjectFixture;
beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("busy-thread");
});
afterAll(async () => {
  await closeDb();
});

describe("comments on a busy thread", () => {
  it("are stored while another transaction is marking the same pin, and the pin's change time never goes back", async () => {
    const pinId = randomUUID();
    const { architect, mep_engineer: mep } = fx.users;
    await createPin({ projectId: fx.projectId, authorId: architect.id, authorName: architect.name, input: { id: pinId, anchor: { kind: "member", id: "TC-7" }, revisionId: null, title: "Busy thread", discipline: "general" } });
    const before = await getPinById({ projectId: fx.projectId, pinId });

    let locked!: () => void;
    let release!: () => void;
    const holding = new Promise<void>((resolve) => (locked = resolve));
    const released = new Promise<void>((resolve) => (release = resolve));
    const other = withTransaction(async (tx) => {
      await lockPinInProject({ db: tx, projectId: fx.projectId, pinId, exclusive: false });
      await touchPin({ db: tx, pinId });
      locked();
      await released;
    });
    await holding;

    const order: string[] = [];
    const posted = postComment({ id: randomUUID(), projectId: fx.projectId, pinId, authorId: mep.id, authorName: mep.name, body: "Posted while the pin is locked.", kind: "comment" }).then((written) => {
      order.push("comment stored");
      return written;
    });
    // The holder lets go only after the comment is stored, or after a generous while (then the test fails on order).
    const fallback = setTimeout(() => release(), 15_000);
    await Promise.race([posted, new Promise((r) => setTimeout(r, 15_000))]);
    order.push("holder released");
    clearTimeout(fallback);
    release();
    await Promise.all([other, posted]);

    expect(order).toEqual(["comment stored", "holder released"]);
    expect((await posted)?.created).toBe(true);
    const after = await getPinById({ projectId: fx.projectId, pinId });
    expect(new Date(after!.updatedAt).getTime()).toBeGreaterThanOrEqual(new Date(before!.updatedAt).getTime());
    expect(after!.commentCount).toBe((before!.commentCount ?? 0) + 1);
  });
});
