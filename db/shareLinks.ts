// Share links, the record of who used them, and the grants an opened link gives a signed-in
// person. A grant counts only while its link is live, so revoking a link (or its expiry) ends
// every grant made from it at the next request, with nothing to clean up.
import type { Db } from "./database.ts";
import type { ShareLinkRow, ShareRole } from "./schema.ts";

/** Two uses by the same person within this long are one visit, not two rows. */
export const SAME_VISIT_MINUTES = 10;

export interface ShareLinkUse {
  userName: string | null;
  userEmail: string | null;
  usedAt: string;
}

export interface ShareLinkListing {
  id: number;
  role: ShareRole;
  label: string;
  createdAt: string;
  createdByName: string | null;
  expiresAt: string | null;
  revokedAt: string | null;
  uses: ShareLinkUse[];
}

export async function insertShareLink(
  db: Db,
  input: { networkId: number; role: ShareRole; tokenHash: string; label: string; createdBy: number; expiresAt: string | null; now: Date },
): Promise<ShareLinkRow> {
  return db
    .insertInto("share_links")
    .values({
      network_id: input.networkId,
      role: input.role,
      token_hash: input.tokenHash,
      label: input.label,
      created_by: input.createdBy,
      created_at: input.now.toISOString(),
      expires_at: input.expiresAt,
    })
    .returningAll()
    .executeTakeFirstOrThrow();
}

export async function findShareLinkByHash(db: Db, tokenHash: string): Promise<ShareLinkRow | undefined> {
  return db.selectFrom("share_links").selectAll().where("token_hash", "=", tokenHash).executeTakeFirst();
}

export async function findShareLink(db: Db, id: number): Promise<ShareLinkRow | undefined> {
  return db.selectFrom("share_links").selectAll().where("id", "=", id).executeTakeFirst();
}

/** Marks the link revoked; false when it already was. */
export async function markShareLinkRevoked(db: Db, id: number, userId: number, now: Date): Promise<boolean> {
  const result = await db
    .updateTable("share_links")
    .set({ revoked_at: now.toISOString(), revoked_by: userId })
    .where("id", "=", id)
    .where("revoked_at", "is", null)
    .executeTakeFirst();
  return Number(result.numUpdatedRows) === 1;
}

/** Every link of a network, newest first, each with its uses (newest first). */
export async function listShareLinks(db: Db, networkId: number): Promise<ShareLinkListing[]> {
  const links = await db
    .selectFrom("share_links as s")
    .leftJoin("users as u", "u.id", "s.created_by")
    .select(["s.id", "s.role", "s.label", "s.created_at", "s.expires_at", "s.revoked_at", "u.name as createdByName"])
    .where("s.network_id", "=", networkId)
    .orderBy("s.created_at", "desc")
    .orderBy("s.id", "desc")
    .execute();
  if (links.length === 0) return [];
  const uses = await db
    .selectFrom("share_link_uses as x")
    .leftJoin("users as u", "u.id", "x.user_id")
    .select(["x.share_link_id", "x.used_at", "u.name", "u.email"])
    .where(
      "x.share_link_id",
      "in",
      links.map((l) => l.id),
    )
    .orderBy("x.used_at", "desc")
    .orderBy("x.id", "desc")
    .execute();
  return links.map((l) => ({
    id: l.id,
    role: l.role,
    label: l.label,
    createdAt: l.created_at,
    createdByName: l.createdByName,
    expiresAt: l.expires_at,
    revokedAt: l.revoked_at,
    uses: uses
      .filter((u) => u.share_link_id === l.id)
      .map((u) => ({ userName: u.name, userEmail: u.email, usedAt: u.used_at })),
  }));
}

/**
 * Note that the link was used; a second use by the same person (or by someone without an
 * account) within SAME_VISIT_MINUTES is the same visit. Returns whether a row was written.
 */
export async function recordShareLinkUse(db: Db, linkId: number, userId: number | null, now: Date): Promise<boolean> {
  const since = new Date(now.getTime() - SAME_VISIT_MINUTES * 60_000).toISOString();
  let recent = db
    .selectFrom("share_link_uses")
    .select("id")
    .where("share_link_id", "=", linkId)
    .where("used_at", ">", since);
  recent = userId === null ? recent.where("user_id", "is", null) : recent.where("user_id", "=", userId);
  if (await recent.executeTakeFirst()) return false;
  await db.insertInto("share_link_uses").values({ share_link_id: linkId, user_id: userId, used_at: now.toISOString() }).execute();
  return true;
}

/** Records (once) that the signed-in user holds the link's role on its network. */
export async function insertGrant(db: Db, link: ShareLinkRow, userId: number, now: Date): Promise<void> {
  await db
    .insertInto("network_grants")
    .values({ share_link_id: link.id, user_id: userId, network_id: link.network_id, role: link.role, created_at: now.toISOString() })
    .onConflict((oc) => oc.columns(["share_link_id", "user_id"]).doNothing())
    .execute();
}

/** The strongest role the user holds on the network through live links; null when none. */
export async function liveGrantRole(db: Db, networkId: number, userId: number, now = new Date()): Promise<ShareRole | null> {
  const rows = await db
    .selectFrom("network_grants as g")
    .innerJoin("share_links as s", "s.id", "g.share_link_id")
    .select("g.role")
    .where("g.network_id", "=", networkId)
    .where("g.user_id", "=", userId)
    .where("s.network_id", "=", networkId)
    .where("s.revoked_at", "is", null)
    .where((eb) => eb.or([eb("s.expires_at", "is", null), eb("s.expires_at", ">", now.toISOString())]))
    .execute();
  if (rows.some((r) => r.role === "editor")) return "editor";
  return rows.length > 0 ? "viewer" : null;
}

export interface GrantedNetworkListing {
  id: number;
  name: string;
  teamId: number;
  teamName: string;
  role: ShareRole;
  revision: number;
  updatedAt: string;
  updatedByName: string | null;
}

/** Live networks the user reaches only through share links they opened, strongest role each. */
export async function listGrantedNetworks(db: Db, userId: number, now = new Date()): Promise<GrantedNetworkListing[]> {
  const rows = await db
    .selectFrom("network_grants as g")
    .innerJoin("share_links as s", "s.id", "g.share_link_id")
    .innerJoin("networks as n", "n.id", "g.network_id")
    .innerJoin("teams as t", "t.id", "n.team_id")
    .leftJoin("users as u", "u.id", "n.updated_by")
    .select([
      "n.id",
      "n.name",
      "t.id as teamId",
      "t.name as teamName",
      "g.role",
      "n.current_revision as revision",
      "n.updated_at as updatedAt",
      "u.name as updatedByName",
    ])
    .where("g.user_id", "=", userId)
    .where("n.deleted_at", "is", null)
    .where("s.revoked_at", "is", null)
    .where((eb) => eb.or([eb("s.expires_at", "is", null), eb("s.expires_at", ">", now.toISOString())]))
    .where(({ not, exists, selectFrom }) =>
      not(
        exists(
          selectFrom("memberships as m").select("m.user_id").whereRef("m.team_id", "=", "n.team_id").where("m.user_id", "=", userId),
        ),
      ),
    )
    .orderBy("n.updated_at", "desc")
    .execute();
  const strongest = new Map<number, GrantedNetworkListing>();
  for (const row of rows) {
    const seen = strongest.get(row.id);
    if (!seen || (seen.role === "viewer" && row.role === "editor")) strongest.set(row.id, row);
  }
  return [...strongest.values()];
}

/** Ends a person's grants on every network of the team (they left it or were removed). */
export async function deleteGrantsOnTeamNetworks(db: Db, teamId: number, userId: number): Promise<void> {
  await db
    .deleteFrom("network_grants")
    .where("user_id", "=", userId)
    .where("network_id", "in", (eb) => eb.selectFrom("networks").select("id").where("team_id", "=", teamId))
    .execute();
}

/** Revokes every link of the network still unrevoked; how many. */
export async function revokeLinksOfNetwork(db: Db, networkId: number, userId: number, now: Date): Promise<number> {
  const result = await db
    .updateTable("share_links")
    .set({ revoked_at: now.toISOString(), revoked_by: userId })
    .where("network_id", "=", networkId)
    .where("revoked_at", "is", null)
    .executeTakeFirst();
  return Number(result.numUpdatedRows);
}
