import "server-only";
import { randomUUID } from "node:crypto";
import { getDb } from "@/db/client";
import { findPinsByTopicGuids, insertImportedComments, insertImportedPin, listCommentGuids, touchPin } from "@/db/queries/bcf";
import { listMembersByProject } from "@/db/queries/memberships";
import { disciplineOf, fromBcfViewpoint, pinStateOf, type BcfFile, type BcfTopic, type Viewpoint } from "@/lib/bcf";
import { withStoredFiles } from "@/lib/commands/stored-files";
import { runCommand } from "./command";

export interface BcfImportSummary {
  pinsCreated: number;
  commentsAdded: number;
  topicsKnown: number;
}

const dateOr = (iso: string | undefined, fallback: Date) => {
  const d = iso ? new Date(iso) : undefined;
  return d && !Number.isNaN(d.getTime()) ? d : fallback;
};

/** The first viewpoint of a topic we can show (a camera), with its GUID and its snapshot PNG when it has one. */
function firstView(topic: BcfTopic, memberOf: (globalId: string) => string | undefined): { guid: string; view: Viewpoint; snapshot?: Uint8Array } | undefined {
  for (const viewpoint of topic.viewpoints) {
    const view = fromBcfViewpoint(viewpoint, memberOf);
    if (view) return { guid: viewpoint.guid, view, snapshot: viewpoint.snapshot };
  }
  return undefined;
}

/** The view a comment references, unless it is the topic's first (the pin's saved view) or has no camera. */
function commentView(topic: BcfTopic, viewpointGuid: string | undefined, pinViewGuid: string | undefined, memberOf: (globalId: string) => string | undefined): Viewpoint | null {
  if (!viewpointGuid || viewpointGuid === pinViewGuid) return null;
  const viewpoint = topic.viewpoints.find((v) => v.guid === viewpointGuid);
  return (viewpoint && fromBcfViewpoint(viewpoint, memberOf)) ?? null;
}

/**
 * Brings BCF topics into the project in one transaction: a topic not seen before becomes a pin (anchored on the
 * member its viewpoint selects, else on the camera's target point) with that viewpoint as its saved view and the
 * viewpoint's snapshot stored like a saved view's; a known topic gains only the comments it does not hold yet, each
 * with the view it references when that is another viewpoint of the topic (a comment's own view);
 * authors on the team are matched by e-mail, others are kept by name on the comment and the importer stands in as
 * the row's author. A second import of the same file changes nothing and stores no file.
 */
export async function importBcf({ projectId, actor, file, memberOf }: { projectId: string; actor: { userId: string }; file: BcfFile; memberOf: (globalId: string) => string | undefined }): Promise<BcfImportSummary> {
  // Snapshots are checked and put into object storage before the transaction (withStoredFiles removes them again if
  // it fails), so only topics that are new now bring one.
  const knownBefore = await findPinsByTopicGuids({ projectId, guids: file.topics.map((t) => t.guid), db: getDb() });
  const views = new Map(file.topics.map((t) => [t.guid, firstView(t, memberOf)]));
  const withSnapshot = file.topics.filter((t) => !knownBefore.has(t.guid) && views.get(t.guid)?.snapshot);
  const files = withSnapshot.map((t) => ({ filename: `view-${t.guid}.png`, bytes: views.get(t.guid)!.snapshot! }));
  return withStoredFiles({ projectId, userId: actor.userId, purpose: "snapshot", files }, (record) =>
    runCommand(async ({ tx, audit, live }) => {
      const stored = await record(tx, {});
      const snapshotOf = new Map(withSnapshot.map((t, k) => [t.guid, stored[k].id]));
      const members = await listMembersByProject({ projectId, db: tx });
      const byEmail = new Map(members.map((m) => [m.email.toLowerCase(), m.userId]));
      const known = await findPinsByTopicGuids({ projectId, guids: file.topics.map((t) => t.guid), db: tx });
      const now = new Date();
      const summary: BcfImportSummary = { pinsCreated: 0, commentsAdded: 0, topicsKnown: 0 };
      for (const topic of file.topics) {
        let pinId = known.get(topic.guid);
        if (pinId) summary.topicsKnown += 1;
        else {
          pinId = randomUUID();
          const view = views.get(topic.guid)?.view;
          const member = view?.selectedMember;
          const point = view?.camera.target ?? [0, 0, 0];
          const snapshotId = snapshotOf.get(topic.guid);
          await insertImportedPin({
            db: tx,
            row: {
              id: pinId,
              projectId,
              anchorKind: member ? "member" : "point",
              anchorId: member ?? null,
              anchorX: member ? null : point[0],
              anchorY: member ? null : point[1],
              anchorZ: member ? null : point[2],
              revisionId: null,
              title: topic.title.trim().slice(0, 200),
              state: pinStateOf(topic.status),
              discipline: disciplineOf(topic.type),
              authorId: byEmail.get(topic.creationAuthor.toLowerCase()) ?? actor.userId,
              viewpoint: view ? { ...view, ...(snapshotId ? { snapshotId } : {}) } : null,
              bcfGuid: topic.guid,
              labels: topic.labels.slice(0, 50).map((l) => l.slice(0, 80)),
              assignedTo: topic.assignedTo?.slice(0, 200) ?? null,
              dueAt: topic.dueDate ? dateOr(topic.dueDate, now) : null,
              createdAt: dateOr(topic.creationDate, now),
              updatedAt: dateOr(topic.modifiedDate ?? topic.creationDate, now),
            },
          });
          summary.pinsCreated += 1;
        }
        const have = await listCommentGuids({ pinId, db: tx });
        const rows = topic.comments
          .filter((c) => !have.has(c.guid))
          .map((c) => {
            const authorId = byEmail.get(c.author.toLowerCase());
            return {
              id: randomUUID(),
              pinId: pinId!,
              authorId: authorId ?? actor.userId,
              externalAuthor: authorId ? null : c.author.slice(0, 200) || "unknown",
              bcfGuid: c.guid,
              body: c.text.slice(0, 20_000),
              kind: "comment" as const,
              viewpoint: commentView(topic, c.viewpointGuid, views.get(topic.guid)?.guid, memberOf),
              createdAt: dateOr(c.date, now),
              updatedAt: dateOr(c.date, now),
            };
          });
        const added = await insertImportedComments({ rows, db: tx });
        if (added > 0 && known.has(topic.guid)) await touchPin({ pinId, db: tx });
        summary.commentsAdded += added;
      }
      await audit({ projectId, actorId: actor.userId, action: "bcf.import", subjectType: "project", subjectId: projectId, details: { ...summary, topics: file.topics.length, snapshots: stored.length } });
      // Open review boards fetch the pins and threads again (they were written here, not over the socket).
      if (summary.pinsCreated + summary.commentsAdded > 0) await live({ projectId, kind: "pins", subjectId: projectId });
      return summary;
    }),
  );
}
