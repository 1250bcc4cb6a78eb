// Sending e-mail: nodemailer over SMTP to the real service (SMTP_URL), or into the in-process fake
// (mailFake.server.ts) in development and tests. In production without SMTP_URL mail is off, and
// the features that need it say so instead of pretending to send. A failing mail service never
// takes the server down: a foreground send reports the failure to its caller, a background send
// is retried and then logged, and the request that caused it has long been answered.
import nodemailer, { type Transporter } from "nodemailer";
import { env } from "./env.server.ts";
import { fakeMailbox, keepMessage, type FakeMessage } from "./mailFake.server.ts";
import type { MailContent } from "./mailMessages.ts";
import { createRateLimiter } from "./rateLimit.server.ts";

export class MailUnavailable extends Error {
  constructor() {
    super("E-mail is not set up on this server (SMTP_URL is missing), so nothing could be sent.");
    this.name = "MailUnavailable";
  }
}

export interface OutgoingMail extends MailContent {
  to: string;
}

let transporter: Transporter | undefined;

function transport(): Transporter {
  if (env.mail.transport === "off") throw new MailUnavailable();
  transporter ??=
    env.mail.transport === "smtp"
      ? nodemailer.createTransport(env.mail.smtpUrl!)
      : // Rendered exactly as for SMTP, then handed to the fake instead of a socket.
        nodemailer.createTransport({ streamTransport: true, buffer: true });
  return transporter;
}

export function mailAvailable(): boolean {
  return env.mail.transport !== "off";
}

export function mailFakeRunning(): boolean {
  return env.mail.transport === "fake";
}

/** Sends and waits until the mail service accepted the message (the fake has then stored it). */
export async function sendMail(mail: OutgoingMail): Promise<void> {
  const info = await transport().sendMail({ from: env.mail.from, to: mail.to, subject: mail.subject, text: mail.text, html: mail.html });
  if (env.mail.transport === "fake") await keepMessage(info.message as Buffer, info.envelope.to);
}

/** Waits before each retry of a background message: a mail service that hiccups gets time to recover. */
export const BACKGROUND_RETRY_DELAYS_MS = [2_000, 30_000];

const pending = new Set<Promise<void>>();

function pause(ms: number): Promise<void> {
  return new Promise((done) => setTimeout(done, ms).unref());
}

async function sendWithRetries(mail: OutgoingMail, delaysMs: readonly number[]): Promise<void> {
  for (let attempt = 0; ; attempt++) {
    try {
      return await sendMail(mail);
    } catch (error) {
      if (error instanceof MailUnavailable) return;
      if (attempt >= delaysMs.length) {
        console.error(`Mail to ${mail.to} ("${mail.subject}") could not be sent after ${attempt + 1} attempts:`, error);
        return;
      }
      await pause(delaysMs[attempt]);
    }
  }
}

/**
 * Sends without making the request wait: for answers that must not take longer when a message
 * goes out (the forgotten-password page) or should not wait on the mail service (note alerts).
 */
export function sendMailInBackground(mail: OutgoingMail, delaysMs: readonly number[] = BACKGROUND_RETRY_DELAYS_MS): void {
  const sending = sendWithRetries(mail, delaysMs).finally(() => pending.delete(sending));
  pending.add(sending);
}

/** Resolves when every background message has been handed over; tests wait on it. */
export async function mailSettled(): Promise<void> {
  while (pending.size > 0) await Promise.all([...pending]);
}

/** The fake's messages; only call where mailFakeRunning() is true. */
export async function receivedMail(filter: { to?: string } = {}): Promise<FakeMessage[]> {
  return fakeMailbox(filter);
}

/**
 * Mail a person makes the product send to addresses of their choosing (invitations, review
 * requests) carries their words to strangers; each account may send this many an hour.
 */
export const PERSONAL_MAIL_PER_HOUR = 30;
const personalMail = createRateLimiter({ limit: PERSONAL_MAIL_PER_HOUR, windowMs: 3_600_000 });

export const PERSONAL_MAIL_LIMIT_MESSAGE = `You have sent ${PERSONAL_MAIL_PER_HOUR} invitations and review requests in the last hour, the most one account may; try again later.`;

/** Counts one message the user asks for; false when the hour's allowance is spent. */
export function spendPersonalMailAllowance(userId: number, now = Date.now()): boolean {
  return personalMail.hit(`user:${userId}`, now).allowed;
}
