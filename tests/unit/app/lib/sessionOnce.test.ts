// One session lookup per request: the root's loader and the page's both ask who is signed in, on
// the same Request (React Router's own static handler runs them here as the server does), and the
// sessions table is read once. The next request reads it again, so an ended session ends at once.
import { createStaticHandler } from "react-router";
import { describe, expect, it, vi } from "vitest";

const lookups = vi.hoisted(() => ({ count: 0 }));
vi.mock("#db/sessions.ts", async (importOriginal) => {
  const original = await importOriginal<typeof import("#db/sessions.ts")>();
  return {
    ...original,
    findSessionUser: (...args: Parameters<typeof original.findSessionUser>) => (lookups.count++, original.findSessionUser(...args)),
  };
});

import { loader as rootLoader } from "#app/root.tsx";
import { loader as networksPage } from "#app/routes/networks/list.tsx";
import { getDb } from "#app/lib/db.server.ts";
import { sessionCookie } from "#app/lib/session.server.ts";
import { deleteSession } from "#db/sessions.ts";
import { cookieFor, getRequest, makeUser } from "../routes/harness.ts";

const handler = createStaticHandler([
  { id: "root", path: "/", loader: rootLoader as never, children: [{ id: "networks", path: "networks", loader: networksPage as never }] },
]);

describe("the session", () => {
  it("is looked up once for a page whose root and route loaders both need it, and again on the next request", async () => {
    const user = await makeUser("Once Only", { ownTeam: true });
    const cookie = await cookieFor(user);
    lookups.count = 0;
    const first = await handler.query(getRequest("/networks", cookie));
    if (first instanceof Response) throw new Error(`the page answered ${first.status}`);
    expect(first.statusCode).toBe(200);
    expect(first.loaderData.root).toMatchObject({ user: { name: "Once Only" } });
    expect(lookups.count).toBe(1);

    // Ended on the server: the very next request is refused (sent to sign in).
    const sessionId = (await sessionCookie.parse(cookie)) as string;
    await deleteSession(await getDb(), sessionId);
    const after = await handler.query(getRequest("/networks", cookie));
    expect(after instanceof Response ? after.status : after.statusCode).toBe(302);
    expect(lookups.count).toBe(2);
  });
});
