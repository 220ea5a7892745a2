import { beforeEach, describe, expect, it } from "vitest";
import type { PresentedComment, PresentedPin } from "@/lib/realtime/events";
import { commentCountOf, filterPins, useSessionStore } from "./session-store";

const pin = (id: string, patch: Partial<PresentedPin> = {}): PresentedPin => ({
  id,
  projectId: "00000000-0000-4000-8000-000000000000",
  anchor: { kind: "member", id: "TCX-0-0" },
  revisionId: null,
  title: `Pin ${id}`,
  state: "open",
  discipline: "structural",
  author: { id: "a", name: "Amara" },
  commentCount: 0,
  createdAt: "2026-01-01T10:00:00.000Z",
  updatedAt: "2026-01-01T10:00:00.000Z",
  ...patch,
});

const comment = (id: string, createdAt: string): PresentedComment => ({
  id,
  pinId: "p1",
  kind: "comment",
  body: id,
  author: { id: "a", name: "Amara" },
  role: null,
  conditions: null,
  revision: null,
  analysisRunId: null,
  caution: null,
  supersedesId: null,
  viewpoint: null,
  mentions: [],
  createdAt,
});

beforeEach(() => useSessionStore.getState().reset(null));

describe("session store", () => {
  it("keeps the newer copy of a pin whichever arrives last (live event vs catch-up)", () => {
    const store = useSessionStore.getState();
    store.upsertPins([pin("p1", { state: "answered", updatedAt: "2026-01-01T10:05:00.000Z" })]);
    store.upsertPins([pin("p1", { state: "open", updatedAt: "2026-01-01T10:01:00.000Z" })]);
    expect(useSessionStore.getState().pins.p1.state).toBe("answered");
  });

  it("adds each comment once, in time order, however often it is delivered", () => {
    const store = useSessionStore.getState();
    store.addComments([comment("c2", "2026-01-01T10:02:00.000Z")]);
    store.addComments([comment("c1", "2026-01-01T10:01:00.000Z"), comment("c2", "2026-01-01T10:02:00.000Z")]);
    expect(useSessionStore.getState().comments.p1.map((c) => c.id)).toEqual(["c1", "c2"]);
  });

  it("counts a pin's comments from the server's copy plus those written after it, each once", () => {
    const store = useSessionStore.getState();
    const copy = pin("p1", { commentCount: 2, updatedAt: "2026-01-01T10:00:00.000Z" });
    store.upsertPins([copy]);
    // One comment the copy already counts (the thread was opened), two written after it, one delivered twice.
    store.addComments([comment("c0", "2026-01-01T09:59:00.000Z"), comment("c1", "2026-01-01T10:01:00.000Z")]);
    store.addComments([comment("c2", "2026-01-01T10:02:00.000Z"), comment("c1", "2026-01-01T10:01:00.000Z")]);
    expect(commentCountOf(useSessionStore.getState().pins.p1, useSessionStore.getState().comments.p1)).toBe(4);
    // A fresh copy (catch-up) already counts them all.
    store.upsertPins([pin("p1", { commentCount: 4, updatedAt: "2026-01-01T10:02:00.000Z" })]);
    expect(commentCountOf(useSessionStore.getState().pins.p1, useSessionStore.getState().comments.p1)).toBe(4);
    expect(commentCountOf(copy, undefined)).toBe(2);
  });

  it("filters pins by state, discipline and author", () => {
    const pins = {
      p1: pin("p1"),
      p2: pin("p2", { state: "closed", discipline: "mep", author: { id: "l", name: "Lucas" } }),
    };
    expect(filterPins(pins, { state: "closed" }).map((p) => p.id)).toEqual(["p2"]);
    expect(filterPins(pins, { discipline: "structural" }).map((p) => p.id)).toEqual(["p1"]);
    expect(filterPins(pins, { authorId: "l" }).map((p) => p.id)).toEqual(["p2"]);
    expect(filterPins(pins, {})).toHaveLength(2);
  });
});
