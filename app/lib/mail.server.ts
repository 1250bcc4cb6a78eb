// Sending e-mail: nodemailer over SMTP, to the real service (SMTP_URL) or to the local fake
// (mailFake.server.ts), which starts on first use. In production without SMTP_URL mail is off,
// and the features that need it say so instead of pretending to send.
import nodemailer, { type Transporter } from "nodemailer";
import { env } from "./env.server.ts";
import { ensureMailFake, fakeMailbox, type FakeMessage } from "./mailFake.server.ts";
import type { MailContent } from "./mailMessages.ts";

export class MailUnavailable extends Error {
  constructor() {
    super("E-mail is not set up on this server (SMTP_URL is missing), so nothing could be sent.");
    this.name = "MailUnavailable";
  }
}

export interface OutgoingMail extends MailContent {
  to: string;
}

let transporter: Promise<Transporter> | undefined;

function transport(): Promise<Transporter> {
  transporter ??= (async () => {
    if (env.mail.transport === "off") throw new MailUnavailable();
    if (env.mail.transport === "smtp") return nodemailer.createTransport(env.mail.smtpUrl!);
    const fake = await ensureMailFake(env.mail.fakePort);
    // The fake speaks plain SMTP on loopback only; there is nothing to encrypt against.
    return nodemailer.createTransport({ host: "127.0.0.1", port: fake.port, secure: false, ignoreTLS: true });
  })().catch((error: unknown) => {
    transporter = undefined;
    throw error;
  });
  return transporter;
}

export function mailAvailable(): boolean {
  return env.mail.transport !== "off";
}

export function mailFakeRunning(): boolean {
  return env.mail.transport === "fake";
}

/** Sends and waits until the server accepted the message (the fake has then stored it). */
export async function sendMail(mail: OutgoingMail): Promise<void> {
  await (await transport()).sendMail({ from: env.mail.from, to: mail.to, subject: mail.subject, text: mail.text, html: mail.html });
}

const pending = new Set<Promise<void>>();

/**
 * Sends without making the request wait: for answers that must not take longer when a message
 * goes out (the forgotten-password page) or should not wait on the mail service (note alerts).
 */
export function sendMailInBackground(mail: OutgoingMail): void {
  const sending = sendMail(mail)
    .catch((error: unknown) => {
      if (error instanceof MailUnavailable) return;
      console.error(`Mail to ${mail.to} ("${mail.subject}") could not be sent:`, error);
    })
    .finally(() => pending.delete(sending));
  pending.add(sending);
}

/** Resolves when every background message has been handed over; tests wait on it. */
export async function mailSettled(): Promise<void> {
  while (pending.size > 0) await Promise.all([...pending]);
}

/** The fake's messages; only call where mailFakeRunning() is true. */
export function receivedMail(filter: { to?: string } = {}): Promise<FakeMessage[]> {
  return fakeMailbox(env.mail.fakePort, filter);
}
