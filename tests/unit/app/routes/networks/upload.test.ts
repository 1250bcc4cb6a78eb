import { beforeAll, describe, expect, it } from "vitest";
import { getDb } from "#app/lib/db.server.ts";
import { UPLOAD_LIMIT_BYTES } from "#app/lib/imports/uploadLimits.ts";
import { nextFreeName } from "#app/lib/networkNames.ts";
import { loader as exportNetwork } from "#app/routes/api/network-export.ts";
import { action as upload, loader as uploadPage } from "#app/routes/networks/upload.tsx";
import { validateNetwork } from "#solver/schema.ts";
import { readRevision } from "#db/networks.ts";
import { call, getRequest } from "../harness.ts";
import { fixtureText, makeTeam, networkFromFixture, rowCounts, uploadRequest, type TeamFixture } from "../teamFixtures.ts";

let team: TeamFixture;
const tarnHead = fixtureText("tarn-head-calder-flats.json");

beforeAll(async () => {
  team = await makeTeam("Upload");
});

const send = (fields: Record<string, string>, text: string | null, cookie: string, headers?: Record<string, string>) =>
  call(upload, uploadRequest("/networks/upload", { teamId: String(team.teamId), ...fields }, text === null ? null : { name: "study.json", text }, { cookie, headers }));

describe("upload page", () => {
  it("offers only the teams the caller may create networks in", async () => {
    expect((await call(uploadPage, getRequest("/networks/upload", team.cookies.editor))).body.teams.map((t: { id: number }) => t.id)).toContain(team.teamId);
    expect((await call(uploadPage, getRequest("/networks/upload", team.cookies.viewer))).body.teams.map((t: { id: number }) => t.id)).not.toContain(team.teamId);
  });

  it("previews a valid file without saving it", async () => {
    const before = await rowCounts();
    const outcome = await send({ intent: "preview" }, tarnHead, team.cookies.editor);
    expect(outcome.status).toBe(200);
    expect(outcome.body).toMatchObject({ ok: true, fileName: "study.json", preview: { counts: { buses: 6, transformers: 2 }, voltageLevelsKV: [66, 11] } });
    expect(await rowCounts()).toEqual(before);
  });

  it("creates the network from a valid file and opens it", async () => {
    const outcome = await send({ intent: "create" }, tarnHead, team.cookies.editor);
    expect(outcome.status).toBe(302);
    const networkId = Number(outcome.headers.get("Location")!.split("/").pop());
    const stored = await readRevision(await getDb(), networkId, 1);
    const expected = validateNetwork(JSON.parse(tarnHead));
    expect(expected.ok && stored?.document).toEqual(expected.ok ? expected.network : null);
    expect(stored?.message).toBe("Uploaded from study.json");
  });

  it("asks before uploading a name the team already has, then saves the next revision or a network of its own, never a twin by accident", async () => {
    const db = await getDb();
    const text = JSON.stringify({ ...JSON.parse(tarnHead), name: "Fell crossing option B" });
    const first = await send({ intent: "create" }, text, team.cookies.editor);
    const networkId = Number(first.headers.get("Location")!.split("/").pop());

    const preview = await send({ intent: "preview" }, text, team.cookies.editor);
    expect(preview.body.sameName).toMatchObject({ id: networkId, name: "Fell crossing option B", revision: 1 });

    const before = await rowCounts();
    const unasked = await send({ intent: "create" }, text, team.cookies.editor);
    expect(unasked.status).toBe(409);
    expect(unasked.body.error).toMatch(/already has a network named "Fell crossing option B"/);
    expect(await rowCounts()).toEqual(before);

    const stale = await send({ intent: "create", sameName: "revision", sameNameRevision: "7" }, text, team.cookies.editor);
    expect(stale.status).toBe(409);
    expect(stale.body.error).toMatch(/now at revision 1/);
    expect(await rowCounts()).toEqual(before);

    const asRevision = await send({ intent: "create", sameName: "revision", sameNameRevision: "1" }, text, team.cookies.editor);
    expect(asRevision.headers.get("Location")).toBe(`/networks/${networkId}`);
    expect((await readRevision(db, networkId, 2))?.message).toBe("Uploaded from study.json");

    const asCopy = await send({ intent: "create", sameName: "copy" }, text, team.cookies.editor);
    const copyId = Number(asCopy.headers.get("Location")!.split("/").pop());
    expect(copyId).not.toBe(networkId);
    expect(((await readRevision(db, copyId, 1))?.document as { name: string }).name).toBe("Fell crossing option B (2)");
  });

  it("numbers a copy after the names the team already has, ignoring case and spacing", () => {
    expect(nextFreeName("Tarn Head", ["Other"])).toBe("Tarn Head");
    expect(nextFreeName("Tarn Head", ["tarn  head", "Tarn Head (2)"])).toBe("Tarn Head (3)");
  });

  it("refuses an invalid file with each problem's path, and saves nothing", async () => {
    const broken = JSON.parse(tarnHead);
    broken.lines[0].toBus = "b-nowhere";
    broken.buses[0].nominalKV = "eleven";
    const before = await rowCounts();
    const outcome = await send({ intent: "create" }, JSON.stringify(broken), team.cookies.editor);
    expect(outcome.status).toBe(400);
    expect(outcome.body.issues.map((i: { path: string }) => i.path)).toEqual(expect.arrayContaining(["buses[0].nominalKV"]));
    expect(await rowCounts()).toEqual(before);
  });

  it("gives the line and column of broken JSON", async () => {
    const outcome = await send({ intent: "preview" }, '{\n  "format": "kilostep.network",\n  "version": 1\n  "name": "x"\n}', team.cookies.editor);
    expect(outcome.status).toBe(400);
    expect(outcome.body.error).toMatch(/line 4, column 3/);
  });

  it("refuses a file over 5 MB by its size", async () => {
    const outcome = await send({ intent: "create" }, "x".repeat(UPLOAD_LIMIT_BYTES + 10), team.cookies.editor);
    expect(outcome.status).toBe(400);
    expect(outcome.body.error).toBe("A network file may be at most 5.0 MB; this one is 5.0 MB.");
  });

  it("refuses a request whose declared length is over the limit before reading it (413)", async () => {
    const outcome = await send({ intent: "create" }, tarnHead, team.cookies.editor, { "Content-Length": String(6 * 1024 * 1024) });
    expect(outcome.status).toBe(413);
    expect(outcome.body).toMatch(/at most 5\.1 MB/);
  });

  it("refuses a form posted from another site's page (403), before anything is read", async () => {
    const before = await rowCounts();
    const outcome = await send({ intent: "create" }, tarnHead, team.cookies.editor, { Origin: "https://evil.example", Host: "kilostep.test" });
    expect(outcome.status).toBe(403);
    expect(outcome.body).toMatch(/another site/);
    expect(await rowCounts()).toEqual(before);
  });

  it("refuses a viewer (403) and an outsider (404), and a request without a file", async () => {
    expect((await send({ intent: "create" }, tarnHead, team.cookies.viewer)).status).toBe(403);
    expect((await send({ intent: "create" }, tarnHead, team.cookies.outsider)).status).toBe(404);
    const none = await send({ intent: "create" }, null, team.cookies.editor);
    expect(none.status).toBe(400);
    expect(none.body.error).toBe("Choose a network file to upload.");
  });
});

describe("GET /api/networks/:id/export", () => {
  it("downloads the current document as a file that uploads back to the same network", async () => {
    const networkId = await networkFromFixture(team);
    const outcome = await call(exportNetwork, getRequest(`/api/networks/${networkId}/export`, team.cookies.viewer), { networkId: String(networkId) });
    expect(outcome.status).toBe(200);
    expect(outcome.headers.get("Content-Disposition")).toBe('attachment; filename="tarn-head-to-calder-flats-fictional-r1.json"');
    const roundTrip = await send({ intent: "preview" }, JSON.stringify(outcome.body), team.cookies.editor);
    expect(roundTrip.body.ok).toBe(true);
    const stored = await readRevision(await getDb(), networkId, 1);
    expect(outcome.body).toEqual(stored?.document);
  });

  it("answers 404 for an unknown revision and for someone outside the team", async () => {
    const networkId = await networkFromFixture(team);
    const missing = await call(exportNetwork, getRequest(`/api/networks/${networkId}/export?revision=9`, team.cookies.viewer), { networkId: String(networkId) });
    expect(missing.status).toBe(404);
    expect(missing.body.error).toMatch(/no revision "9"/);
    const outsider = await call(exportNetwork, getRequest(`/api/networks/${networkId}/export`, team.cookies.outsider), { networkId: String(networkId) });
    expect(outsider.status).toBe(404);
  });
});
