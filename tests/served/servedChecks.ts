// Checks that need the built app behind its real server (app/server.ts), from issue #13:
// - two servers on one machine both send mail (the in-process fake) and keep serving (finding 3);
// - the access log shows share, reset and invitation secrets as "[secret]" (finding 5);
// - every answer carries the security headers: pages, API JSON, CSV downloads, /dev/mail.json and
//   static files (finding 9).
// Run: `npm run build && npx tsx tests/served/servedChecks.ts` (the browser tests run it too).
// Prints one line per check and exits non-zero on the first that fails.
import assert from "node:assert/strict";
import { DEMO_ACCOUNTS } from "#db/demoAccounts.ts";
import { copyBuild, freePort, seededDatabase, signInCookie, startServer, type RunningServer } from "../tools/builtServer.ts";

const SECURITY_HEADERS = { "x-content-type-options": "nosniff", "x-frame-options": "DENY", "referrer-policy": "same-origin" };

function assertSecurityHeaders(response: Response, what: string) {
  for (const [name, value] of Object.entries(SECURITY_HEADERS)) assert.equal(response.headers.get(name), value, `${what}: ${name}`);
}

async function mailbox(server: RunningServer, to: string): Promise<{ links: string[] }[]> {
  const answer = await fetch(`${server.url}/dev/mail.json?to=${encodeURIComponent(to)}`);
  assert.equal(answer.status, 200, "/dev/mail.json answers a client on this machine");
  return ((await answer.json()) as { messages: { links: string[] }[] }).messages;
}

async function askForReset(server: RunningServer, email: string) {
  const answer = await fetch(`${server.url}/forgot-password`, {
    method: "POST",
    headers: { "Content-Type": "application/x-www-form-urlencoded", Origin: server.url },
    body: new URLSearchParams({ email }),
  });
  assert.equal(answer.status, 200, "the forgotten-password form answers");
}

async function eventually<T>(read: () => Promise<T>, ok: (value: T) => boolean): Promise<T> {
  for (let i = 0; ; i++) {
    const value = await read();
    if (ok(value) || i > 100) return value;
    await new Promise((r) => setTimeout(r, 100));
  }
}

const build = copyBuild();
const databases = [await seededDatabase(), await seededDatabase()];
const servers: RunningServer[] = [];
try {
  // Development mode: the mail fake is on. Both at once, on one machine.
  for (const database of databases) {
    servers.push(
      await startServer({ build, databasePath: database.databasePath, port: await freePort(), keepOutput: true, env: { NODE_ENV: "development" } }),
    );
  }
  const owner = DEMO_ACCOUNTS.find((a) => a.role === "owner")!;
  await Promise.all(servers.map((server) => askForReset(server, owner.email)));
  for (const server of servers) {
    const messages = await eventually(() => mailbox(server, owner.email), (m) => m.length > 0);
    assert.equal(messages.length, 1, "each server kept its own message");
    assert.match(messages[0].links[0], new RegExp(`^${server.url}/reset-password\\?token=`));
    assert.equal((await fetch(`${server.url}/sign-in`)).status, 200, "the server still serves after sending mail");
  }
  console.log("two servers on one machine: both sent mail and keep serving");

  const [server] = servers;
  const [{ links }] = await mailbox(server, owner.email);
  const resetToken = new URL(links[0]).searchParams.get("token")!;
  await fetch(links[0]);
  const cookie = await signInCookie(server.url, owner.email, owner.password);
  const listed = (await (await fetch(`${server.url}/api/networks`, { headers: { Cookie: cookie } })).json()) as { networks: { id: number }[] };
  const networkId = listed.networks[0].id;
  const share = await fetch(`${server.url}/api/networks/${networkId}/shares`, {
    method: "POST",
    headers: { Cookie: cookie, "Content-Type": "application/json" },
    body: JSON.stringify({ role: "viewer", expiresInDays: 1 }),
  });
  const shareUrl = ((await share.json()) as { url: string }).url;
  const shareToken = shareUrl.split("/s/")[1];
  await fetch(shareUrl);
  await fetch(`${shareUrl}/results.csv?table=buses`);
  await fetch(`${server.url}/invitations/${"x".repeat(43)}`);
  const log = await eventually(
    async () => server.output.join("\n"),
    (text) => text.includes("/invitations/"),
  );
  assert.ok(!log.includes(resetToken), "the reset token is not in the access log");
  assert.ok(!log.includes(shareToken), "the share token is not in the access log");
  assert.ok(!log.includes("x".repeat(43)), "the invitation token is not in the access log");
  assert.match(log, /GET \/reset-password\?token=\[secret\] 200/);
  assert.match(log, /GET \/s\/\[secret\]\/results\.csv\?table=buses 200/);
  console.log("the access log shows every link secret as [secret]");

  const page = await fetch(`${server.url}/sign-in`);
  assertSecurityHeaders(page, "a page");
  assert.match(page.headers.get("content-security-policy") ?? "", /script-src 'self' 'nonce-/);
  assertSecurityHeaders(await fetch(`${server.url}/api/schema`), "API JSON");
  assertSecurityHeaders(await fetch(`${server.url}/api/networks`), "an API refusal");
  const csv = await fetch(`${server.url}/api/networks/${networkId}/results.csv?table=buses`, { headers: { Cookie: cookie } });
  assert.equal(csv.status, 200);
  assertSecurityHeaders(csv, "a CSV download");
  assertSecurityHeaders(await fetch(`${server.url}/dev/mail.json`), "/dev/mail.json");
  const html = await page.text();
  const asset = html.match(/\/assets\/[^"]+\.js/)?.[0];
  assert.ok(asset, "the page names a script");
  const file = await fetch(`${server.url}${asset}`);
  assert.equal(file.status, 200);
  assertSecurityHeaders(file, "a static file");
  assertSecurityHeaders(await fetch(`${server.url}/favicon.svg`), "a public file");
  console.log("security headers on pages, API JSON, CSV, /dev/mail.json and static files");
} finally {
  await Promise.all(servers.map((s) => s.stop()));
  for (const database of databases) database.remove();
  build.remove();
}
