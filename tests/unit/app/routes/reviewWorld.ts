// A small world for authorisation tests: one team with an owner, an editor and a viewer, an
// outsider, and three people who opened edit links (one still live, one revoked, one expired).
// Each `freshWorld()` adds a new network to the team with its own links, so a case that deletes
// or revokes something leaves every other case untouched.
import { readFileSync } from "node:fs";
import { getDb } from "#app/lib/db.server.ts";
import { createNetwork } from "#app/lib/networks.server.ts";
import { createShareLink, grantFromLink, openShareLink, revokeShareLink } from "#app/lib/shareLinks.server.ts";
import type { ShareRole, Team, User } from "#db/schema.ts";
import { insertMembership, insertTeamWithOwner } from "#db/teams.ts";
import { cookieFor, makeUser, ORIGIN } from "./harness.ts";

export const ACTORS = [
  "anonymous",
  "outsider",
  "viewer",
  "editor",
  "owner",
  "viewLink",
  "editLink",
  "revokedLink",
  "expiredLink",
] as const;
export type ActorName = (typeof ACTORS)[number];

export function demoDocument(name = "Tarn Head to Calder Flats (fictional)"): Record<string, unknown> {
  return { ...JSON.parse(readFileSync("tests/fixtures/tarn-head-calder-flats.json", "utf8")), name };
}

/** A token that has the right shape but was never issued. */
export const UNKNOWN_TOKEN = "A".repeat(43);

export interface People {
  team: Team;
  owner: User;
  editor: User;
  viewer: User;
  outsider: User;
  editLinkUser: User;
  revokedUser: User;
  expiredUser: User;
  cookies: Record<ActorName, string | undefined>;
  users: Record<ActorName, User | undefined>;
}

export interface World {
  networkId: number;
  otherNetworkId: number;
  /** The share-link token each actor carries on /s/… paths. */
  tokens: Record<ActorName, string>;
  /** A live view link of this world's network, for DELETE /api/shares/:id. */
  liveShareId: number;
}

export async function makePeople(prefix: string): Promise<People> {
  const db = await getDb();
  const owner = await makeUser(`${prefix} Owner`);
  const editor = await makeUser(`${prefix} Editor`);
  const viewer = await makeUser(`${prefix} Viewer`);
  const outsider = await makeUser(`${prefix} Outsider`, { ownTeam: true });
  const editLinkUser = await makeUser(`${prefix} Edit Link`, { ownTeam: true });
  const revokedUser = await makeUser(`${prefix} Revoked Link`, { ownTeam: true });
  const expiredUser = await makeUser(`${prefix} Expired Link`, { ownTeam: true });
  const team = await db.transaction().execute((trx) => insertTeamWithOwner(trx, `${prefix} team`, owner.id));
  await insertMembership(db, team.id, editor.id, "editor");
  await insertMembership(db, team.id, viewer.id, "viewer");
  const cookies: Record<ActorName, string | undefined> = {
    anonymous: undefined,
    viewLink: undefined,
    outsider: await cookieFor(outsider),
    viewer: await cookieFor(viewer),
    editor: await cookieFor(editor),
    owner: await cookieFor(owner),
    editLink: await cookieFor(editLinkUser),
    revokedLink: await cookieFor(revokedUser),
    expiredLink: await cookieFor(expiredUser),
  };
  const users: Record<ActorName, User | undefined> = {
    anonymous: undefined,
    viewLink: undefined,
    outsider,
    viewer,
    editor,
    owner,
    editLink: editLinkUser,
    revokedLink: revokedUser,
    expiredLink: expiredUser,
  };
  return { team, owner, editor, viewer, outsider, editLinkUser, revokedUser, expiredUser, cookies, users };
}

function tokenOf(url: string): string {
  return url.slice(url.lastIndexOf("/") + 1);
}

async function link(people: People, networkId: number, role: ShareRole, expiresInDays: number | null = null) {
  const db = await getDb();
  const network = await db.selectFrom("networks").selectAll().where("id", "=", networkId).executeTakeFirstOrThrow();
  const made = await createShareLink(db, { network, request: { role, expiresInDays }, by: people.owner });
  return { link: made.link, token: tokenOf(made.url) };
}

/** The holder opens the link (as /s/:token does for someone signed in): a grant while it lives. */
async function openAs(token: string, user: User) {
  const db = await getDb();
  const opened = await openShareLink(db, token);
  if (opened.state !== "live") throw new Error(`fixture link is ${opened.state}`);
  await grantFromLink(db, opened.link, user);
}

export async function freshWorld(people: People, label: string): Promise<World> {
  const db = await getDb();
  const made = await createNetwork(db, { teamId: people.team.id, document: demoDocument(`${label} main`), authorId: people.owner.id });
  const other = await createNetwork(db, { teamId: people.team.id, document: demoDocument(`${label} other`), authorId: people.owner.id });
  if (!made.ok || !other.ok) throw new Error("fixture networks must validate");
  const networkId = made.network.id;

  const view = await link(people, networkId, "viewer", 7);
  const edit = await link(people, networkId, "editor", 7);
  await openAs(edit.token, people.editLinkUser);

  const revokedView = await link(people, networkId, "viewer");
  const revokedEdit = await link(people, networkId, "editor");
  await openAs(revokedEdit.token, people.revokedUser);
  await revokeShareLink(db, revokedView.link, people.owner);
  await revokeShareLink(db, revokedEdit.link, people.owner);

  const expiredView = await link(people, networkId, "viewer", 1);
  const expiredEdit = await link(people, networkId, "editor", 1);
  await openAs(expiredEdit.token, people.expiredUser);
  const past = new Date(Date.now() - 60_000).toISOString();
  await db.updateTable("share_links").set({ expires_at: past }).where("id", "in", [expiredView.link.id, expiredEdit.link.id]).execute();

  return {
    networkId,
    otherNetworkId: other.network.id,
    liveShareId: view.link.id,
    tokens: {
      anonymous: UNKNOWN_TOKEN,
      outsider: UNKNOWN_TOKEN,
      viewer: UNKNOWN_TOKEN,
      editor: UNKNOWN_TOKEN,
      owner: UNKNOWN_TOKEN,
      viewLink: view.token,
      editLink: edit.token,
      revokedLink: revokedView.token,
      expiredLink: expiredView.token,
    },
  };
}
