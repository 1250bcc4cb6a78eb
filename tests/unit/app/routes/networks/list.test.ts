import { beforeAll, describe, expect, it } from "vitest";
import { getDb } from "#app/lib/db.server.ts";
import { action as networksAction, loader as networksLoader } from "#app/routes/networks/list.tsx";
import { loader as networkLoader } from "#app/routes/networks/network.tsx";
import { insertMembership, insertTeamWithOwner } from "#db/teams.ts";
import { call, cookieFor, formRequest, getRequest, makeUser } from "../harness.ts";

const cookie = {} as Record<"owner" | "editor" | "viewer", string>;
let teamId: number;

const post = (who: keyof typeof cookie, fields: Record<string, string>) =>
  call(networksAction, formRequest("/networks", fields, { cookie: cookie[who] }));

async function createAs(who: keyof typeof cookie, template: string, name = "") {
  const outcome = await post(who, { intent: "create", teamId: String(teamId), template, name });
  expect(outcome.status).toBe(302);
  return Number(outcome.headers.get("Location")?.split("/").pop());
}

beforeAll(async () => {
  const db = await getDb();
  const owner = await makeUser("Nell Owner");
  const editor = await makeUser("Ned Editor");
  const viewer = await makeUser("Nan Viewer");
  teamId = (await db.transaction().execute((trx) => insertTeamWithOwner(trx, "Pages team", owner.id))).id;
  await insertMembership(db, teamId, editor.id, "editor");
  await insertMembership(db, teamId, viewer.id, "viewer");
  cookie.owner = await cookieFor(owner);
  cookie.editor = await cookieFor(editor);
  cookie.viewer = await cookieFor(viewer);
});

describe("/networks", () => {
  it("creates a blank network that validates, and one from each demo template", async () => {
    const blank = await createAs("editor", "blank", "Feeder study");
    const page = await call(networkLoader, getRequest(`/networks/${blank}`, cookie.viewer), { networkId: String(blank) });
    expect(page.status).toBe(200);
    expect(page.body.name).toBe("Feeder study");
    expect(page.body.issues).toEqual([]);
    expect(JSON.parse(page.body.documentText).buses).toHaveLength(1);
    expect(JSON.parse(page.body.documentText).sources[0].control).toBe("slack");

    const demo = await createAs("owner", "tarn-head-calder-flats");
    const demoPage = await call(networkLoader, getRequest(`/networks/${demo}`, cookie.owner), { networkId: String(demo) });
    expect(demoPage.body.name).toBe("Tarn Head to Calder Flats (fictional)");
    expect(JSON.parse(demoPage.body.documentText).transformers).toHaveLength(2);
    expect(await createAs("owner", "hollin-moor-solar", "Solar copy")).toBeGreaterThan(0);
  });

  it("lists them with the controls each role may use", async () => {
    const list = async (who: keyof typeof cookie) => (await call(networksLoader, getRequest("/networks", cookie[who]))).body;
    const asViewer = await list("viewer");
    expect(asViewer.networks.length).toBeGreaterThan(0);
    expect(asViewer.networks.every((n: { may: { rename: boolean; delete: boolean } }) => !n.may.rename && !n.may.delete)).toBe(true);
    expect(asViewer.createTeams).toEqual([]);
    const asEditor = await list("editor");
    expect(asEditor.networks.every((n: { may: { rename: boolean; delete: boolean } }) => n.may.rename && !n.may.delete)).toBe(true);
    expect(asEditor.createTeams).toEqual([{ id: teamId, name: "Pages team" }]);
    const asOwner = await list("owner");
    expect(asOwner.networks.every((n: { may: { rename: boolean; delete: boolean } }) => n.may.rename && n.may.delete)).toBe(true);
  });

  it("refuses a viewer's create, rename and delete with 403", async () => {
    const id = await createAs("editor", "blank", "Guarded");
    expect((await post("viewer", { intent: "create", teamId: String(teamId), template: "blank", name: "x" })).status).toBe(403);
    expect((await post("viewer", { intent: "rename", networkId: String(id), name: "Mine now" })).status).toBe(403);
    expect((await post("viewer", { intent: "delete", networkId: String(id) })).status).toBe(403);
    expect((await post("editor", { intent: "delete", networkId: String(id) })).status).toBe(403);
  });

  it("renames as a new revision whose document carries the new name", async () => {
    const id = await createAs("editor", "blank", "Before");
    const outcome = await post("editor", { intent: "rename", networkId: String(id), name: "  After  " });
    expect(outcome.status).toBe(200);
    const page = await call(networkLoader, getRequest(`/networks/${id}`, cookie.editor), { networkId: String(id) });
    expect(page.body.name).toBe("After");
    expect(JSON.parse(page.body.documentText).name).toBe("After");
    expect(page.body.revision.number).toBe(2);
    expect(page.body.revision.message).toBe('Renamed to "After"');
    const empty = await post("editor", { intent: "rename", networkId: String(id), name: "  " });
    expect(empty.status).toBe(400);
    expect(empty.body.message).toBe("Give the network a name.");
  });

  it("deletes softly: listed as recently deleted, then restored by the owner", async () => {
    const id = await createAs("owner", "blank", "Short-lived");
    expect((await post("owner", { intent: "delete", networkId: String(id) })).status).toBe(200);
    const list = (await call(networksLoader, getRequest("/networks", cookie.owner))).body;
    expect(list.networks.map((n: { id: number }) => n.id)).not.toContain(id);
    expect(list.deleted.map((n: { id: number }) => n.id)).toContain(id);
    const gone = await call(networkLoader, getRequest(`/networks/${id}`, cookie.owner), { networkId: String(id) });
    expect(gone.status).toBe(404);

    const editorList = (await call(networksLoader, getRequest("/networks", cookie.editor))).body;
    expect(editorList.deleted).toEqual([]);
    expect((await post("editor", { intent: "restore", networkId: String(id) })).status).toBe(403);

    expect((await post("owner", { intent: "restore", networkId: String(id) })).status).toBe(200);
    const back = await call(networkLoader, getRequest(`/networks/${id}`, cookie.viewer), { networkId: String(id) });
    expect(back.status).toBe(200);
  });

  it("cannot restore after 30 days; the network is purged", async () => {
    const id = await createAs("owner", "blank", "Long gone");
    const db = await getDb();
    const longAgo = new Date(Date.now() - 31 * 86_400_000).toISOString();
    await db.updateTable("networks").set({ deleted_at: longAgo }).where("id", "=", id).execute();
    const list = (await call(networksLoader, getRequest("/networks", cookie.owner))).body;
    expect(list.deleted.map((n: { id: number }) => n.id)).not.toContain(id);
    const outcome = await post("owner", { intent: "restore", networkId: String(id) });
    expect(outcome.status).toBe(409);
  });

  it("names a missing team and an unknown starting point", async () => {
    expect((await post("owner", { intent: "create", template: "blank" })).body.message).toBe("Choose the team the network belongs to.");
    const unknown = await post("owner", { intent: "create", teamId: String(teamId), template: "nonsense" });
    expect(unknown.status).toBe(400);
    expect(unknown.body.message).toMatch(/nonsense/);
  });
});
