// Issue #13, findings 2 and 8 (/dev/mail): the mail fake's pages needed no sign-in and answered
// anyone who could reach the server, and in production whenever the fake was on; one malformed
// address in a message made /dev/mail answer 500 for everyone.
import { afterEach, describe, expect, it, vi } from "vitest";
import { sendMail } from "#app/lib/mail.server.ts";
import { loader as mailJson } from "#app/routes/dev/mail-json.ts";
import { loader as mailPage } from "#app/routes/dev/mail.tsx";
import { call, getRequest } from "../harness.ts";

describe("/dev/mail and /dev/mail.json", () => {
  it("answer a client on this machine and nobody else", async () => {
    for (const clientAddress of ["127.0.0.1", "::1", "::ffff:127.0.0.1"]) {
      expect((await call(mailJson, getRequest("/dev/mail.json"), {}, { clientAddress })).status).toBe(200);
      expect((await call(mailPage, getRequest("/dev/mail"), {}, { clientAddress })).status).toBe(200);
    }
    for (const clientAddress of ["192.168.1.20", "10.0.0.7", "2001:db8::1", "::ffff:203.0.113.9"]) {
      expect((await call(mailJson, getRequest("/dev/mail.json"), {}, { clientAddress })).status).toBe(404);
      expect((await call(mailPage, getRequest("/dev/mail"), {}, { clientAddress })).status).toBe(404);
    }
  });

  it("a forged X-Forwarded-For does not make a remote client local", async () => {
    const request = new Request("http://kilostep.test/dev/mail.json", { headers: { "X-Forwarded-For": "127.0.0.1", "X-Real-IP": "127.0.0.1" } });
    expect((await call(mailJson, request, {}, { clientAddress: "198.51.100.4" })).status).toBe(404);
  });

  it("list a message whose text carries a malformed address instead of answering 500", async () => {
    const to = `malformed.${Date.now()}@example.org`;
    await sendMail({ to, subject: "odd link", text: "See http://[bad and https://exa mple and http://%zz", html: "<p>odd</p>" });
    const page = await call(mailPage, getRequest("/dev/mail"), {}, { clientAddress: "127.0.0.1" });
    expect(page.status).toBe(200);
    const { renderToStaticMarkup } = await import("react-dom/server");
    const { createElement } = await import("react");
    const { createRoutesStub } = await import("react-router");
    const DevMail = (await import("#app/routes/dev/mail.tsx")).default;
    const Stub = createRoutesStub([{ path: "/dev/mail", Component: () => createElement(DevMail, { loaderData: page.body } as never) }]);
    const html = renderToStaticMarkup(createElement(Stub, { initialEntries: ["/dev/mail"] }));
    expect(html).toContain("odd link");
    expect(html).toContain("http://[bad");
  });
});

describe("the development pages in production", () => {
  const saved = { ...process.env };
  afterEach(() => {
    process.env = { ...saved };
    vi.resetModules();
  });

  it("do not exist, and the mail fake cannot be switched on there", async () => {
    vi.resetModules();
    process.env = { ...saved, NODE_ENV: "production", SESSION_SECRET: "x".repeat(40), MAIL_TRANSPORT: "fake" };
    delete process.env.PASSWORD_HASH_COST;
    await expect(import("#app/lib/env.server.ts")).rejects.toThrow(/MAIL_TRANSPORT may not be fake in production/);
    vi.resetModules();
    process.env = { ...saved, NODE_ENV: "production", SESSION_SECRET: "x".repeat(40), SMTP_URL: "smtp://127.0.0.1:1" };
    delete process.env.PASSWORD_HASH_COST;
    const json = (await import("#app/routes/dev/mail-json.ts")).loader;
    expect((await call(json, getRequest("/dev/mail.json"), {}, { clientAddress: "127.0.0.1" })).status).toBe(404);
  });
});
