// The local e-mail fake for development and tests: messages never leave the process. nodemailer
// renders each message as it would for SMTP (its stream transport), mailparser reads it back, and
// the result is kept in memory for /dev/mail and the tests. There is no port to collide on, so any
// number of servers can run on one machine. The mailbox hangs on globalThis so that the
// development server's module reloads keep it.
import { simpleParser, type AddressObject } from "mailparser";

/** Older messages are dropped beyond this, so a long development session stays small. */
export const FAKE_MAILBOX_LIMIT = 500;

export interface FakeMessage {
  id: number;
  receivedAt: string;
  from: string;
  /** The envelope's recipients, lower-cased. */
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  /** Every http(s) address in the text part, in order: what a test follows. */
  links: string[];
}

interface Mailbox {
  messages: FakeMessage[];
  nextId: number;
}

const MAILBOX_KEY = Symbol.for("kilostep.mailFake");
type GlobalWithMailbox = typeof globalThis & { [MAILBOX_KEY]?: Mailbox };

function mailbox(): Mailbox {
  const holder = globalThis as GlobalWithMailbox;
  holder[MAILBOX_KEY] ??= { messages: [], nextId: 1 };
  return holder[MAILBOX_KEY];
}

function addressText(field: AddressObject | AddressObject[] | undefined): string {
  if (!field) return "";
  return (Array.isArray(field) ? field : [field]).map((a) => a.text).join(", ");
}

function linksIn(text: string): string[] {
  return [...text.matchAll(/https?:\/\/[^\s<>"')]+/g)].map((m) => m[0].replace(/[.,;:]+$/, ""));
}

/** Reads a rendered message (RFC 5322 source) into the mailbox; `to` is the envelope's recipients. */
export async function keepMessage(source: Buffer | string, to: string[]): Promise<FakeMessage> {
  const parsed = await simpleParser(source);
  const box = mailbox();
  const text = parsed.text ?? "";
  const message: FakeMessage = {
    id: box.nextId++,
    receivedAt: new Date().toISOString(),
    from: addressText(parsed.from),
    to: to.map((address) => address.toLowerCase()),
    subject: parsed.subject ?? "",
    text,
    html: typeof parsed.html === "string" ? parsed.html : null,
    links: linksIn(text),
  };
  box.messages.push(message);
  if (box.messages.length > FAKE_MAILBOX_LIMIT) box.messages.splice(0, box.messages.length - FAKE_MAILBOX_LIMIT);
  return message;
}

/** What the fake has received, newest first; `to` keeps only messages to that address. */
export function fakeMailbox(filter: { to?: string } = {}): FakeMessage[] {
  const to = filter.to?.trim().toLowerCase();
  return mailbox()
    .messages.filter((m) => !to || m.to.includes(to))
    .reverse();
}
