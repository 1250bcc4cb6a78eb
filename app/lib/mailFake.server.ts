// The local e-mail fake for development and tests: a real SMTP server (smtp-server) on 127.0.0.1
// that accepts every message, parses it (mailparser) and keeps it in memory, so that /dev/mail
// shows it and tests read it from /dev/mail.json. Nothing it receives ever leaves the machine.
// One per process: the state hangs on globalThis so that the development server's module
// reloads reuse the running fake instead of opening a second one.
import type { AddressInfo } from "node:net";
import { simpleParser, type AddressObject } from "mailparser";
import { SMTPServer } from "smtp-server";

/** Older messages are dropped beyond this, so a long development session stays small. */
export const FAKE_MAILBOX_LIMIT = 500;
const MESSAGE_SIZE_LIMIT_BYTES = 2 * 1024 * 1024;

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

interface FakeState {
  port: number;
  messages: FakeMessage[];
  nextId: number;
}

const STATE_KEY = Symbol.for("kilostep.mailFake");
type GlobalWithFake = typeof globalThis & { [STATE_KEY]?: Promise<FakeState> };

function addressText(field: AddressObject | AddressObject[] | undefined): string {
  if (!field) return "";
  return (Array.isArray(field) ? field : [field]).map((a) => a.text).join(", ");
}

function linksIn(text: string): string[] {
  return [...text.matchAll(/https?:\/\/[^\s<>"')]+/g)].map((m) => m[0].replace(/[.,;:]+$/, ""));
}

function listen(server: SMTPServer, port: number): Promise<number> {
  return new Promise((resolve, reject) => {
    const onError = (error: Error) => reject(error);
    server.server.once("error", onError);
    server.listen(port, "127.0.0.1", () => {
      server.server.off("error", onError);
      resolve((server.server.address() as AddressInfo).port);
    });
  });
}

async function start(preferredPort: number): Promise<FakeState> {
  const state: FakeState = { port: 0, messages: [], nextId: 1 };
  const makeServer = () =>
    new SMTPServer({
      secure: false,
      authOptional: true,
      disabledCommands: ["STARTTLS", "AUTH"],
      logger: false,
      size: MESSAGE_SIZE_LIMIT_BYTES,
      onData(stream, session, callback) {
        simpleParser(stream)
          .then((parsed) => {
            const text = parsed.text ?? "";
            state.messages.push({
              id: state.nextId++,
              receivedAt: new Date().toISOString(),
              from: addressText(parsed.from),
              to: session.envelope.rcptTo.map((r) => r.address.toLowerCase()),
              subject: parsed.subject ?? "",
              text,
              html: typeof parsed.html === "string" ? parsed.html : null,
              links: linksIn(text),
            });
            if (state.messages.length > FAKE_MAILBOX_LIMIT) state.messages.splice(0, state.messages.length - FAKE_MAILBOX_LIMIT);
            callback();
          })
          .catch((error: Error) => callback(error));
      },
    });
  let server = makeServer();
  try {
    state.port = await listen(server, preferredPort);
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== "EADDRINUSE" || preferredPort === 0) throw error;
    // A second development server on this machine: take any free port rather than fail.
    console.warn(`The mail fake could not use port ${preferredPort} (in use); it listens on a free port instead.`);
    server = makeServer();
    state.port = await listen(server, 0);
  }
  // The fake must never keep a process alive that has nothing else to do (tests, scripts).
  server.server.unref();
  return state;
}

/** Starts the fake once per process (or returns the running one). */
export function ensureMailFake(preferredPort: number): Promise<FakeState> {
  const holder = globalThis as GlobalWithFake;
  holder[STATE_KEY] ??= start(preferredPort).catch((error: unknown) => {
    holder[STATE_KEY] = undefined;
    throw error;
  });
  return holder[STATE_KEY];
}

/** What the fake has received, newest first; `to` keeps only messages to that address. */
export async function fakeMailbox(preferredPort: number, filter: { to?: string } = {}): Promise<FakeMessage[]> {
  const state = await ensureMailFake(preferredPort);
  const to = filter.to?.trim().toLowerCase();
  return state.messages.filter((m) => !to || m.to.includes(to)).reverse();
}
