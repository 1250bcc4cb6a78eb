import { beforeAll, describe, expect, it } from "vitest";
import { getDb } from "#app/lib/db.server.ts";
import { saveNetworkDocument } from "#app/lib/networks.server.ts";
import { loader as revisionApi } from "#app/routes/api/revision.ts";
import { loader as revisionsApi } from "#app/routes/api/revisions.ts";
import { action as shareApi } from "#app/routes/api/share.ts";
import { action as networkSharesApi } from "#app/routes/api/network-shares.ts";
import { action as listAction } from "#app/routes/networks/list.tsx";
import { loader as revisionPage } from "#app/routes/networks/revision.tsx";
import { action as revisionsAction, loader as revisionsPage } from "#app/routes/networks/revisions.tsx";
import { action as teamAction, loader as teamLoader } from "#app/routes/teams/team.tsx";
import { readRevision } from "#db/networks.ts";
import { call, formRequest, getRequest, jsonRequest } from "../harness.ts";
import { demoDocument, freshWorld, makePeople, type People, type World } from "../reviewWorld.ts";

let people: People;
let world: World;

beforeAll(async () => {
  people = await makePeople("History");
  world = await freshWorld(people, "History");
  const db = await getDb();
  const second = demoDocument("History main");
  (second.lines as { id: string; lengthKm: number }[]).find((l) => l.id === "l-fell")!.lengthKm = 52;
  const third = { ...second, loads: [...(second.loads as object[]), { id: "ld-quarry", name: "Quarry", bus: "b-town", pMW: 1.5, qMvar: 0.4 }] };
  for (const [i, document] of [second, third].entries()) {
    const saved = await saveNetworkDocument(db, { networkId: world.networkId, expectedRevision: i + 1, document, authorId: people.editor.id, message: `step ${i + 2}` });
    if (!saved.ok) throw new Error("fixture saves must succeed");
  }
});

const params = () => ({ networkId: String(world.networkId) });

describe("Revisions", () => {
  it("lists every save and, by default, compares the last one with the one before", async () => {
    const page = await call(revisionsPage, getRequest(`/networks/${world.networkId}/revisions`, people.cookies.viewer), params());
    expect(page.body.revisions.map((r: { number: number; message: string }) => [r.number, r.message])).toEqual([
      [3, "step 3"],
      [2, "step 2"],
      [1, "Created"],
    ]);
    expect(page.body).toMatchObject({ from: 2, to: 3, mayRestore: false });
    expect(page.body.diff.added).toEqual([expect.objectContaining({ id: "ld-quarry", kind: "Load" })]);
  });

  it("compares any two revisions asked for, field by field with units", async () => {
    const page = await call(revisionsPage, getRequest(`/networks/${world.networkId}/revisions?from=1&to=2`, people.cookies.viewer), params());
    expect(page.body.diff.changed).toEqual([
      expect.objectContaining({ id: "l-fell", changes: [expect.objectContaining({ field: "lengthKm", fromText: "48 km", toText: "52 km" })] }),
    ]);
    const missing = await call(revisionsPage, getRequest(`/networks/${world.networkId}/revisions?from=1&to=9`, people.cookies.viewer), params());
    expect(missing.body.diffError).toBe("There is no revision 9.");
  });

  it("opens a past revision read only", async () => {
    const page = await call(revisionPage, getRequest(`/networks/${world.networkId}/revisions/2`, people.cookies.viewer), { ...params(), number: "2" });
    expect(page.body).toMatchObject({ number: 2, current: 3, mayRestore: false, revision: { ok: true, message: "step 2" } });
    expect(page.body.revision.document.lines.find((l: { id: string }) => l.id === "l-fell").lengthKm).toBe(52);
    const none = await call(revisionPage, getRequest(`/networks/${world.networkId}/revisions/99`, people.cookies.viewer), { ...params(), number: "99" });
    expect(none.status).toBe(404);
  });

  it("restores a revision as a new one (editors), overwriting nothing, and logs it", async () => {
    const db = await getDb();
    const viewer = await call(revisionsAction, formRequest(`/networks/${world.networkId}/revisions`, { intent: "restore", number: "1" }, { cookie: people.cookies.viewer }), params());
    expect(viewer.status).toBe(403);
    const restored = await call(
      revisionsAction,
      formRequest(`/networks/${world.networkId}/revisions`, { intent: "restore", number: "1" }, { cookie: people.cookies.editLink }),
      params(),
    );
    expect(restored).toMatchObject({ status: 200, body: { ok: true, message: "Revision 1 is restored as revision 4." } });
    const fourth = await readRevision(db, world.networkId, 4);
    const first = await readRevision(db, world.networkId, 1);
    expect(fourth?.document).toEqual(first?.document);
    expect(fourth?.message).toBe("Restored revision 1");
    expect(fourth?.authorName).toBe(people.editLinkUser.name);
    expect(await readRevision(db, world.networkId, 3)).toMatchObject({ message: "step 3" });
  });

  it("answers the API: the list, and one revision's document", async () => {
    const list = await call(revisionsApi, getRequest(`/api/networks/${world.networkId}/revisions`, people.cookies.viewer), params());
    expect(list.status).toBe(200);
    expect(list.body.revisions[0]).toEqual({ number: 4, createdAt: expect.any(String), author: people.editLinkUser.name, message: "Restored revision 1" });
    const one = await call(revisionApi, getRequest(`/api/networks/${world.networkId}/revisions/2`, people.cookies.viewer), { ...params(), number: "2" });
    expect(one.body).toMatchObject({ networkId: world.networkId, number: 2, message: "step 2", document: { name: "History main" } });
    const none = await call(revisionApi, getRequest(`/api/networks/${world.networkId}/revisions/0`, people.cookies.viewer), { ...params(), number: "0" });
    expect(none.status).toBe(404);
  });
});

describe("the team audit log", () => {
  it("records shares, roles, removals and deleted or restored networks, and shows them to owners only", async () => {
    const own = await freshWorld(people, "Audit");
    const teamId = String(people.team.id);
    const created = await call(networkSharesApi, jsonRequest("POST", `/api/networks/${own.networkId}/shares`, { cookie: people.cookies.owner, body: { role: "viewer", expiresInDays: 5 } }), {
      networkId: String(own.networkId),
    });
    expect(created.status).toBe(201);
    expect(created.body.url).toMatch(/\/s\/[A-Za-z0-9_-]{43}$/);
    const revoked = await call(shareApi, jsonRequest("DELETE", `/api/shares/${created.body.id}`, { cookie: people.cookies.owner }), { shareId: String(created.body.id) });
    expect(revoked).toMatchObject({ status: 200, body: { revoked: true, alreadyRevoked: false } });

    const bad = await call(networkSharesApi, jsonRequest("POST", `/api/networks/${own.networkId}/shares`, { cookie: people.cookies.owner, body: { role: "admin", expiresInDays: 0 } }), {
      networkId: String(own.networkId),
    });
    expect(bad.status).toBe(400);
    expect(bad.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(["expiresInDays", "role"]);

    const changed = await call(teamAction, formRequest(`/teams/${teamId}`, { intent: "change-role", userId: String(people.viewer.id), role: "editor" }, { cookie: people.cookies.owner }), { teamId });
    expect(changed.status).toBe(200);
    const removed = await call(teamAction, formRequest(`/teams/${teamId}`, { intent: "remove", userId: String(people.viewer.id) }, { cookie: people.cookies.owner }), { teamId });
    expect(removed.status).toBe(200);
    const deleted = await call(listAction, formRequest("/networks", { intent: "delete", networkId: String(own.networkId) }, { cookie: people.cookies.owner }));
    expect(deleted.status).toBe(200);
    const back = await call(listAction, formRequest("/networks", { intent: "restore", networkId: String(own.networkId) }, { cookie: people.cookies.owner }));
    expect(back.status).toBe(200);

    const page = await call(teamLoader, getRequest(`/teams/${teamId}`, people.cookies.owner), { teamId });
    const kinds = (page.body.owner.audit as { kind: string; summary: string }[]).map((e) => e.kind);
    expect(kinds.slice(0, 6)).toEqual(["network-restored", "network-deleted", "member-removed", "role-changed", "share-revoked", "share-created"]);
    const summaries = (page.body.owner.audit as { summary: string }[]).map((e) => e.summary);
    expect(summaries).toContain(`${people.owner.name} changed the role of ${people.viewer.name} (${people.viewer.email}) from viewer to editor.`);
    expect(summaries).toContain(`${people.owner.name} removed ${people.viewer.name} (${people.viewer.email}) (was editor) from the team.`);

    const editorView = await call(teamLoader, getRequest(`/teams/${teamId}`, people.cookies.editor), { teamId });
    expect(editorView.body.owner).toBeNull();
  });
});
