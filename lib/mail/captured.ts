import "server-only";
// Mail caught by the local SMTP fake (scripts/fakes/smtp.mjs writes each message as an .eml file under
// STRUTROOM_DATA_DIR/mail), read back with mailparser for the owners' dev page and the tests.
import { readdir, readFile } from "node:fs/promises";
import path from "node:path";
import { simpleParser, type AddressObject } from "mailparser";

export type CapturedMail = { id: string; receivedAt: string; from: string; to: string[]; subject: string; text: string; html: string | null };

/**
 * The captured-mail page is for local running only: on when the environment says the SMTP server is the local
 * capturing fake (MAIL_CAPTURE_LOCAL=1, set by the stack scripts), whatever the build; off everywhere else.
 */
export function capturedMailPageEnabled(): boolean {
  return process.env.MAIL_CAPTURE_LOCAL === "1";
}

function captureDir(): string {
  const dataDir = process.env.STRUTROOM_DATA_DIR;
  if (!dataDir) throw new Error("STRUTROOM_DATA_DIR is not set.");
  return path.join(dataDir, "mail");
}

function addresses(field: AddressObject | AddressObject[] | undefined): string[] {
  const list = Array.isArray(field) ? field : field ? [field] : [];
  return list.flatMap((entry) => entry.value.map((address) => address.address ?? "")).filter(Boolean);
}

/** The newest captured mails first (at most `limit`), optionally only those sent to `to` or with one of `messageIds`. */
export async function listCapturedMail({ limit = 50, to, messageIds }: { limit?: number; to?: string; messageIds?: string[] } = {}): Promise<CapturedMail[]> {
  const wantedIds = messageIds ? new Set(messageIds) : null;
  let names: string[];
  try {
    names = (await readdir(captureDir())).filter((name) => name.endsWith(".eml") && !name.startsWith("."));
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === "ENOENT") return [];
    throw error;
  }
  // File names start with the capture time (ISO), so a reverse sort is newest first.
  names.sort().reverse();
  const mails: CapturedMail[] = [];
  for (const name of names) {
    if (mails.length >= limit) break;
    const parsed = await simpleParser(await readFile(path.join(captureDir(), name)));
    const recipients = addresses(parsed.to);
    if (to && !recipients.some((address) => address.toLowerCase() === to.toLowerCase())) continue;
    if (wantedIds && !(parsed.messageId && wantedIds.has(parsed.messageId))) continue;
    mails.push({
      id: name.replace(/\.eml$/, ""),
      receivedAt: (parsed.date ?? new Date(0)).toISOString(),
      from: parsed.from?.text ?? "",
      to: recipients,
      subject: parsed.subject ?? "",
      text: parsed.text ?? "",
      html: parsed.html || null,
    });
  }
  return mails;
}

/**
 * The captured mail written for a project: matched by Message-ID to the project's sent outbox rows (pass
 * db/queries/mail-outbox.ts listSentMessageIds), never by recipient (a person on two teams would otherwise show one
 * project's join links to the other's owners). No ids, no mail.
 */
export async function capturedMailForProject({ messageIds, limit = 100 }: { messageIds: string[]; limit?: number }): Promise<CapturedMail[]> {
  if (messageIds.length === 0) return [];
  return listCapturedMail({ limit, messageIds });
}
