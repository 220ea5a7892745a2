import "server-only";
import { randomUUID } from "node:crypto";
import { withTransaction } from "@/db/client";
import { recordAuditEvent } from "@/db/queries/audit";
import { findPinsByTopicGuids, insertImportedComments, insertImportedPin, listCommentGuids, touchPin } from "@/db/queries/bcf";
import { listMembersByProject } from "@/db/queries/memberships";
import { disciplineOf, fromBcfViewpoint, pinStateOf, type BcfFile } from "@/lib/bcf";

export interface BcfImportSummary {
  pinsCreated: number;
  commentsAdded: number;
  topicsKnown: number;
}

const dateOr = (iso: string | undefined, fallback: Date) => {
  const d = iso ? new Date(iso) : undefined;
  return d && !Number.isNaN(d.getTime()) ? d : fallback;
};

/**
 * Brings BCF topics into the project in one transaction: a topic not seen before becomes a pin (anchored on the
 * member its viewpoint selects, else on the camera's target point), a known topic gains only the comments it does not
 * hold yet; authors on the team are matched by e-mail, others are kept by name on the comment and the importer
 * stands in as the row's author. A second import of the same file changes nothing.
 */
export async function importBcf({ projectId, actor, file, memberOf }: { projectId: string; actor: { userId: string }; file: BcfFile; memberOf: (globalId: string) => string | undefined }): Promise<BcfImportSummary> {
  return withTransaction(async (tx) => {
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
        const view = topic.viewpoints.map((v) => fromBcfViewpoint(v, memberOf)).find((v) => v !== undefined);
        const member = view?.selectedMember;
        const point = view?.camera.target ?? [0, 0, 0];
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
            viewpoint: view ?? null,
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
            createdAt: dateOr(c.date, now),
            updatedAt: dateOr(c.date, now),
          };
        });
      const added = await insertImportedComments({ rows, db: tx });
      if (added > 0 && known.has(topic.guid)) await touchPin({ pinId, db: tx });
      summary.commentsAdded += added;
    }
    await recordAuditEvent({ db: tx, projectId, actorId: actor.userId, action: "bcf.import", subjectType: "project", subjectId: projectId, details: { ...summary, topics: file.topics.length } });
    return summary;
  });
}
