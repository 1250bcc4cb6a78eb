// The voltage ladder study saved with a network: one row per network, replaced on each save.
// The JSON columns hold inputs already checked by the ladder's request schema.
import type { Db } from "./database.ts";

export interface StoredLadderStudy {
  sectionBus: string;
  voltagesKV: number[];
  overrides: unknown[] | null;
  money: unknown;
  sizing: unknown | null;
  networkRevision: number;
  updatedAt: string;
  updatedByName: string | null;
}

export async function findLadderStudy(db: Db, networkId: number): Promise<StoredLadderStudy | undefined> {
  const row = await db
    .selectFrom("ladder_studies as s")
    .leftJoin("users as u", "u.id", "s.updated_by")
    .select(["s.section_bus", "s.voltages_kv", "s.overrides", "s.money", "s.sizing", "s.network_revision", "s.updated_at", "u.name as updatedByName"])
    .where("s.network_id", "=", networkId)
    .executeTakeFirst();
  if (!row) return undefined;
  return {
    sectionBus: row.section_bus,
    voltagesKV: JSON.parse(row.voltages_kv),
    overrides: JSON.parse(row.overrides),
    money: JSON.parse(row.money),
    sizing: row.sizing === null ? null : JSON.parse(row.sizing),
    networkRevision: row.network_revision,
    updatedAt: row.updated_at,
    updatedByName: row.updatedByName,
  };
}

export async function upsertLadderStudy(
  db: Db,
  input: {
    networkId: number;
    sectionBus: string;
    voltagesKV: number[];
    overrides: unknown[] | null;
    money: unknown;
    sizing?: unknown | null;
    networkRevision: number;
    userId: number;
    now?: Date;
  },
): Promise<void> {
  const values = {
    section_bus: input.sectionBus,
    voltages_kv: JSON.stringify(input.voltagesKV),
    overrides: JSON.stringify(input.overrides),
    money: JSON.stringify(input.money),
    sizing: input.sizing === undefined || input.sizing === null ? null : JSON.stringify(input.sizing),
    network_revision: input.networkRevision,
    updated_by: input.userId,
    updated_at: (input.now ?? new Date()).toISOString(),
  };
  await db
    .insertInto("ladder_studies")
    .values({ network_id: input.networkId, ...values })
    .onConflict((oc) => oc.column("network_id").doUpdateSet(values))
    .execute();
}
