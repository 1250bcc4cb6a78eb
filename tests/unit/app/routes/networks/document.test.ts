// The sheet page's document: a small one inside the page as stored; a large one left out of the
// page and fetched from /networks/:id/document, as the very text the database holds.
import { describe, expect, it } from "vitest";
import { getDb } from "#app/lib/db.server.ts";
import { createNetwork } from "#app/lib/networks.server.ts";
import { loader as documentLoader } from "#app/routes/networks/document.ts";
import { loader as sheetLoader } from "#app/routes/networks/network.tsx";
import { readRevisionText } from "#db/networks.ts";
import { syntheticFeeder } from "../../../../bench/syntheticFeeder.ts";
import { call, getRequest } from "../harness.ts";
import { makeTeam } from "../teamFixtures.ts";

describe("the sheet's document", () => {
  it("is in the page as stored while small, and fetched from its own address, as stored and kept by version, when large", async () => {
    const team = await makeTeam("Sheet document");
    const db = await getDb();
    const small = await createNetwork(db, { teamId: team.teamId, document: syntheticFeeder(20), authorId: team.userIds.owner });
    const large = await createNetwork(db, { teamId: team.teamId, document: syntheticFeeder(2_000), authorId: team.userIds.owner });
    if (!small.ok || !large.ok) throw new Error("feeders validate");

    const smallPage = await call(sheetLoader, getRequest(`/networks/${small.network.id}`, team.cookies.viewer), { networkId: String(small.network.id) });
    expect(smallPage.body.documentText).toBe((await readRevisionText(db, small.network.id, 1))!.text);
    expect(smallPage.body.documentUrl).toBeNull();

    const params = { networkId: String(large.network.id) };
    const largePage = await call(sheetLoader, getRequest(`/networks/${large.network.id}`, team.cookies.viewer), params);
    expect(largePage.body.documentText).toBeNull();
    expect(largePage.body.documentUrl).toMatch(new RegExp(`^/networks/${large.network.id}/document\\?v=1-`));
    const fetched = await call(documentLoader, getRequest(largePage.body.documentUrl, team.cookies.viewer), params);
    expect(fetched.status).toBe(200);
    expect(fetched.body).toEqual(large.document);
    expect(fetched.headers.get("Cache-Control")).toMatch(/immutable/);
    const stale = await call(documentLoader, getRequest(`/networks/${large.network.id}/document?v=0-old`, team.cookies.viewer), params);
    expect(stale.headers.get("Cache-Control")).toBe("private, no-store");

    const outsider = await call(documentLoader, getRequest(largePage.body.documentUrl, team.cookies.outsider), params);
    expect(outsider.status).toBe(404);
  }, 60_000);
});
