// Frozen: a revision may be a draft (a drawing not yet a complete network: its cross-element
// problems are kept as JSON text, null when complete); an editing session's autosaves fold into
// one revision (how many were folded, and when it last changed); a planner may mark a revision
// issued; a revision that only moved things on the sheet is marked layout-only.
import type { Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable("network_revisions").addColumn("problems", "text").execute();
  await db.schema.alterTable("network_revisions").addColumn("folded_saves", "integer", (c) => c.notNull().defaultTo(0)).execute();
  await db.schema.alterTable("network_revisions").addColumn("updated_at", "text").execute();
  await db.schema.alterTable("network_revisions").addColumn("issued_at", "text").execute();
  await db.schema
    .alterTable("network_revisions")
    .addColumn("issued_by", "integer", (c) => c.references("users.id").onDelete("set null"))
    .execute();
  await db.schema.alterTable("network_revisions").addColumn("layout_only", "integer", (c) => c.notNull().defaultTo(0)).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const column of ["layout_only", "issued_by", "issued_at", "updated_at", "folded_saves", "problems"])
    await db.schema.alterTable("network_revisions").dropColumn(column).execute();
}
