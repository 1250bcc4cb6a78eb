// The operating-case editor, called as the server calls it: a viewer reads, an editor adds,
// changes and removes cases and sets the growth, each a new revision; bad fields come back with
// a sentence each and nothing is stored; a stale page is refused. A stored case is then studied
// exactly like the same change made by hand to the network (plain solve, no study involved).
import { beforeAll, describe, expect, it } from "vitest";
import { getDb } from "#app/lib/db.server.ts";
import { currentDocument } from "#app/lib/networks.server.ts";
import { action as casesAction, loader as casesLoader } from "#app/routes/networks/cases.tsx";
import { solveNetwork } from "#solver/index.ts";
import { runStudySync } from "#solver/study/index.ts";
import type { Network, NetworkInput } from "#solver/schema.ts";
import { call, formRequest, getRequest } from "../harness.ts";
import { demoDocument, freshWorld, makePeople, type People, type World } from "../reviewWorld.ts";

let people: People;
let world: World;

beforeAll(async () => {
  people = await makePeople("Cases page");
  world = await freshWorld(people, "Cases page");
});

const params = () => ({ networkId: String(world.networkId) });
const page = (query = "", cookie = people.cookies.editor) => call(casesLoader, getRequest(`/networks/${world.networkId}/cases${query}`, cookie), params());
const post = (fields: Record<string, string>, cookie = people.cookies.editor) =>
  call(casesAction, formRequest(`/networks/${world.networkId}/cases`, fields, { cookie, headers: { Origin: "http://kilostep.test" } }), params());

async function stored(): Promise<{ revision: number; document: Network }> {
  const db = await getDb();
  const network = await db.selectFrom("networks").selectAll().where("id", "=", world.networkId).executeTakeFirstOrThrow();
  return { revision: network.current_revision, document: (await currentDocument(db, network)).document as Network };
}

describe("the operating-case editor", () => {
  it("shows a viewer the demo's three cases and no form", async () => {
    const outcome = await page("?case=new", people.cookies.viewer);
    expect(outcome.status).toBe(200);
    expect(outcome.body.cases.map((c: { name: string }) => c.name)).toEqual(["Winter peak", "Summer light load, capacitor in", "Town feeder out, mine at peak"]);
    expect(outcome.body).toMatchObject({ canEdit: false, editing: null });
  });

  it("refuses a viewer's change (403) and an outsider's (404), storing nothing", async () => {
    const before = (await stored()).revision;
    expect((await post({ intent: "delete", caseId: "winter-peak", revision: String(before) }, people.cookies.viewer)).status).toBe(403);
    expect((await post({ intent: "delete", caseId: "winter-peak", revision: String(before) }, people.cookies.outsider)).status).toBe(404);
    expect((await stored()).revision).toBe(before);
  });

  it("adds a case as a new revision, and the study solves it as the same change made by hand", async () => {
    const { revision } = await stored();
    const outcome = await post({
      intent: "save",
      revision: String(revision),
      originalId: "",
      id: "",
      name: "Mine alone at night",
      hoursPerYear: "0",
      loadScale: "0.3",
      "load.ld-mine": "0.8",
      "source.g-tarn.mode": "set",
      "source.g-tarn.voltagePu": "1.02",
      out: "c-calder",
    });
    expect(outcome.status).toBe(302);
    expect(outcome.headers.get("Location")).toMatch(/cases\?done=/);
    const after = await stored();
    expect(after.revision).toBe(revision + 1);
    const added = after.document.cases!.at(-1)!;
    expect(added).toEqual({
      id: "mine-alone-at-night",
      name: "Mine alone at night",
      hoursPerYear: 0,
      loadScale: 0.3,
      loads: { "ld-mine": 0.8 },
      sources: { "g-tarn": { voltagePu: 1.02 } },
      outOfService: ["c-calder"],
    });

    // By hand: mine at 0.8 of drawn, town at 0.3, the machine at 1.02 pu, the capacitor gone.
    const byHand = demoDocument() as unknown as NetworkInput;
    const { cases: _c, growth: _g, ...plain } = byHand;
    const scaled = {
      ...plain,
      loads: byHand.loads!.map((l) => ({ ...l, pMW: l.pMW * (l.id === "ld-mine" ? 0.8 : 0.3), qMvar: l.qMvar! * (l.id === "ld-mine" ? 0.8 : 0.3) })),
      sources: byHand.sources!.map((s) => ({ ...s, voltagePu: 1.02 })),
      shunts: [],
    };
    const plainSolve = solveNetwork(scaled);
    const studied = runStudySync(after.document);
    if (!plainSolve.ok) throw new Error(plainSolve.issues.map((i) => `${i.path}: ${i.message}`).join("; "));
    if (!studied.ok) throw new Error(studied.issues.map((i) => `${i.path}: ${i.message}`).join("; "));
    const studiedCase = studied.study.cases.find((c) => c.id === "mine-alone-at-night")!;
    expect(studiedCase.loadFlow.buses.map((b) => b.vPu)).toEqual(plainSolve.result.loadFlow.buses.map((b) => b.vPu));
  });

  it("changes a case in place and keeps the others in order", async () => {
    const { revision } = await stored();
    const edit = await page("?case=summer-light");
    expect(edit.body.editing).toMatchObject({ originalId: "summer-light", loadScale: "0.5", sources: { "g-tarn": { mode: "set", voltagePu: "0.97" } } });
    const outcome = await post({
      intent: "save",
      revision: String(revision),
      originalId: "summer-light",
      id: "summer-light",
      name: "Summer light load, capacitor in",
      hoursPerYear: "6000",
      loadScale: "0.45",
      "source.g-tarn.mode": "drawn",
    });
    expect(outcome.status).toBe(302);
    const after = await stored();
    expect(after.document.cases!.map((c) => c.id)).toEqual(["winter-peak", "summer-light", "town-feeder-out", "mine-alone-at-night"]);
    expect(after.document.cases![1]).toEqual({ id: "summer-light", name: "Summer light load, capacitor in", hoursPerYear: 6000, loadScale: 0.45 });
  });

  it("names each bad field and stores nothing", async () => {
    const { revision } = await stored();
    const outcome = await post({
      intent: "save",
      revision: String(revision),
      originalId: "",
      name: "Winter peak",
      hoursPerYear: "9000",
      loadScale: "lots",
      "load.ld-town": "-1",
      "source.g-tarn.mode": "set",
    });
    expect(outcome.status).toBe(400);
    expect(outcome.body.errors).toMatchObject({
      id: expect.stringMatching(/already has the id “winter-peak”/),
      hoursPerYear: expect.stringMatching(/between 0 and 8784/),
      loadScale: expect.stringMatching(/“lots” is not a number/),
      "load.ld-town": expect.stringMatching(/between 0 and 100/),
      "source.g-tarn.mode": expect.stringMatching(/no value is given/),
    });
    expect(outcome.body.fields.name).toBe("Winter peak");
    expect((await stored()).revision).toBe(revision);
  });

  it("refuses hours that, with the other cases', pass a year", async () => {
    const { revision } = await stored();
    // The demo's other cases hold 2200 h and now 6000 h: 8200 h, so 600 h more is too many.
    const outcome = await post({ intent: "save", revision: String(revision), originalId: "", name: "Spring", hoursPerYear: "600", loadScale: "0.7" });
    expect(outcome.status).toBe(400);
    expect(outcome.body.errors.hoursPerYear).toMatch(/at most 584 h here/);
  });

  it("refuses a page opened before someone else saved (409)", async () => {
    const { revision } = await stored();
    const outcome = await post({ intent: "delete", caseId: "winter-peak", revision: String(revision - 1) });
    expect(outcome.status).toBe(409);
    expect(outcome.body.message).toMatch(/Nothing was saved/);
    expect((await stored()).revision).toBe(revision);
  });

  it("removes a case, and sets and removes the growth", async () => {
    let { revision } = await stored();
    expect((await post({ intent: "delete", caseId: "mine-alone-at-night", revision: String(revision) })).status).toBe(302);
    expect((await stored()).document.cases!.map((c) => c.id)).toEqual(["winter-peak", "summer-light", "town-feeder-out"]);
    revision++;
    expect((await post({ intent: "growth", revision: String(revision), ratePctPerYear: "3.5", years: "15" })).status).toBe(302);
    expect((await stored()).document.growth).toEqual({ ratePctPerYear: 3.5, years: 15 });
    revision++;
    const bad = await post({ intent: "growth", revision: String(revision), ratePctPerYear: "3", years: "2.5" });
    expect(bad.status).toBe(400);
    expect(bad.body.errors.years).toMatch(/whole number of years/);
    expect((await post({ intent: "growth", revision: String(revision), ratePctPerYear: "", years: "" })).status).toBe(302);
    expect((await stored()).document.growth).toBeUndefined();
    expect((await post({ intent: "delete", caseId: "no-such-case", revision: String(revision + 1) })).status).toBe(404);
    expect((await post({ intent: "explode", revision: String(revision + 1) })).status).toBe(400);
  });
});
