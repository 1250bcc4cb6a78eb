// POST /api/networks/:id/study: the study of the saved revision, in the shape the command line prints.
import { beforeAll, describe, expect, it } from "vitest";
import { getDb } from "#app/lib/db.server.ts";
import { action as createNetworkApi } from "#app/routes/api/networks.ts";
import { action as studyApi } from "#app/routes/api/network-study.ts";
import { insertMembership, insertTeamWithOwner } from "#db/teams.ts";
import { runStudySync } from "#solver/study/index.ts";
import { call, cookieFor, getRequest, jsonRequest, makeUser } from "../harness.ts";
import { tarnWithCases } from "../../../solver/study/networks.ts";

const cookies = {} as Record<"owner" | "viewer", string>;
let networkId: number;
const document = tarnWithCases(
  [
    { id: "peak", name: "Winter peak", hoursPerYear: 2000 },
    { id: "light", name: "Summer light load", hoursPerYear: 6760, loadScale: 0.3 },
  ],
  { ratePctPerYear: 2.5, years: 10 },
);

const post = (body: unknown, cookie = cookies.viewer) =>
  call(studyApi, jsonRequest("POST", `/api/networks/${networkId}/study`, { cookie, body }), { networkId: String(networkId) });

beforeAll(async () => {
  const db = await getDb();
  const owner = await makeUser("Study Owner", { ownTeam: true });
  const viewer = await makeUser("Study Viewer");
  const teamId = (await db.transaction().execute((trx) => insertTeamWithOwner(trx, "Study team", owner.id))).id;
  await insertMembership(db, teamId, viewer.id, "viewer");
  cookies.owner = await cookieFor(owner);
  cookies.viewer = await cookieFor(viewer);
  const created = await call(createNetworkApi, jsonRequest("POST", `/api/networks?team=${teamId}`, { cookie: cookies.owner, body: document }));
  expect(created.status).toBe(201);
  networkId = created.body.id;
});

describe("POST /api/networks/:id/study", () => {
  it("gives a viewer the engine's study of the saved revision, outages and years when asked", async () => {
    const outcome = await post({ outages: true, years: true });
    expect(outcome.status).toBe(200);
    expect(outcome.headers.get("Kilostep-Revision")).toBe("1");
    const engine = runStudySync(document, { outages: true, years: true });
    expect(engine.ok && outcome.body).toEqual(engine.ok && JSON.parse(JSON.stringify(engine.study)));
    expect(outcome.body.cases.map((c: { id: string }) => c.id)).toEqual(["peak", "light"]);
  });

  it("runs the cases alone for an empty body", async () => {
    const outcome = await post({});
    expect(outcome.status).toBe(200);
    expect(outcome.body.outages).toBeUndefined();
    expect(outcome.body.energy.method).toBe("case-hours");
  });

  it("names what is wrong with the request", async () => {
    const outcome = await post({ outages: ["dawn"], colour: "red" });
    expect(outcome.status).toBe(400);
    expect(outcome.body.issues).toContainEqual({ path: "", message: '"colour" is not a field that can be given here' });
  });

  it("refuses other methods with 405", async () => {
    const outcome = await call(studyApi, getRequest(`/api/networks/${networkId}/study`, cookies.viewer), { networkId: String(networkId) });
    expect([outcome.status, outcome.headers.get("Allow")]).toEqual([405, "POST"]);
  });
});
