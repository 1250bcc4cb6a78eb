// A team's own equipment types. The data column is JSON text that app/lib/libraryTypes.ts checked
// before it came here; names are unique per team and kind whatever their case (a unique index).
import type { Db } from "./database.ts";
import type { LibraryTypeKind, LibraryTypeRow } from "./schema.ts";

export interface LibraryTypeListing {
  id: number;
  kind: LibraryTypeKind;
  name: string;
  data: unknown;
  createdByName: string | null;
  updatedAt: string;
}

export async function listLibraryTypes(db: Db, teamId: number): Promise<LibraryTypeListing[]> {
  const rows = await db
    .selectFrom("library_types as l")
    .leftJoin("users as u", "u.id", "l.created_by")
    .select(["l.id", "l.kind", "l.name", "l.data", "u.name as createdByName", "l.updated_at as updatedAt"])
    .where("l.team_id", "=", teamId)
    .orderBy("l.kind")
    .orderBy("l.name")
    .execute();
  return rows.map((row) => ({ ...row, data: JSON.parse(row.data) as unknown }));
}

export async function findLibraryType(db: Db, id: number): Promise<LibraryTypeRow | undefined> {
  return db.selectFrom("library_types").selectAll().where("id", "=", id).executeTakeFirst();
}

export interface LibraryTypeWrite {
  kind: LibraryTypeKind;
  name: string;
  data: object;
  /** The saved type to overwrite; absent for a new one. */
  id?: number;
  /** The overwritten type's updated_at as the writer last read it: a newer save wins nothing silently. */
  basedOn?: string;
}

export type LibraryWriteResult =
  | { ok: true; created: number; updated: number }
  | { ok: false; reason: "name-taken" | "stale"; error: string };

function isUniqueViolation(error: unknown): boolean {
  return error instanceof Error && /UNIQUE constraint failed/.test(error.message);
}

/**
 * Writes every type in one transaction: all of them or none. An update must name a type of this
 * team and kind; a new name that another type already has is refused, not merged.
 */
export async function writeLibraryTypes(
  db: Db,
  input: { teamId: number; userId: number; types: LibraryTypeWrite[] },
): Promise<LibraryWriteResult> {
  const now = new Date().toISOString();
  try {
    return await db.transaction().execute(async (trx) => {
      let created = 0;
      let updated = 0;
      for (const type of input.types) {
        const data = JSON.stringify(type.data);
        if (type.id === undefined) {
          await trx
            .insertInto("library_types")
            .values({ team_id: input.teamId, kind: type.kind, name: type.name, data, created_by: input.userId, created_at: now, updated_at: now })
            .execute();
          created++;
        } else {
          let update = trx
            .updateTable("library_types")
            .set({ name: type.name, data, updated_at: now })
            .where("id", "=", type.id)
            .where("team_id", "=", input.teamId)
            .where("kind", "=", type.kind);
          if (type.basedOn !== undefined) update = update.where("updated_at", "=", type.basedOn);
          const result = await update.executeTakeFirst();
          if (Number(result.numUpdatedRows) !== 1) {
            const still = await trx.selectFrom("library_types").select("id").where("id", "=", type.id).executeTakeFirst();
            throw new StaleType(type.name, still !== undefined);
          }
          updated++;
        }
      }
      return { ok: true as const, created, updated };
    });
  } catch (error) {
    if (error instanceof StaleType) {
      return error.changed
        ? { ok: false, reason: "stale", error: `Someone saved "${error.typeName}" after you opened it; nothing was overwritten. Reload to see their version.` }
        : { ok: false, reason: "stale", error: `The type "${error.typeName}" was deleted meanwhile; nothing was saved. Read the file again.` };
    }
    if (isUniqueViolation(error)) return { ok: false, reason: "name-taken", error: "Another type of that kind already has this name; nothing was saved." };
    throw error;
  }
}

class StaleType extends Error {
  constructor(
    readonly typeName: string,
    /** True when the type is still there but was saved since; false when it is gone. */
    readonly changed = false,
  ) {
    super(`library type ${typeName} is gone`);
  }
}

export async function deleteLibraryType(db: Db, teamId: number, id: number): Promise<boolean> {
  const result = await db.deleteFrom("library_types").where("id", "=", id).where("team_id", "=", teamId).executeTakeFirst();
  return Number(result.numDeletedRows) === 1;
}
