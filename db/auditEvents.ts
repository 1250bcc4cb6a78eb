// The team audit log: who did what to the team's members, links and networks, and when.
import type { Db } from "./database.ts";

export const AUDIT_KINDS = [
  "share-created",
  "share-revoked",
  "link-used",
  "member-invited",
  "member-joined",
  "member-added",
  "role-changed",
  "member-removed",
  "network-deleted",
  "network-restored",
  "revision-restored",
] as const;
export type AuditKind = (typeof AUDIT_KINDS)[number];

export interface AuditEventListing {
  id: number;
  kind: AuditKind;
  actorName: string | null;
  networkId: number | null;
  summary: string;
  createdAt: string;
}

export async function insertAuditEvent(
  db: Db,
  event: { teamId: number; kind: AuditKind; actorId: number | null; networkId?: number | null; summary: string; now?: Date },
): Promise<void> {
  await db
    .insertInto("audit_events")
    .values({
      team_id: event.teamId,
      kind: event.kind,
      actor_id: event.actorId,
      network_id: event.networkId ?? null,
      summary: event.summary,
      created_at: (event.now ?? new Date()).toISOString(),
    })
    .execute();
}

/** The team's most recent events first. */
export async function listAuditEvents(db: Db, teamId: number, limit = 200): Promise<AuditEventListing[]> {
  const rows = await db
    .selectFrom("audit_events as a")
    .leftJoin("users as u", "u.id", "a.actor_id")
    .select(["a.id", "a.kind", "u.name as actorName", "a.network_id", "a.summary", "a.created_at"])
    .where("a.team_id", "=", teamId)
    .orderBy("a.created_at", "desc")
    .orderBy("a.id", "desc")
    .limit(limit)
    .execute();
  return rows.map((r) => ({
    id: r.id,
    kind: r.kind as AuditKind,
    actorName: r.actorName,
    networkId: r.network_id,
    summary: r.summary,
    createdAt: r.created_at,
  }));
}
