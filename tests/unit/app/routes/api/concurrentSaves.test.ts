// Two editors saving the same network at once through PUT /api/networks/:id (the route handlers
// called directly, in one process, interleaving at every await): every save is either committed
// or answered 409, and every committed revision is in the database with exactly its content.
import { beforeAll, describe, expect, it } from "vitest";
import tarnHead from "../../../../fixtures/tarn-head-calder-flats.json";
import { getDb } from "#app/lib/db.server.ts";
import { action as changeNetwork, loader as getNetwork } from "#app/routes/api/network.ts";
import { action as createNetworkApi } from "#app/routes/api/networks.ts";
import { insertMembership, insertTeamWithOwner } from "#db/teams.ts";
import { call, cookieFor, getRequest, jsonRequest, makeUser } from "../harness.ts";

const SAVES_EACH = 100;
let editors: { name: string; cookie: string }[];
let teamId: number;

interface Committed {
  revision: number;
  markerMW: number;
  editor: string;
}

beforeAll(async () => {
  const db = await getDb();
  const owner = await makeUser("Race Owner");
  teamId = (await db.transaction().execute((trx) => insertTeamWithOwner(trx, "Race team", owner.id))).id;
  editors = [];
  for (const name of ["Race Editor A", "Race Editor B"]) {
    const user = await makeUser(name);
    await insertMembership(db, teamId, user.id, "editor");
    editors.push({ name, cookie: await cookieFor(user) });
  }
});

async function newNetwork(): Promise<number> {
  const created = await call(createNetworkApi, jsonRequest("POST", `/api/networks?team=${teamId}`, { cookie: editors[0].cookie, body: tarnHead }));
  expect(created.status).toBe(201);
  return created.body.id as number;
}

type Read = { revision: number; document: typeof tarnHead };

async function read(networkId: number, cookie: string): Promise<Read> {
  const outcome = await call(getNetwork, getRequest(`/api/networks/${networkId}`, cookie), { networkId: String(networkId) });
  expect(outcome.status).toBe(200);
  return outcome.body as Read;
}

/** One save: the load's P carries a value unique to this editor and step, to recognise it later. */
async function save(networkId: number, editor: { name: string; cookie: string }, from: Read, markerMW: number) {
  const document = structuredClone(from.document);
  document.loads[0].pMW = markerMW;
  const outcome = await call(
    changeNetwork,
    jsonRequest("PUT", `/api/networks/${networkId}`, { cookie: editor.cookie, body: { revision: from.revision, document } }),
    { networkId: String(networkId) },
  );
  if (outcome.status !== 200 && outcome.status !== 409) throw new Error(`a save answered ${outcome.status}: ${JSON.stringify(outcome.body)}`);
  return outcome;
}

async function storedRevisions(networkId: number) {
  const db = await getDb();
  const rows = await db.selectFrom("network_revisions").select(["number", "document"]).where("network_id", "=", networkId).orderBy("number").execute();
  return rows.map((r) => ({ number: r.number, markerMW: (JSON.parse(r.document) as Read["document"]).loads[0].pMW }));
}

function expectNothingLost(stored: { number: number; markerMW: number }[], committed: Committed[]) {
  // Revisions are numbered 1, 2, 3 … with no gap; revision 1 is the created document.
  expect(stored.map((r) => r.number)).toEqual(Array.from({ length: committed.length + 1 }, (_, i) => i + 1));
  for (const save of committed) expect(stored.find((r) => r.number === save.revision)?.markerMW).toBe(save.markerMW);
}

describe("two editors, 100 conflicting saves each", () => {
  it("both read the same revision and save together: exactly one of each pair commits, the other gets 409", async () => {
    const networkId = await newNetwork();
    const committed: Committed[] = [];
    let conflicts = 0;
    for (let step = 1; step <= SAVES_EACH; step++) {
      const [readA, readB] = await Promise.all(editors.map((e) => read(networkId, e.cookie)));
      expect(readA.revision).toBe(readB.revision);
      const outcomes = await Promise.all([
        save(networkId, editors[0], readA, 10 + step / 1000),
        save(networkId, editors[1], readB, 20 + step / 1000),
      ]);
      outcomes.forEach((outcome, i) => {
        if (outcome.status === 200) committed.push({ revision: outcome.body.revision, markerMW: (i === 0 ? 10 : 20) + step / 1000, editor: editors[i].name });
        else {
          conflicts++;
          expect(outcome.body.currentRevision).toBe(readA.revision + 1);
        }
      });
    }
    console.log(`paired saves: ${2 * SAVES_EACH} attempted, ${committed.length} committed, ${conflicts} answered 409`);
    expect(committed).toHaveLength(SAVES_EACH);
    expect(conflicts).toBe(SAVES_EACH);
    expectNothingLost(await storedRevisions(networkId), committed);
  });

  it("each editor saves 100 times as fast as it can, rereading after a 409: nothing committed is lost", async () => {
    const networkId = await newNetwork();
    const committed: Committed[] = [];
    let conflicts = 0;
    await Promise.all(
      editors.map(async (editor, e) => {
        let current = await read(networkId, editor.cookie);
        for (let step = 1; step <= SAVES_EACH; step++) {
          const markerMW = (e + 1) * 10 + step / 1000;
          const outcome = await save(networkId, editor, current, markerMW);
          if (outcome.status === 200) {
            committed.push({ revision: outcome.body.revision, markerMW, editor: editor.name });
            current = { revision: outcome.body.revision, document: outcome.body.document };
          } else {
            conflicts++;
            current = await read(networkId, editor.cookie);
          }
        }
      }),
    );
    console.log(`free-running saves: ${2 * SAVES_EACH} attempted, ${committed.length} committed, ${conflicts} answered 409`);
    expect(committed.length + conflicts).toBe(2 * SAVES_EACH);
    expect(new Set(committed.map((c) => c.revision)).size).toBe(committed.length);
    expectNothingLost(await storedRevisions(networkId), committed);
  });
});
