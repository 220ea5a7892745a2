import "server-only";
// The outbox worker: sends queued mail through nodemailer, retrying with back-off. The jobs process runs it every
// few seconds; the tests call it directly.
import type { Transporter } from "nodemailer";
import { claimDueMail, markMailAttemptFailed, markMailSent } from "../../db/queries/mail-outbox";
import { nextMailAttempt } from "../../lib/mail/retry";
import { mailFrom, mailTransport } from "../../lib/mail/transport";

export type OutboxRun = { sent: number; retrying: number; failed: number };

/** Sends every due mail once (up to `limit`); a failure is recorded and retried later, never thrown. */
export async function processOutbox({ limit = 20, transport = mailTransport() }: { limit?: number; transport?: Transporter } = {}): Promise<OutboxRun> {
  const run: OutboxRun = { sent: 0, retrying: 0, failed: 0 };
  const due = await claimDueMail({ limit });
  for (const mail of due) {
    try {
      const info = await transport.sendMail({ from: mailFrom(), to: mail.toAddress, subject: mail.subject, text: mail.textBody, html: mail.htmlBody });
      await markMailSent({ id: mail.id, messageId: info.messageId });
      run.sent += 1;
    } catch (error) {
      const nextAttemptAt = nextMailAttempt(mail.attempts + 1, new Date());
      await markMailAttemptFailed({ id: mail.id, error: error instanceof Error ? error.message : String(error), nextAttemptAt });
      if (nextAttemptAt) run.retrying += 1;
      else run.failed += 1;
    }
  }
  return run;
}
