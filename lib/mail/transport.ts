import "server-only";
// nodemailer to the SMTP server: the local capturing fake under `npm start` and the tests (SMTP_HOST, SMTP_PORT),
// a real relay in a hosted deployment (plus SMTP_USER / SMTP_PASS and TLS).
import nodemailer, { type Transporter } from "nodemailer";

let transport: Transporter | undefined;

/** True when the SMTP server is the local capturing fake (the captured-mail page is enabled only then). */
export function isLocalMailCapture(): boolean {
  return process.env.MAIL_CAPTURE_LOCAL === "1";
}

/** The sender address of every mail. */
export function mailFrom(): string {
  return process.env.MAIL_FROM ?? "Strutroom <no-reply@strutroom.test>";
}

/** The one SMTP transport of this process. */
export function mailTransport(): Transporter {
  if (!transport) {
    const port = Number(process.env.SMTP_PORT);
    if (!port) throw new Error("SMTP_PORT is not set (scripts/stack/services.mjs sets it for the local mail capture).");
    const user = process.env.SMTP_USER;
    transport = nodemailer.createTransport({
      host: process.env.SMTP_HOST ?? "127.0.0.1",
      port,
      secure: process.env.SMTP_SECURE === "1",
      // The local fake speaks plain SMTP on loopback; a real relay negotiates TLS.
      ignoreTLS: isLocalMailCapture(),
      auth: user ? { user, pass: process.env.SMTP_PASS ?? "" } : undefined,
      connectionTimeout: 10_000,
      greetingTimeout: 10_000,
      socketTimeout: 20_000,
    });
  }
  return transport;
}
