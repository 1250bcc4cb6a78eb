// A team's equipment library: reading it for the library page and for the sheet, and checking
// every write against the type schemas before it reaches the table.
import type { Db } from "#db/database.ts";
import { deleteLibraryType, findLibraryType, listLibraryTypes, writeLibraryTypes, type LibraryTypeListing, type LibraryTypeWrite } from "#db/libraryTypes.ts";
import {
  conductorTypeDataSchema,
  toConductorType,
  toTransformerType,
  transformerTypeDataSchema,
  type ConductorTypeData,
  type TeamConductorType,
  type TeamTransformerType,
  type TransformerTypeData,
} from "./libraryTypes.ts";

export type LibraryEntry =
  | { id: number; kind: "transformer"; name: string; data: TransformerTypeData; createdByName: string | null; updatedAt: string }
  | { id: number; kind: "conductor"; name: string; data: ConductorTypeData; createdByName: string | null; updatedAt: string };

/** A stored type whose data no longer reads under today's schema is left out rather than guessed at. */
function readEntry(row: LibraryTypeListing): LibraryEntry | null {
  const base = { id: row.id, name: row.name, createdByName: row.createdByName, updatedAt: row.updatedAt };
  if (row.kind === "transformer") {
    const data = transformerTypeDataSchema.safeParse(row.data);
    return data.success ? { ...base, kind: "transformer", data: data.data } : null;
  }
  const data = conductorTypeDataSchema.safeParse(row.data);
  return data.success ? { ...base, kind: "conductor", data: data.data } : null;
}

export async function teamLibrary(db: Db, teamId: number): Promise<LibraryEntry[]> {
  return (await listLibraryTypes(db, teamId)).flatMap((row) => readEntry(row) ?? []);
}

/**
 * The team's own types in the shapes of the built-in library, for the sheet's type pickers
 * (`EquipmentTypes` of the sheet's EquipmentPicker): call it from a loader after checking that
 * the caller may view the team or the network.
 */
export async function teamEquipmentTypes(
  db: Db,
  team: { id: number; name: string },
): Promise<{ transformers: TeamTransformerType[]; conductors: TeamConductorType[] }> {
  const entries = await teamLibrary(db, team.id);
  return {
    transformers: entries.flatMap((e) => (e.kind === "transformer" ? [toTransformerType(e.id, e.name, e.data, team.name)] : [])),
    conductors: entries.flatMap((e) => (e.kind === "conductor" ? [toConductorType(e.id, e.name, e.data, team.name)] : [])),
  };
}

/**
 * The team's conductor types as the voltage ladder sizes from them, and a fingerprint that changes
 * whenever one is added, changed or removed, so a kept ladder is made again after a library edit.
 */
export async function teamConductorsForSizing(db: Db, teamId: number): Promise<{ conductors: TeamConductorType[]; fingerprint: string }> {
  const rows = await listLibraryTypes(db, teamId);
  const conductors = rows.flatMap((row) => {
    const entry = readEntry(row);
    return entry?.kind === "conductor" ? [toConductorType(entry.id, entry.name, entry.data, "Team")] : [];
  });
  return { conductors, fingerprint: rows.filter((r) => r.kind === "conductor").map((r) => `${r.id}@${r.updatedAt}`).join(",") };
}

/** Whether a type of that number is in this team's library. */
export async function teamHasLibraryType(db: Db, teamId: number, typeId: number): Promise<boolean> {
  return (await findLibraryType(db, typeId))?.team_id === teamId;
}

/** Add or update types in one transaction: all are written or none (a name taken is refused). */
export async function saveLibraryTypes(db: Db, input: { teamId: number; userId: number; types: LibraryTypeWrite[] }) {
  return writeLibraryTypes(db, input);
}

/** Remove a type from the team's library; false when it is not there. */
export async function removeLibraryType(db: Db, teamId: number, typeId: number): Promise<boolean> {
  return deleteLibraryType(db, teamId, typeId);
}
