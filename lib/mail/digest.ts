import "server-only";
// The daily digest of open threads, queued by the jobs process's daily schedule (server/jobs/main.ts).
import { withTransaction } from "../../db/client";
import { enqueueMail } from "../../db/queries/mail-outbox";
import { listProjectsWithOpenThreads } from "../../db/queries/mail-digest";
import { appUrl, pinUrl } from "./notify";
import { digestMail } from "./templates";

const DAY_MS = 24 * 60 * 60 * 1000;

/**
 * Queues one digest per member of each project with threads that are not closed. The dedupe key holds the UTC
 * date, so running it twice on one day (a restart, two job processes) queues each digest once.
 */
export async function queueDailyDigests({ now }: { now: Date }): Promise<number> {
  const projects = await listProjectsWithOpenThreads();
  const day = now.toISOString().slice(0, 10);
  let queued = 0;
  await withTransaction(async (tx) => {
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
            subject: mail.subject,
            textBody: mail.text,
            htmlBody: mail.html,
            dedupeKey: `digest:${project.projectId}:${member.userId}:${day}`,
          },
        });
        if (written) queued += 1;
      }
    }
  });
  return queued;
}
