// A team with an owner, an editor and a viewer, plus an outsider, for the exchange tests; and
// the requests an upload form sends.
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { getDb } from "#app/lib/db.server.ts";
import { createNetwork } from "#app/lib/networks.server.ts";
import { insertMembership, insertTeamWithOwner } from "#db/teams.ts";
import { cookieFor, makeUser, ORIGIN } from "./harness.ts";

export type Who = "owner" | "editor" | "viewer" | "outsider";

export interface TeamFixture {
  teamId: number;
  userIds: Record<Who, number>;
  cookies: Record<Who, string>;
}

export async function makeTeam(label: string): Promise<TeamFixture> {
  const db = await getDb();
  const users = {
    owner: await makeUser(`${label} Owner`),
    editor: await makeUser(`${label} Editor`),
    viewer: await makeUser(`${label} Viewer`),
    outsider: await makeUser(`${label} Outsider`, { ownTeam: true }),
  };
  const teamId = (await db.transaction().execute((trx) => insertTeamWithOwner(trx, `${label} team`, users.owner.id))).id;
  await insertMembership(db, teamId, users.editor.id, "editor");
  await insertMembership(db, teamId, users.viewer.id, "viewer");
  const cookies = {} as Record<Who, string>;
  const userIds = {} as Record<Who, number>;
  for (const who of Object.keys(users) as Who[]) {
    cookies[who] = await cookieFor(users[who]);
    userIds[who] = users[who].id;
  }
  return { teamId, userIds, cookies };
}

export function fixtureText(file: string): string {
  return readFileSync(join(import.meta.dirname, "..", "..", "..", "fixtures", file), "utf8");
}

export async function networkFromFixture(team: TeamFixture, file = "tarn-head-calder-flats.json"): Promise<number> {
  const created = await createNetwork(await getDb(), { teamId: team.teamId, document: JSON.parse(fixtureText(file)), authorId: team.userIds.owner });
  if (!created.ok) throw new Error(`fixture ${file} does not validate`);
  return created.network.id;
}

/** What a browser sends for a form with a file field: multipart/form-data. */
export function uploadRequest(
  path: string,
  fields: Record<string, string>,
  file: { name: string; text: string; type?: string } | null,
  options: { cookie?: string; headers?: Record<string, string> } = {},
): Request {
  const form = new FormData();
  for (const [key, value] of Object.entries(fields)) form.set(key, value);
  if (file) form.set("file", new File([file.text], file.name, { type: file.type ?? "application/octet-stream" }));
  const headers = new Headers(options.headers);
  if (options.cookie) headers.set("Cookie", options.cookie);
  return new Request(`${ORIGIN}${path}`, { method: "POST", headers, body: form });
}

export async function rowCounts() {
  const db = await getDb();
  const count = async (table: "networks" | "network_revisions" | "library_types") =>
    Number((await db.selectFrom(table).select((eb) => eb.fn.countAll().as("n")).executeTakeFirstOrThrow()).n);
  return { networks: await count("networks"), revisions: await count("network_revisions"), libraryTypes: await count("library_types") };
}
