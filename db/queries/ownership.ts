// Which of the ids a write links to lie outside the project (or do not exist). SQL only; the refusal is made by
// lib/commands/require-same-project.ts.
import { and, eq } from "drizzle-orm";
import { getDb, type Executor } from "../client";
import { comments, mepRuns, modelRevisions, pins } from "../schema";

export type Links = { revisionId?: string | null; runId?: string | null; commentId?: string | null; pinId?: string | null };

/** The names of the given links that do not name a row of this project. */
export async function linksOutsideProject({ projectId, links, db = getDb() }: { projectId: string; links: Links; db?: Executor }): Promise<(keyof Links)[]> {
  const outside: (keyof Links)[] = [];
  const found = async (query: Promise<unknown[]>) => (await query).length > 0;
  if (links.revisionId && !(await found(db.select({ id: modelRevisions.id }).from(modelRevisions).where(and(eq(modelRevisions.id, links.revisionId), eq(modelRevisions.projectId, projectId)))))) {
    outside.push("revisionId");
  }
  if (
    links.runId &&
    !(await found(
      db
        .select({ id: mepRuns.id })
        .from(mepRuns)
        .innerJoin(modelRevisions, eq(modelRevisions.id, mepRuns.revisionId))
        .where(and(eq(mepRuns.id, links.runId), eq(modelRevisions.projectId, projectId))),
    ))
  ) {
    outside.push("runId");
  }
  if (
    links.commentId &&
    !(await found(db.select({ id: comments.id }).from(comments).innerJoin(pins, eq(pins.id, comments.pinId)).where(and(eq(comments.id, links.commentId), eq(pins.projectId, projectId)))))
  ) {
    outside.push("commentId");
  }
  if (links.pinId && !(await found(db.select({ id: pins.id }).from(pins).where(and(eq(pins.id, links.pinId), eq(pins.projectId, projectId)))))) {
    outside.push("pinId");
  }
  return outside;
}
