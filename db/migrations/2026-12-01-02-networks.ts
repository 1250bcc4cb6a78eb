// Frozen: networks and their revisions. A network's listed facts live in columns; every saved
// version of its document is a numbered revision, and (network, number) is unique so that two
// writers racing for the same next number cannot both win.
import type { Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("networks")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("team_id", "integer", (c) => c.notNull().references("teams.id").onDelete("cascade"))
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("current_revision", "integer", (c) => c.notNull())
    .addColumn("created_at", "text", (c) => c.notNull())
    .addColumn("updated_at", "text", (c) => c.notNull())
    .addColumn("updated_by", "integer", (c) => c.references("users.id").onDelete("set null"))
    .addColumn("deleted_at", "text")
    .addColumn("deleted_by", "integer", (c) => c.references("users.id").onDelete("set null"))
    .execute();
  await db.schema.createIndex("networks_team_id").on("networks").columns(["team_id", "deleted_at"]).execute();

  await db.schema
    .createTable("network_revisions")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("network_id", "integer", (c) => c.notNull().references("networks.id").onDelete("cascade"))
    .addColumn("number", "integer", (c) => c.notNull())
    .addColumn("document", "text", (c) => c.notNull())
    .addColumn("author_id", "integer", (c) => c.references("users.id").onDelete("set null"))
    .addColumn("created_at", "text", (c) => c.notNull())
    .addColumn("message", "text", (c) => c.notNull().defaultTo(""))
    .addUniqueConstraint("network_revisions_number", ["network_id", "number"])
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("network_revisions").execute();
  await db.schema.dropTable("networks").execute();
}
