import { beforeAll, describe, expect, it } from "vitest";
import hollinMoorSolar from "../../../../fixtures/hollin-moor-solar.json";
import tarnHead from "../../../../fixtures/tarn-head-calder-flats.json";
import { getDb } from "#app/lib/db.server.ts";
import { loader as getNetwork, action as changeNetwork } from "#app/routes/api/network.ts";
import { loader as listNetworks, action as createNetworkApi } from "#app/routes/api/networks.ts";
import { action as solveSaved } from "#app/routes/api/network-solve.ts";
import { loader as schema } from "#app/routes/api/schema.ts";
import { action as solvePosted } from "#app/routes/api/solve.ts";
import { insertMembership, insertTeamWithOwner } from "#db/teams.ts";
import { call, cookieFor, getRequest, jsonRequest, makeUser } from "../harness.ts";

const cookies = {} as Record<"owner" | "editor" | "viewer" | "outsider", string>;
let teamId: number;
let networkId: number;

async function revisionsOf(id: number) {
  const db = await getDb();
  return db.selectFrom("network_revisions").select(["number", "document"]).where("network_id", "=", id).orderBy("number").execute();
}

beforeAll(async () => {
  const db = await getDb();
  const owner = await makeUser("Api Owner", { ownTeam: true });
  const editor = await makeUser("Api Editor");
  const viewer = await makeUser("Api Viewer");
  const outsider = await makeUser("Api Outsider", { ownTeam: true });
  teamId = (await db.transaction().execute((trx) => insertTeamWithOwner(trx, "API team", owner.id))).id;
  await insertMembership(db, teamId, editor.id, "editor");
  await insertMembership(db, teamId, viewer.id, "viewer");
  cookies.owner = await cookieFor(owner);
  cookies.editor = await cookieFor(editor);
  cookies.viewer = await cookieFor(viewer);
  cookies.outsider = await cookieFor(outsider);
  const created = await call(createNetworkApi, jsonRequest("POST", `/api/networks?team=${teamId}`, { cookie: cookies.owner, body: tarnHead }));
  expect(created.status).toBe(201);
  networkId = created.body.id;
});

describe("GET /api/networks", () => {
  it("answers 401 in JSON without a session", async () => {
    const outcome = await call(listNetworks, getRequest("/api/networks"));
    expect(outcome.status).toBe(401);
    expect(outcome.body.error).toMatch(/Sign in/);
  });

  it("lists the caller's networks with team, role and revision, and not other teams'", async () => {
    const viewer = await call(listNetworks, getRequest("/api/networks", cookies.viewer));
    expect(viewer.status).toBe(200);
    expect(viewer.body.networks).toEqual([
      expect.objectContaining({ id: networkId, name: tarnHead.name, team: { id: teamId, name: "API team" }, role: "viewer", revision: 1 }),
    ]);
    const outsider = await call(listNetworks, getRequest("/api/networks", cookies.outsider));
    expect(outsider.body.networks.map((n: { id: number }) => n.id)).not.toContain(networkId);
  });
});

describe("POST /api/networks", () => {
  it("creates from a valid document: 201 with a Location", async () => {
    const outcome = await call(
      createNetworkApi,
      jsonRequest("POST", `/api/networks?team=${teamId}`, { cookie: cookies.editor, body: hollinMoorSolar }),
    );
    expect(outcome.status).toBe(201);
    expect(outcome.headers.get("Location")).toBe(`/api/networks/${outcome.body.id}`);
    expect(outcome.body).toMatchObject({ name: hollinMoorSolar.name, revision: 1, role: "editor", teamId });
  });

  it("refuses a viewer (403) and someone outside the team (404)", async () => {
    const viewer = await call(createNetworkApi, jsonRequest("POST", `/api/networks?team=${teamId}`, { cookie: cookies.viewer, body: tarnHead }));
    expect(viewer.status).toBe(403);
    expect(viewer.body.error).toMatch(/viewer/);
    const outsider = await call(createNetworkApi, jsonRequest("POST", `/api/networks?team=${teamId}`, { cookie: cookies.outsider, body: tarnHead }));
    expect(outsider.status).toBe(404);
  });

  it("names an unknown or malformed team", async () => {
    const unknown = await call(createNetworkApi, jsonRequest("POST", "/api/networks?team=999999", { cookie: cookies.owner, body: tarnHead }));
    expect(unknown.status).toBe(404);
    expect(unknown.body.error).toBe("There is no team 999999 that you belong to.");
    const malformed = await call(createNetworkApi, jsonRequest("POST", "/api/networks?team=abc", { cookie: cookies.owner, body: tarnHead }));
    expect(malformed.status).toBe(400);
    expect(malformed.body.error).toMatch(/team number/);
  });

  it("asks which team when the caller may create in more than one", async () => {
    const outcome = await call(createNetworkApi, jsonRequest("POST", "/api/networks", { cookie: cookies.owner, body: tarnHead }));
    expect(outcome.status).toBe(400);
    expect(outcome.body.error).toMatch(/\?team=ID/);
  });

  it("answers malformed JSON with 400 and a sentence", async () => {
    const outcome = await call(createNetworkApi, jsonRequest("POST", `/api/networks?team=${teamId}`, { cookie: cookies.owner, raw: "{ not json" }));
    expect(outcome.status).toBe(400);
    expect(outcome.body.error).toMatch(/^The request body is not valid JSON/);
  });

  it("answers an invalid document with 400 and every path, and saves nothing", async () => {
    const db = await getDb();
    const before = await db.selectFrom("networks").select("id").execute();
    const bad = { ...tarnHead, buses: [{ ...tarnHead.buses[0], nominalKV: -11 }, ...tarnHead.buses.slice(1)], colour: "red" };
    const outcome = await call(createNetworkApi, jsonRequest("POST", `/api/networks?team=${teamId}`, { cookie: cookies.owner, body: bad }));
    expect(outcome.status).toBe(400);
    expect(outcome.body.error).toMatch(/not valid/);
    const paths = outcome.body.issues.map((i: { path: string }) => i.path);
    expect(paths).toContain("buses[0].nominalKV");
    expect(paths).toContain("");
    expect(outcome.body.issues.find((i: { path: string }) => i.path === "").message).toMatch(/"colour"/);
    expect(await db.selectFrom("networks").select("id").execute()).toEqual(before);
  });
});

describe("GET /api/networks/:id", () => {
  it("returns { id, name, revision, role, document } to a viewer", async () => {
    const outcome = await call(getNetwork, getRequest(`/api/networks/${networkId}`, cookies.viewer), { networkId: String(networkId) });
    expect(outcome.status).toBe(200);
    expect(Object.keys(outcome.body).sort()).toEqual(["document", "foldedSaves", "id", "name", "revision", "role"]);
    expect(outcome.body).toMatchObject({ id: networkId, name: tarnHead.name, revision: 1, role: "viewer" });
    expect(outcome.body.document.buses).toHaveLength(tarnHead.buses.length);
  });

  it("answers 404 outside the team, for an unknown id and for a non-number", async () => {
    for (const [cookie, id] of [
      [cookies.outsider, String(networkId)],
      [cookies.owner, "424242"],
      [cookies.owner, "abc"],
    ]) {
      const outcome = await call(getNetwork, getRequest(`/api/networks/${id}`, cookie), { networkId: id });
      expect(outcome.status).toBe(404);
      expect(typeof outcome.body.error).toBe("string");
    }
  });
});

describe("PUT /api/networks/:id", () => {
  const put = (cookie: string, body: unknown, raw?: string) =>
    call(changeNetwork, jsonRequest("PUT", `/api/networks/${networkId}`, { cookie, body, raw }), { networkId: String(networkId) });

  it("refuses a viewer with 403 and writes nothing", async () => {
    const before = await revisionsOf(networkId);
    const outcome = await put(cookies.viewer, { revision: before.length, document: tarnHead });
    expect(outcome.status).toBe(403);
    expect(outcome.body.error).toMatch(/viewer/);
    expect(await revisionsOf(networkId)).toEqual(before);
  });

  it("saves an editor's change as the next revision", async () => {
    const current = (await revisionsOf(networkId)).length;
    const changed = { ...tarnHead, name: "Tarn Head, second thoughts" };
    const outcome = await put(cookies.editor, { revision: current, document: changed, message: "Rename by API" });
    expect(outcome.status).toBe(200);
    expect(outcome.body).toMatchObject({ id: networkId, name: "Tarn Head, second thoughts", revision: current + 1, role: "editor" });
    expect(await revisionsOf(networkId)).toHaveLength(current + 1);
  });

  it("answers a stale revision with 409 and the current revision, and overwrites nothing", async () => {
    const before = await revisionsOf(networkId);
    const outcome = await put(cookies.editor, { revision: 1, document: { ...tarnHead, name: "Stale" } });
    expect(outcome.status).toBe(409);
    expect(outcome.body.currentRevision).toBe(before.length);
    expect(outcome.body.error).toMatch(/not the current one/);
    expect(await revisionsOf(networkId)).toEqual(before);
  });

  it("lets only one of two writers holding the same revision win", async () => {
    const current = (await revisionsOf(networkId)).length;
    const [a, b] = await Promise.all([
      put(cookies.editor, { revision: current, document: { ...tarnHead, name: "Writer A" } }),
      put(cookies.owner, { revision: current, document: { ...tarnHead, name: "Writer B" } }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    expect(await revisionsOf(networkId)).toHaveLength(current + 1);
  });

  it("answers a document of the wrong shape with 400, paths under document., and writes nothing", async () => {
    const before = await revisionsOf(networkId);
    // A dangling reference would be kept as a draft (draftsAndSessions.test.ts); a wrong shape is not.
    const bad = { ...tarnHead, lines: [{ ...tarnHead.lines[0], lengthKm: "far" }] };
    const outcome = await put(cookies.editor, { revision: before.length, document: bad });
    expect(outcome.status).toBe(400);
    expect(outcome.body.issues).toContainEqual({
      path: "document.lines[0].lengthKm",
      message: expect.stringContaining("number"),
    });
    expect(await revisionsOf(networkId)).toEqual(before);
  });

  it("answers a body without a revision, or not JSON at all, with 400", async () => {
    const missing = await put(cookies.editor, { document: tarnHead });
    expect(missing.status).toBe(400);
    expect(missing.body.issues.map((i: { path: string }) => i.path)).toContain("revision");
    const garbage = await put(cookies.editor, undefined, "revision=3");
    expect(garbage.status).toBe(400);
    expect(garbage.body.error).toMatch(/not valid JSON/);
  });
});

describe("DELETE /api/networks/:id", () => {
  it("refuses an editor (403), lets the owner delete, and then the network is gone (404)", async () => {
    const del = (cookie: string) =>
      call(changeNetwork, jsonRequest("DELETE", `/api/networks/${networkId}`, { cookie }), { networkId: String(networkId) });
    expect((await del(cookies.editor)).status).toBe(403);
    const deleted = await del(cookies.owner);
    expect(deleted.status).toBe(200);
    expect(deleted.body).toMatchObject({ id: networkId, deleted: true });
    expect(new Date(deleted.body.restorableUntil).getTime()).toBeGreaterThan(Date.now() + 29 * 86_400_000);
    const after = await call(getNetwork, getRequest(`/api/networks/${networkId}`, cookies.owner), { networkId: String(networkId) });
    expect(after.status).toBe(404);
  });

  it("answers other methods with 405", async () => {
    const outcome = await call(changeNetwork, jsonRequest("PATCH", `/api/networks/${networkId}`, { cookie: cookies.owner, body: {} }), {
      networkId: String(networkId),
    });
    expect(outcome.status).toBe(405);
    expect(outcome.headers.get("Allow")).toBe("GET, PUT, DELETE");
  });
});

describe("solving through the API", () => {
  it("POST /api/solve solves a posted document with the command line's shape", async () => {
    const outcome = await call(solvePosted, jsonRequest("POST", "/api/solve", { cookie: cookies.viewer, body: hollinMoorSolar }));
    expect(outcome.status).toBe(200);
    expect(outcome.body.loadFlow.converged).toBe(true);
    expect(outcome.body.loadFlow.buses).toHaveLength(hollinMoorSolar.buses.length);
    expect(outcome.body.faults.method).toBe("IEC 60909-0");
    expect(Array.isArray(outcome.body.checks)).toBe(true);
  });

  it("POST /api/solve answers 401 without a session and 400 with issues for an invalid document", async () => {
    expect((await call(solvePosted, jsonRequest("POST", "/api/solve", { body: hollinMoorSolar }))).status).toBe(401);
    const invalid = await call(solvePosted, jsonRequest("POST", "/api/solve", { cookie: cookies.viewer, body: { format: "other" } }));
    expect(invalid.status).toBe(400);
    expect(invalid.body.issues.length).toBeGreaterThan(0);
  });

  it("POST /api/networks/:id/solve solves the saved revision for a viewer and hides it from outsiders", async () => {
    const created = await call(createNetworkApi, jsonRequest("POST", `/api/networks?team=${teamId}`, { cookie: cookies.owner, body: hollinMoorSolar }));
    const id = String(created.body.id);
    const viewer = await call(solveSaved, jsonRequest("POST", `/api/networks/${id}/solve`, { cookie: cookies.viewer }), { networkId: id });
    expect(viewer.status).toBe(200);
    expect(viewer.headers.get("Kilostep-Revision")).toBe("1");
    expect(viewer.body.loadFlow.converged).toBe(true);
    const outsider = await call(solveSaved, jsonRequest("POST", `/api/networks/${id}/solve`, { cookie: cookies.outsider }), { networkId: id });
    expect(outsider.status).toBe(404);
  });
});

describe("GET /api/schema", () => {
  it("publishes the network file's JSON Schema to anyone", async () => {
    const outcome = await call(schema, getRequest("/api/schema"));
    expect(outcome.status).toBe(200);
    expect(outcome.body.properties.format).toBeDefined();
    expect(outcome.body.required).toContain("buses");
  });
});
