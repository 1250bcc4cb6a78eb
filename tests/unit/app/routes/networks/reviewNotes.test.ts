import { beforeAll, describe, expect, it } from "vitest";
import { getDb } from "#app/lib/db.server.ts";
import { mailSettled, receivedMail } from "#app/lib/mail.server.ts";
import { NOTE_BODY_MAX } from "#app/lib/fieldSchemas.ts";
import { checkNoteBody, mayReadNotes, mayResolveThread, mayWriteNotes, openCountsByElement } from "#app/lib/reviewNotePermissions.ts";
import { reviewNotesFor, startThread } from "#app/lib/reviewNotes.server.ts";
import { loader as networkLoader } from "#app/routes/networks/network.tsx";
import { action as notesAction, loader as notesLoader } from "#app/routes/networks/notes.ts";
import { loader as sharedLoader } from "#app/routes/share/shared-network.tsx";
import { action as notificationsAction } from "#app/routes/auth/notifications.ts";
import { insertMembership } from "#db/teams.ts";
import { validateNetwork } from "#solver/schema.ts";
import { call, cookieFor, formRequest, getRequest, makeUser, ORIGIN } from "../harness.ts";
import { demoDocument, freshWorld, makePeople, type People, type World } from "../reviewWorld.ts";

describe("note rules (pure)", () => {
  const anonymousReader = { userId: null, canView: true, canEdit: false };
  const guestWithLink = { userId: null, canView: true, canEdit: false, guestLinkId: 3 };
  const viewer = { userId: 7, canView: true, canEdit: false };
  const editor = { userId: 8, canView: true, canEdit: true };
  const stranger = { userId: 9, canView: false, canEdit: false };

  it("let a reader without an account write only through a view link; writing needs view access", () => {
    expect(mayReadNotes(anonymousReader)).toBe(true);
    expect(mayWriteNotes(anonymousReader)).toBe(false);
    expect(mayWriteNotes(guestWithLink)).toBe(true);
    expect(mayWriteNotes({ ...guestWithLink, canView: false })).toBe(false);
    expect(mayWriteNotes(viewer)).toBe(true);
    expect(mayReadNotes(stranger)).toBe(false);
    expect(mayWriteNotes(stranger)).toBe(false);
  });

  it("let the thread's author or an editor resolve it, and nobody without an account", () => {
    expect(mayResolveThread(viewer, { createdBy: 7 })).toBe(true);
    expect(mayResolveThread(viewer, { createdBy: 8 })).toBe(false);
    expect(mayResolveThread(viewer, { createdBy: null })).toBe(false);
    expect(mayResolveThread(editor, { createdBy: 7 })).toBe(true);
    expect(mayResolveThread({ ...anonymousReader, canEdit: true }, { createdBy: null })).toBe(false);
    expect(mayResolveThread({ ...guestWithLink, canEdit: true }, { createdBy: null })).toBe(false);
  });

  it("take a trimmed body of 1 to NOTE_BODY_MAX characters", () => {
    expect(checkNoteBody("  Check the tap range.  ")).toEqual({ ok: true, body: "Check the tap range." });
    expect(checkNoteBody("   ")).toMatchObject({ ok: false });
    expect(checkNoteBody(undefined)).toMatchObject({ ok: false });
    expect(checkNoteBody("x".repeat(NOTE_BODY_MAX))).toMatchObject({ ok: true });
    expect(checkNoteBody("x".repeat(NOTE_BODY_MAX + 1))).toMatchObject({ ok: false, error: expect.stringContaining(`${NOTE_BODY_MAX + 1}`) });
  });

  it("count open threads per element, the sheet under the empty key, resolved ones not at all", () => {
    const counts = openCountsByElement([
      { elementId: "l-fell", resolvedAt: null },
      { elementId: "l-fell", resolvedAt: null },
      { elementId: "l-fell", resolvedAt: "2026-12-11T10:00:00.000Z" },
      { elementId: null, resolvedAt: null },
      { elementId: "t-tarn", resolvedAt: "2026-12-11T10:00:00.000Z" },
    ]);
    expect(counts).toEqual({ "l-fell": 2, "": 1 });
  });
});

describe("notes through the network's notes route", () => {
  let people: People;
  let world: World;
  const post = async (cookie: string | undefined, fields: Record<string, string>) =>
    call(notesAction, formRequest(`/networks/${world.networkId}/notes`, fields, { cookie }), { networkId: String(world.networkId) });

  beforeAll(async () => {
    people = await makePeople("Notes");
    world = await freshWorld(people, "Notes");
  });

  it("pins a note to an element or to the sheet, takes replies, and lists them on the sheet's page", async () => {
    const first = await post(people.cookies.viewer, { intent: "start", elementId: "l-fell", body: "Is the 48 km the surveyed length?" });
    expect(first).toMatchObject({ status: 200, body: { ok: true, message: "Note pinned to Fell crossing 66 kV." } });
    const sheet = await post(people.cookies.editLink, { intent: "start", elementId: "", body: "Add the 2030 load forecast." });
    expect(sheet.status).toBe(200);
    const listed = await call(notesLoader, getRequest(`/networks/${world.networkId}/notes`, people.cookies.editor), { networkId: String(world.networkId) });
    const threads = listed.body.threads as { id: number; elementId: string | null; elementName: string | null; revision: number; notes: unknown[] }[];
    const onLine = threads.find((t) => t.elementId === "l-fell")!;
    expect(onLine).toMatchObject({ elementName: "Fell crossing 66 kV", revision: 1, notes: [expect.objectContaining({ authorName: people.viewer.name })] });
    expect(threads.find((t) => t.elementId === null)).toBeDefined();

    const reply = await post(people.cookies.editor, { intent: "reply", threadId: String(onLine.id), body: "Yes: 47.6 km on the route survey." });
    expect(reply.status).toBe(200);
    const page = await call(networkLoader, getRequest(`/networks/${world.networkId}`, people.cookies.owner), { networkId: String(world.networkId) });
    const thread = page.body.notes.threads.find((t: { id: number }) => t.id === onLine.id);
    expect(thread.notes.map((n: { body: string }) => n.body)).toEqual(["Is the 48 km the surveyed length?", "Yes: 47.6 km on the route survey."]);
    expect(page.body.notes).toMatchObject({ mayWrite: true, signedIn: true });
  });

  it("refuses a note on an element the network does not have, and an empty one", async () => {
    expect(await post(people.cookies.viewer, { intent: "start", elementId: "no-such-bus", body: "Hello" })).toMatchObject({
      status: 400,
      body: { message: expect.stringContaining('no element "no-such-bus"') },
    });
    expect(await post(people.cookies.viewer, { intent: "start", elementId: "", body: "  " })).toMatchObject({ status: 400 });
  });

  it("lets the author or an editor resolve and reopen, not another viewer", async () => {
    const db = await getDb();
    const secondViewer = await makeUser("Notes Second Viewer");
    await insertMembership(db, people.team.id, secondViewer.id, "viewer");
    await post(people.cookies.viewer, { intent: "start", elementId: "t-calder", body: "Tap at -7.5 % is near the end of its range." });
    const thread = (await db.selectFrom("review_threads").select("id").where("element_id", "=", "t-calder").where("network_id", "=", world.networkId).executeTakeFirstOrThrow()).id;

    const other = await post(await cookieFor(secondViewer), { intent: "resolve", threadId: String(thread) });
    expect(other.status).toBe(403);
    expect(await post(people.cookies.viewer, { intent: "resolve", threadId: String(thread) })).toMatchObject({ status: 200, body: { message: "Marked resolved." } });
    expect(await post(people.cookies.editor, { intent: "reopen", threadId: String(thread) })).toMatchObject({ status: 200, body: { message: "Reopened." } });
    const row = await db.selectFrom("review_threads").selectAll().where("id", "=", thread).executeTakeFirstOrThrow();
    expect(row.resolved_at).toBeNull();
  });

  it("does not reach a thread of another network through this one's address", async () => {
    const db = await getDb();
    const elsewhere = await db.selectFrom("review_threads").select("id").where("network_id", "=", world.networkId).executeTakeFirstOrThrow();
    const answer = await call(
      notesAction,
      formRequest(`/networks/${world.otherNetworkId}/notes`, { intent: "reply", threadId: String(elsewhere.id), body: "Sneaky" }, { cookie: people.cookies.owner }),
      { networkId: String(world.otherNetworkId) },
    );
    expect(answer.status).toBe(404);
  });

  it("shows a view-link holder the notes, which they may answer under a name; without a link nobody writes unsigned", async () => {
    const page = await call(sharedLoader, getRequest(`/s/${world.tokens.viewLink}`), { token: world.tokens.viewLink });
    expect(page.body.notes.mayWrite).toBe(true);
    expect(page.body.notes.signedIn).toBe(false);
    expect(page.body.notes.threads.length).toBeGreaterThan(0);
    const network = await (await getDb()).selectFrom("networks").selectAll().where("id", "=", world.networkId).executeTakeFirstOrThrow();
    const checked = validateNetwork(demoDocument());
    if (!checked.ok) throw new Error("demo must validate");
    const refused = await startThread(await getDb(), {
      reader: { userId: null, canView: true, canEdit: false },
      writer: { guest: { name: "Nobody", linkId: 1 } },
      network,
      document: checked.network,
      elementId: null,
      body: "Written without an account",
    });
    expect(refused).toMatchObject({ ok: false, status: 401 });
  });
});

describe("mail to the team's owners about new notes", () => {
  it("goes to each owner who wants it, never to the note's own author", async () => {
    const db = await getDb();
    const people = await makePeople("Alerts");
    const world = await freshWorld(people, "Alerts");
    const quietOwner = await makeUser("Alerts Quiet Owner");
    await insertMembership(db, people.team.id, quietOwner.id, "owner");
    const quiet = await call(notificationsAction, formRequest("/account/notifications", { reviewNoteMail: "off" }, { cookie: await cookieFor(quietOwner) }));
    expect(quiet).toMatchObject({ status: 200, body: { ok: true } });

    await call(
      notesAction,
      formRequest(`/networks/${world.networkId}/notes`, { intent: "start", elementId: "c-calder", body: "Is 2 Mvar enough at peak?" }, { cookie: people.cookies.editLink }),
      { networkId: String(world.networkId) },
    );
    await call(
      notesAction,
      formRequest(`/networks/${world.networkId}/notes`, { intent: "start", elementId: "", body: "Owner's own note" }, { cookie: people.cookies.owner }),
      { networkId: String(world.networkId) },
    );
    await mailSettled();
    const toOwner = await receivedMail({ to: people.owner.email });
    expect(toOwner).toHaveLength(1);
    expect(toOwner[0].subject).toBe(`${people.editLinkUser.name} wrote a review note on "Alerts main"`);
    expect(toOwner[0].text).toContain('shunt capacitor "Calder Flats capacitor bank"');
    expect(toOwner[0].text).toContain("Is 2 Mvar enough at peak?");
    expect(toOwner[0].links).toEqual([`${ORIGIN}/networks/${world.networkId}`]);
    expect(await receivedMail({ to: quietOwner.email })).toEqual([]);
    expect(await receivedMail({ to: people.editor.email })).toEqual([]);

    const view = await reviewNotesFor(db, world.networkId, { userId: people.owner.id, canView: true, canEdit: true });
    expect(view.threads).toHaveLength(2);
  });
});
