import { beforeAll, describe, expect, it } from "vitest";
import { getDb } from "#app/lib/db.server.ts";
import { mailSettled, receivedMail } from "#app/lib/mail.server.ts";
import { GUEST_NAME_MAX } from "#app/lib/fieldSchemas.ts";
import { reviewNotesFor } from "#app/lib/reviewNotes.server.ts";
import { action as guestNotes, GUEST_NOTES_PER_ADDRESS_PER_HOUR } from "#app/routes/share/shared-notes.ts";
import { call, formRequest } from "../harness.ts";
import { freshWorld, makePeople, type People, type World } from "../reviewWorld.ts";

let people: People;
let world: World;
let address = 0;

beforeAll(async () => {
  people = await makePeople("Guest notes");
  world = await freshWorld(people, "Guest notes");
});

/** Each test posts from an address of its own, so the per-address limit is tested where it is meant to be. */
function post(token: string, fields: Record<string, string>, from = `198.51.100.${++address}`) {
  return call(guestNotes, formRequest(`/s/${token}/notes`, fields), { token }, { clientAddress: from });
}

async function ownerView() {
  return reviewNotesFor(await getDb(), world.networkId, { userId: people.owner.id, canView: true, canEdit: true });
}

describe("review notes from a view-link holder without an account", () => {
  it("pins a note under the name given, tells the owners, and lets the guest reply", async () => {
    const started = await post(world.tokens.viewLink, { intent: "start", elementId: "c-calder", guestName: "  Rhona Pike ", body: "Is the bank switched in steps?" });
    expect(started).toMatchObject({ status: 200, body: { ok: true, message: "Note pinned to Calder Flats capacitor bank." } });
    const thread = (await ownerView()).threads.find((t) => t.notes[0].body === "Is the bank switched in steps?")!;
    expect(thread).toMatchObject({ createdBy: null, createdByName: "Rhona Pike", mayResolve: true });
    expect(thread.notes[0]).toMatchObject({ authorName: "Rhona Pike", authorId: null, guest: true });

    const reply = await post(world.tokens.viewLink, { intent: "reply", threadId: String(thread.id), guestName: "Rhona Pike", body: "Answered on the phone." });
    expect(reply.status).toBe(200);
    expect((await ownerView()).threads.find((t) => t.id === thread.id)!.notes).toHaveLength(2);

    await mailSettled();
    const mail = await receivedMail({ to: people.owner.email });
    expect(mail.map((m) => m.subject)).toContain(`Rhona Pike (no account, view link #${world.liveShareId}) wrote a review note on "Guest notes main"`);
  });

  it("asks for a name, and for a body, saving nothing without them", async () => {
    const before = (await ownerView()).threads.length;
    const nameless = await post(world.tokens.viewLink, { intent: "start", elementId: "", guestName: "   ", body: "Anonymous remark" });
    expect(nameless).toMatchObject({ status: 400, body: { ok: false, message: expect.stringMatching(/Give your name/) } });
    const long = await post(world.tokens.viewLink, { intent: "start", elementId: "", guestName: "x".repeat(GUEST_NAME_MAX + 1), body: "Remark" });
    expect(long.status).toBe(400);
    const empty = await post(world.tokens.viewLink, { intent: "start", elementId: "", guestName: "Rhona Pike", body: " " });
    expect(empty.status).toBe(400);
    expect((await ownerView()).threads.length).toBe(before);
  });

  it("never resolves or reopens a thread, and refuses revoked, expired, unknown and edit links", async () => {
    const thread = (await ownerView()).threads[0];
    expect((await post(world.tokens.viewLink, { intent: "resolve", threadId: String(thread.id) })).status).toBe(403);
    const fields = { intent: "start", elementId: "", guestName: "Rhona Pike", body: "Still there?" };
    expect((await post(world.tokens.revokedLink, fields)).status).toBe(410);
    expect((await post(world.tokens.expiredLink, fields)).status).toBe(410);
    expect((await post(world.tokens.anonymous, fields)).status).toBe(404);
    expect((await post(world.tokens.editLink, fields)).status).toBe(403);
  });

  it("stops one address after its hourly allowance with 429 and a wait, saving nothing more", async () => {
    const from = "203.0.113.77";
    for (let i = 0; i < GUEST_NOTES_PER_ADDRESS_PER_HOUR; i++) {
      const ok = await post(world.tokens.viewLink, { intent: "start", elementId: "", guestName: "Busy reviewer", body: `Remark ${i}` }, from);
      expect(ok.status).toBe(200);
    }
    const before = (await ownerView()).threads.length;
    const refused = await post(world.tokens.viewLink, { intent: "start", elementId: "", guestName: "Busy reviewer", body: "One more" }, from);
    expect(refused.status).toBe(429);
    expect(Number(refused.headers.get("Retry-After"))).toBeGreaterThan(0);
    expect((await ownerView()).threads.length).toBe(before);
  });
});
