import "server-only";
import { asc, eq, inArray, ne, sql } from "drizzle-orm";
import { getDb, type Executor } from "../client";
import { comments, memberships, pins, projects, users } from "../schema";

export type DigestProject = {
  projectId: string;
  projectName: string;
  threads: { pinId: string; title: string; state: "open" | "answered"; createdAt: Date; lastBy: string | null }[];
  members: { userId: string; name: string; email: string }[];
};

/** Every project with threads that are not closed, with those threads (oldest first) and the team to tell. */
export async function listProjectsWithOpenThreads({ db = getDb() }: { db?: Executor } = {}): Promise<DigestProject[]> {
  const lastBy = sql<string | null>`(select ${users.name} from ${comments} join ${users} on ${users.id} = ${comments.authorId}
    where ${comments.pinId} = ${pins.id} order by ${comments.createdAt} desc limit 1)`;
  const threads = await db
    .select({ projectId: pins.projectId, projectName: projects.name, pinId: pins.id, title: pins.title, state: pins.state, createdAt: pins.createdAt, lastBy })
    .from(pins)
    .innerJoin(projects, eq(projects.id, pins.projectId))
    .where(ne(pins.state, "closed"))
    .orderBy(asc(pins.createdAt));
  if (threads.length === 0) return [];
  const projectIds = [...new Set(threads.map((thread) => thread.projectId))];
  const team = await db
    .select({ projectId: memberships.projectId, userId: users.id, name: users.name, email: users.email })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(inArray(memberships.projectId, projectIds));
  return projectIds.map((projectId) => {
    const own = threads.filter((thread) => thread.projectId === projectId);
    return {
      projectId,
      projectName: own[0].projectName,
      threads: own.map(({ pinId, title, state, createdAt, lastBy: by }) => ({ pinId, title, state: state as "open" | "answered", createdAt, lastBy: by })),
      members: team.filter((member) => member.projectId === projectId).map(({ userId, name, email }) => ({ userId, name, email })),
    };
  });
}
