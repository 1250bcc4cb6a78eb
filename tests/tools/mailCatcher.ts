// A stand-in mail service for tests of the production server, which has no mail fake of its own:
// an SMTP server on a free loopback port that keeps every message (parsed as the app's fake
// parses them) and a small HTTP endpoint on another free port that lists them as JSON,
// newest first (?to= narrows to one recipient).
import { createServer } from "node:http";
import type { AddressInfo } from "node:net";
import { SMTPServer } from "smtp-server";
import { fakeMailbox, keepMessage } from "#app/lib/mailFake.server.ts";

export interface MailCatcher {
  /** For SMTP_URL. */
  smtpUrl: string;
  /** GET it (with ?to=) for `{ messages }`. */
  mailboxUrl: string;
  close(): Promise<void>;
}

function listening(server: { listen(port: number, host: string, done: () => void): unknown }, address: () => AddressInfo): Promise<number> {
  return new Promise((done) => server.listen(0, "127.0.0.1", () => done(address().port)));
}

export async function startMailCatcher(): Promise<MailCatcher> {
  const smtp = new SMTPServer({
    secure: false,
    authOptional: true,
    disabledCommands: ["STARTTLS", "AUTH"],
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on("data", (chunk: Buffer) => chunks.push(chunk));
      stream.on("end", () => {
        keepMessage(Buffer.concat(chunks), session.envelope.rcptTo.map((r) => r.address))
          .then(() => callback())
          .catch((error: Error) => callback(error));
      });
    },
  });
  const http = createServer((request, response) => {
    const to = new URL(request.url ?? "/", "http://catcher").searchParams.get("to") ?? undefined;
    response.setHeader("Content-Type", "application/json");
    response.end(JSON.stringify({ messages: fakeMailbox({ to }) }));
  });
  const smtpPort = await listening(smtp, () => smtp.server.address() as AddressInfo);
  const httpPort = await listening(http, () => http.address() as AddressInfo);
  return {
    smtpUrl: `smtp://127.0.0.1:${smtpPort}`,
    mailboxUrl: `http://127.0.0.1:${httpPort}/`,
    close: () => new Promise((done) => smtp.close(() => http.close(() => done()))),
  };
}
