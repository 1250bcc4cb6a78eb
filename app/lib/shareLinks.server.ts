// Share links: an owner gives view or edit on one network to whoever holds the link. The link's
// token is 256 random bits, shown once; only its hash is stored. A view link opens the network
// read only without an account (as a share-link actor); any link opened by a signed-in person
// records a grant for them on that network, which lives exactly as long as the link does.
import type { Db } from "#db/database.ts";
import { insertAuditEvent } from "#db/auditEvents.ts";
import { findNetwork } from "#db/networks.ts";
import type { NetworkRow, ShareLinkRow, ShareRole, User } from "#db/schema.ts";
import {
  findShareLink,
  findShareLinkByHash,
  insertGrant,
  insertShareLink,
  listShareLinks,
  markShareLinkRevoked,
  recordShareLinkUse,
} from "#db/shareLinks.ts";
import { publicUrl } from "./env.server.ts";
import type { Actor } from "./permissions.server.ts";
import { daysFrom, hashSecretToken, looksLikeSecretToken, newSecretToken, secretState } from "./secretTokens.server.ts";
import type { ShareRequest } from "./shareRequest.ts";

export function shareUrl(token: string): string {
  return publicUrl(`/s/${token}`);
}

const ROLE_WORDS: Record<ShareRole, string> = { viewer: "view", editor: "edit" };

export async function createShareLink(
  db: Db,
  input: { network: NetworkRow; request: ShareRequest; by: User; now?: Date },
): Promise<{ link: ShareLinkRow; url: string }> {
  const now = input.now ?? new Date();
  const token = newSecretToken();
  const { role, expiresInDays, label } = input.request;
  const link = await insertShareLink(db, {
    networkId: input.network.id,
    role,
    tokenHash: hashSecretToken(token),
    label: label ?? "",
    createdBy: input.by.id,
    expiresAt: expiresInDays ? daysFrom(now, expiresInDays) : null,
    now,
  });
  const lasting = expiresInDays ? `for ${expiresInDays} ${expiresInDays === 1 ? "day" : "days"}` : "without expiry";
  await insertAuditEvent(db, {
    teamId: input.network.team_id,
    kind: "share-created",
    actorId: input.by.id,
    networkId: input.network.id,
    summary: `${input.by.name} created ${role === "editor" ? "an edit" : "a view"} link #${link.id} to "${input.network.name}" ${lasting}${label ? ` (${label})` : ""}.`,
    now,
  });
  return { link, url: shareUrl(token) };
}

/** Revokes at once; false when the link was already revoked. */
export async function revokeShareLink(db: Db, link: ShareLinkRow, by: User, now = new Date()): Promise<boolean> {
  if (!(await markShareLinkRevoked(db, link.id, by.id, now))) return false;
  const network = await findNetwork(db, link.network_id);
  if (network) {
    await insertAuditEvent(db, {
      teamId: network.team_id,
      kind: "share-revoked",
      actorId: by.id,
      networkId: network.id,
      summary: `${by.name} revoked the ${ROLE_WORDS[link.role]} link #${link.id} to "${network.name}".`,
      now,
    });
  }
  return true;
}

export type OpenedShareLink =
  | { state: "unknown" }
  | { state: "revoked" | "expired"; link: ShareLinkRow }
  | { state: "gone"; link: ShareLinkRow }
  | { state: "live"; link: ShareLinkRow; network: NetworkRow };

/** What a token in an address stands for right now; checked on every request. */
export async function openShareLink(db: Db, token: string | undefined, now = new Date()): Promise<OpenedShareLink> {
  if (!looksLikeSecretToken(token)) return { state: "unknown" };
  const link = await findShareLinkByHash(db, hashSecretToken(token));
  if (!link) return { state: "unknown" };
  const state = secretState(link, now);
  if (state === "revoked" || state === "expired") return { state, link };
  const network = await findNetwork(db, link.network_id);
  if (!network || network.deleted_at !== null) return { state: "gone", link };
  return { state: "live", link, network };
}

/** The actor of someone holding a view link without signing in: that one network, that role. */
export function shareLinkActor(link: ShareLinkRow): Actor {
  return { kind: "share-link", linkId: link.id, networkId: link.network_id, role: link.role };
}

/** Notes the use (one row per visit) and, for a new visit, a line in the team's audit log. */
export async function noteShareLinkUse(db: Db, link: ShareLinkRow, network: NetworkRow, user: User | null, now = new Date()) {
  if (!(await recordShareLinkUse(db, link.id, user?.id ?? null, now))) return;
  await insertAuditEvent(db, {
    teamId: network.team_id,
    kind: "link-used",
    actorId: user?.id ?? null,
    networkId: network.id,
    summary: `${user ? user.name : "Someone without an account"} opened the ${ROLE_WORDS[link.role]} link #${link.id} to "${network.name}".`,
    now,
  });
}

/** A signed-in person opened a live link: they hold its role on its network while it lives. */
export async function grantFromLink(db: Db, link: ShareLinkRow, user: User, now = new Date()): Promise<void> {
  await insertGrant(db, link, user.id, now);
}

/** A network's links (never their tokens) with whether each still opens anything, for the Share page and the API. */
export async function shareLinksOf(db: Db, networkId: number, now = new Date()) {
  const links = await listShareLinks(db, networkId);
  return links.map((link) => ({
    ...link,
    state: secretState({ expires_at: link.expiresAt, revoked_at: link.revokedAt }, now) as "live" | "expired" | "revoked",
  }));
}

/** A link by its number, or undefined; `networkId` narrows it to one network's links. */
export async function shareLinkById(db: Db, linkId: number, networkId?: number): Promise<ShareLinkRow | undefined> {
  const link = await findShareLink(db, linkId);
  return link && (networkId === undefined || link.network_id === networkId) ? link : undefined;
}
