// Issue #13, finding 3: the mail fake bound a fixed port, so a second server on the machine died
// with EADDRINUSE at its first message, taking the request in flight with it. The fake now lives
// in the process (no port at all), and a mail service that fails never takes the server down: a
// background message is retried and then reported, a foreground one is reported to the person.
// (Two built servers side by side sending mail: tests/served/servedChecks.ts, in the browser run.)
import { createServer, type Server } from "node:net";
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import { insertTeamWithOwner } from "#db/teams.ts";
import { call, cookieFor, formRequest, makeUser } from "../routes/harness.ts";

/** An SMTP address that accepts connections and hangs up at once: a mail service in trouble. */
let refusing: Server;
let refusingPort = 0;
let connections = 0;
beforeAll(async () => {
  refusing = createServer((socket) => {
    connections++;
    socket.destroy();
  });
  await new Promise<void>((done) => refusing.listen(0, "127.0.0.1", () => done()));
  refusingPort = (refusing.address() as { port: number }).port;
});
afterAll(() => new Promise<void>((done) => refusing.close(() => done())));

describe("a mail service that fails", () => {
  const saved = { ...process.env };
  afterEach(() => {
    process.env = { ...saved };
    vi.resetModules();
    vi.restoreAllMocks();
  });

  async function modulesWithBrokenSmtp() {
    vi.resetModules();
    process.env = { ...saved, SMTP_URL: `smtp://127.0.0.1:${refusingPort}` };
    return {
      mail: await import("#app/lib/mail.server.ts"),
      forgot: (await import("#app/routes/auth/forgot-password.tsx")).action,
      invitations: (await import("#app/routes/teams/invitations.ts")).action,
      db: await (await import("#app/lib/db.server.ts")).getDb(),
    };
  }

  it("a background message is tried again, then reported once; the process carries on", async () => {
    const { mail } = await modulesWithBrokenSmtp();
    const reported = vi.spyOn(console, "error").mockImplementation(() => {});
    const before = connections;
    mail.sendMailInBackground({ to: "someone@example.org", subject: "s", text: "t", html: "<p>t</p>" }, [5, 5]);
    await mail.mailSettled();
    expect(connections - before).toBe(3);
    expect(reported).toHaveBeenCalledTimes(1);
    expect(String(reported.mock.calls[0][0])).toMatch(/could not be sent after 3 attempts/);
  });

  it("the forgotten-password page answers at once; an invitation says the message did not go", async () => {
    const { forgot, invitations, db } = await modulesWithBrokenSmtp();
    vi.spyOn(console, "error").mockImplementation(() => {});
    const user = await makeUser("Mabel Mailless");
    expect((await call(forgot, formRequest("/forgot-password", { email: user.email }))).status).toBe(200);

    const team = await db.transaction().execute((trx) => insertTeamWithOwner(trx, "Mailless team", user.id));
    const sent = await call(
      invitations,
      formRequest(`/teams/${team.id}/invitations`, { intent: "invite", email: "new.person@example.org", role: "viewer" }, { cookie: await cookieFor(user) }),
      { teamId: String(team.id) },
    );
    expect(sent.body).toMatchObject({ ok: false, message: expect.stringMatching(/could not be sent/) });
  });
});
