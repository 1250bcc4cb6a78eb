// Drafts and editing sessions through PUT /api/networks/:id (route handlers called directly): a
// drawing with a loose part is kept with its problems and solving it answers 422 with the same
// list; the sheet's autosaves fold into one revision per session; a stale fold is refused.
import { beforeAll, describe, expect, it } from "vitest";
import tarnHead from "../../../../fixtures/tarn-head-calder-flats.json";
import { getDb } from "#app/lib/db.server.ts";
import { action as changeNetwork, loader as getNetwork } from "#app/routes/api/network.ts";
import { action as solveSaved } from "#app/routes/api/network-solve.ts";
import { action as createNetworkApi } from "#app/routes/api/networks.ts";
import { insertMembership, insertTeamWithOwner } from "#db/teams.ts";
import { listRevisions } from "#db/revisions.ts";
import { call, cookieFor, getRequest, jsonRequest, makeUser } from "../harness.ts";

let owner: string;
let editor: string;
let teamId: number;

beforeAll(async () => {
  const db = await getDb();
  const ownerUser = await makeUser("Draft Owner");
  teamId = (await db.transaction().execute((trx) => insertTeamWithOwner(trx, "Draft team", ownerUser.id))).id;
  const editorUser = await makeUser("Draft Editor");
  await insertMembership(db, teamId, editorUser.id, "editor");
  owner = await cookieFor(ownerUser);
  editor = await cookieFor(editorUser);
});

async function newNetwork(): Promise<number> {
  const created = await call(createNetworkApi, jsonRequest("POST", `/api/networks?team=${teamId}`, { cookie: owner, body: tarnHead }));
  expect(created.status).toBe(201);
  return created.body.id as number;
}

const put = (id: number, cookie: string, body: unknown) =>
  call(changeNetwork, jsonRequest("PUT", `/api/networks/${id}`, { cookie, body }), { networkId: String(id) });

function withLoad(pMW: number, bus = "b-town") {
  const document = structuredClone(tarnHead);
  document.loads.push({ id: "ld-new", name: "New load", bus, pMW, qMvar: 0, model: "constant-power" } as (typeof document.loads)[number]);
  return document;
}

describe("drafts", () => {
  it("keeps a drawing with a loose part, lists its problems, and solving it answers 422 with them", async () => {
    const id = await newNetwork();
    const saved = await put(id, editor, { revision: 1, document: withLoad(1, "") });
    expect(saved.status).toBe(200);
    expect(saved.body.revision).toBe(2);
    expect(saved.body.problems).toEqual([{ path: "loads[2].bus", message: expect.stringMatching(/not connected to a bus yet/) }]);
    const read = await call(getNetwork, getRequest(`/api/networks/${id}`, editor), { networkId: String(id) });
    expect(read.body.document.loads[2].bus).toBe("");
    const solved = await call(solveSaved, jsonRequest("POST", `/api/networks/${id}/solve`, { cookie: editor, body: {} }), { networkId: String(id) });
    expect(solved.status).toBe(422);
    expect(solved.body.problems).toEqual(saved.body.problems);
  });

  it("still refuses a document of the wrong shape", async () => {
    const id = await newNetwork();
    const refused = await put(id, editor, { revision: 1, document: { ...tarnHead, buses: "none" } });
    expect(refused.status).toBe(400);
  });
});

describe("editing sessions", () => {
  it("folds one author's autosaves into one revision, and another author's save starts the next", async () => {
    const id = await newNetwork();
    const first = await put(id, editor, { revision: 1, foldedSaves: 0, document: withLoad(1) });
    expect(first.body).toMatchObject({ revision: 2, foldedSaves: 0 });
    const second = await put(id, editor, { revision: 2, foldedSaves: 0, document: withLoad(2) });
    expect(second.body).toMatchObject({ revision: 2, foldedSaves: 1 });
    // A second tab that still holds the first save is told someone saved in between.
    const stale = await put(id, editor, { revision: 2, foldedSaves: 0, document: withLoad(3) });
    expect(stale.status).toBe(409);
    const theirs = await put(id, owner, { revision: 2, foldedSaves: 1, document: withLoad(4) });
    expect(theirs.body).toMatchObject({ revision: 3, foldedSaves: 0 });
    const revisions = await listRevisions(await getDb(), id);
    expect(revisions.map((r) => r.number)).toEqual([3, 2, 1]);
  });

  it("solves the folded document, not an answer kept from the revision's first save", async () => {
    const id = await newNetwork();
    const solve = async () => {
      const solved = await call(solveSaved, jsonRequest("POST", `/api/networks/${id}/solve`, { cookie: editor, body: {} }), { networkId: String(id) });
      expect(solved.status).toBe(200);
      return solved.body.loadFlow.totals.loadMW as number;
    };
    await put(id, editor, { revision: 1, foldedSaves: 0, document: withLoad(1) });
    const before = await solve();
    const folded = await put(id, editor, { revision: 2, foldedSaves: 0, document: withLoad(3) });
    expect(folded.body).toMatchObject({ revision: 2, foldedSaves: 1 });
    // The folded save adds 2 MW of load at the same revision number.
    expect((await solve()) - before).toBeCloseTo(2, 6);
  });

  it("marks a save that only moves busbars as layout", async () => {
    const id = await newNetwork();
    const moved = structuredClone(tarnHead);
    moved.buses[0].x = (moved.buses[0].x ?? 0) + 40;
    await put(id, editor, { revision: 1, document: moved });
    const [latest] = await listRevisions(await getDb(), id);
    expect(latest.layoutOnly).toBe(true);
  });
});
