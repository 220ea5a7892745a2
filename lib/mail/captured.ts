import "server-only";
// Mail caught by the local SMTP fake (scripts/fakes/smtp.mjs writes each message as an .eml file under
// STRUTROOM_DATA_DIR/mail), read back with mailparser for the owners' dev page and the tests.
import { readdir, readFile } from "node:fs/promises";
import path from "node:path";
import { simpleParser, type AddressObject } from "mailparser";

export type CapturedMail = { id: string; receivedAt: string; from: string; to: string[]; subject: string; text: string; html: string | null };

/**
 * The captured-mail page is for development: on in `next dev`, and in a production build only when the
 * environment says the SMTP server is the local capturing fake (MAIL_CAPTURE_LOCAL=1, set by the stack scripts).
 */
export function capturedMailPageEnabled(): boolean {
  return process.env.NODE_ENV !== "production" || process.env.MAIL_CAPTURE_LOCAL === "1";
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

/** The newest captured mails first (at most `limit`), optionally only those sent to `to` or to any of `toAny`. */
export async function listCapturedMail({ limit = 50, to, toAny }: { limit?: number; to?: string; toAny?: string[] } = {}): Promise<CapturedMail[]> {
  const wanted = new Set([...(to ? [to] : []), ...(toAny ?? [])].map((address) => address.toLowerCase()));
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
    if ((to || toAny) && !recipients.some((address) => wanted.has(address.toLowerCase()))) continue;
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
