// Links in mails. The mails themselves are queued by the commands that announce something (lib/commands/mail.ts),
// in the command's transaction, so a mail commits with (and only with) what it announces; the jobs process sends
// it with retries (server/jobs/mail-outbox.ts).

/** The web app's public base URL, for links in mails. */
export function appUrl(path: string): string {
  const base = process.env.APP_URL ?? process.env.NEXTAUTH_URL ?? "http://127.0.0.1:3000";
  return new URL(path, base).toString();
}

/** Where a pin's thread opens: the viewer with its live review. */
export function pinUrl(projectId: string, pinId: string): string {
  return appUrl(`/projects/${projectId}/viewer?pin=${encodeURIComponent(pinId)}`);
}

/** A rendered template as the outbox row's columns. */
export function outboxBodies(mail: { subject: string; text: string; html: string }) {
  return { subject: mail.subject, textBody: mail.text, htmlBody: mail.html };
}
