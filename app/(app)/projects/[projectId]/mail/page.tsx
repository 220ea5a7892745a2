import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { requirePageProject } from "@/lib/auth/page";
import { listSentMessageIds } from "@/db/queries/mail-outbox";
import { capturedMailForProject, capturedMailPageEnabled } from "@/lib/mail/captured";

export const metadata: Metadata = { title: "Captured mail" };
export const dynamic = "force-dynamic";

const URL_PATTERN = /(https?:\/\/[^\s<>"]+)/g;

/** Plain text with its links clickable (the split keeps each URL as its own odd-indexed part). */
function Linkified({ text }: { text: string }) {
  return (
    <>
      {text.split(URL_PATTERN).map((part, k) =>
        k % 2 === 1 ? (
          <a key={k} href={part} className="break-all text-tension underline">
            {part}
          </a>
        ) : (
          <span key={k}>{part}</span>
        ),
      )}
    </>
  );
}

/** Local running only: the mail written for this project, as the local SMTP fake caught it (owners). */
export default async function CapturedMailPage({ params }: PageProps<"/projects/[projectId]/mail">) {
  if (!capturedMailPageEnabled()) notFound();
  const { projectId } = await params;
  const { project } = await requirePageProject(projectId, "mail.viewCaptured");
  const mails = await capturedMailForProject({ messageIds: await listSentMessageIds({ projectId: project.id }) });
  return (
    <div className="flex flex-col gap-6">
      <section className="flex flex-col gap-4" data-testid="captured-mail">
        <div>
          <h2 className="text-lg font-semibold">Captured mail (development)</h2>
          <p className="text-sm text-board-700">
            Mail this project sent (invitations, mentions, decisions, digests), as caught by the local SMTP server. Nothing here left this machine.
          </p>
        </div>
        {mails.length === 0 ? <p className="text-board-700">No mail captured yet.</p> : null}
        {mails.map((mail) => (
          <article key={mail.id} className="rounded-lg border border-board-200 bg-white p-4" data-testid="captured-mail-item">
            <header className="mb-2 flex flex-wrap items-baseline justify-between gap-2">
              <h3 className="font-medium">{mail.subject}</h3>
              <time className="text-xs text-board-700" dateTime={mail.receivedAt}>
                {mail.receivedAt.slice(0, 16).replace("T", " ")} UTC
              </time>
            </header>
            <p className="mb-2 text-xs text-board-700">
              From {mail.from} to {mail.to.join(", ")}
            </p>
            <pre className="whitespace-pre-wrap font-sans text-sm text-board-900">
              <Linkified text={mail.text} />
            </pre>
          </article>
        ))}
      </section>
    </div>
  );
}
