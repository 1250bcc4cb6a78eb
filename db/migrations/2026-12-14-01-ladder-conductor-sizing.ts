// Frozen: a saved voltage ladder study may ask the ladder to size the section's conductor for
// each alternative; the request's sizing part (the fault clearing time) as JSON, null when not asked.
import type { Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable("ladder_studies").addColumn("sizing", "text").execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable("ladder_studies").dropColumn("sizing").execute();
}
