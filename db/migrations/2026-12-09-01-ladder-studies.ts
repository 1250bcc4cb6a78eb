// Frozen: the voltage ladder study saved with a network, one per network. The inputs are JSON
// text checked by the ladder's request schema before they are stored; the network revision it
// was saved against is kept so the report can say when the drawing has moved on since.
import type { Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("ladder_studies")
    .addColumn("network_id", "integer", (c) => c.primaryKey().references("networks.id").onDelete("cascade"))
    .addColumn("section_bus", "text", (c) => c.notNull())
    .addColumn("voltages_kv", "text", (c) => c.notNull())
    .addColumn("overrides", "text", (c) => c.notNull())
    .addColumn("money", "text", (c) => c.notNull())
    .addColumn("network_revision", "integer", (c) => c.notNull())
    .addColumn("updated_by", "integer", (c) => c.references("users.id").onDelete("set null"))
    .addColumn("updated_at", "text", (c) => c.notNull())
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("ladder_studies").execute();
}
