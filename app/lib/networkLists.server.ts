// What the networks page and GET /api/networks list for one person: the live networks of their
// teams with their role, those shared with them by a live link, the deleted ones they may still
// restore, and the teams they may create in.
import type { Db } from "#db/database.ts";
import { listDeletedNetworksForUser, listNetworksForUser } from "#db/networks.ts";
import { listGrantedNetworks } from "#db/shareLinks.ts";
import { teamsOfUser } from "#db/teams.ts";
import { roleAllows } from "./permissions.server.ts";

/** Their teams' live networks and then those shared with them, each with the role they act with. */
export async function networksOfUser(db: Db, userId: number) {
  const [own, shared] = await Promise.all([listNetworksForUser(db, userId), listGrantedNetworks(db, userId)]);
  return { own, shared };
}

/** Deleted networks still inside their restore window that this person may restore. */
export async function restorableNetworksOfUser(db: Db, userId: number) {
  return (await listDeletedNetworksForUser(db, userId)).filter((n) => roleAllows(n.role, "restore"));
}

/** The teams this person may create networks in, as the team pickers show them. */
export async function teamsToCreateIn(db: Db, userId: number): Promise<{ id: number; name: string }[]> {
  return (await teamsOfUser(db, userId)).filter((t) => roleAllows(t.role, "create-in-team")).map((t) => ({ id: t.id, name: t.name }));
}
