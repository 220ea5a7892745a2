import "server-only";
// The daily digest of open threads, queued by the jobs process's daily schedule (server/jobs/main.ts).
import { enqueueMail } from "@/db/queries/mail-outbox";
import { listProjectsWithOpenThreads } from "@/db/queries/mail-digest";
import { appUrl, outboxBodies, pinUrl } from "@/lib/mail/notify";
import { digestMail } from "@/lib/mail/templates";
import { runCommand } from "./command";

const DAY_MS = 24 * 60 * 60 * 1000;

/**
 * Queues one digest per member of each project with threads that are not closed. The dedupe key holds the UTC
 * date, so running it twice on one day (a restart, two job processes) queues each digest once.
 */
export async function queueDailyDigests({ now }: { now: Date }): Promise<number> {
  const day = now.toISOString().slice(0, 10);
  let queued = 0;
  await runCommand(async ({ tx }) => {
    const projects = await listProjectsWithOpenThreads({ db: tx });
    for (const project of projects) {
      const threads = project.threads.map((thread) => ({
        title: thread.title,
        state: thread.state,
        ageDays: Math.max(0, Math.floor((now.getTime() - thread.createdAt.getTime()) / DAY_MS)),
        lastBy: thread.lastBy,
        url: pinUrl(project.projectId, thread.pinId),
      }));
      for (const member of project.members) {
        const mail = digestMail({ projectName: project.projectName, recipientName: member.name, threads, projectUrl: appUrl(`/projects/${project.projectId}`) });
        const written = await enqueueMail({
          db: tx,
          mail: {
            projectId: project.projectId,
            kind: "digest",
            toAddress: member.email,
            ...outboxBodies(mail),
            dedupeKey: `digest:${project.projectId}:${member.userId}:${day}`,
          },
        });
        if (written) queued += 1;
      }
    }
  });
  return queued;
}
