// Frozen: a team's own equipment types, and personal API tokens. A type's numbers are JSON text
// checked by the app's schema before they are stored; its name is unique within its team and
// kind whatever its case, so an import can tell an update from a new type. A token is stored only
// as the SHA-256 of its text: the database never holds what would let someone use it.
import { sql, type Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("library_types")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("team_id", "integer", (c) => c.notNull().references("teams.id").onDelete("cascade"))
    .addColumn("kind", "text", (c) => c.notNull().check(sql`kind in ('transformer', 'conductor')`))
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("data", "text", (c) => c.notNull())
    .addColumn("created_by", "integer", (c) => c.references("users.id").onDelete("set null"))
    .addColumn("created_at", "text", (c) => c.notNull())
    .addColumn("updated_at", "text", (c) => c.notNull())
    .execute();
  await db.schema
    .createIndex("library_types_team_kind_name")
    .on("library_types")
    .unique()
    .expression(sql`team_id, kind, lower(name)`)
    .execute();

  await db.schema
    .createTable("api_tokens")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("user_id", "integer", (c) => c.notNull().references("users.id").onDelete("cascade"))
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("scope", "text", (c) => c.notNull().check(sql`scope in ('read', 'write')`))
    .addColumn("token_hash", "text", (c) => c.notNull().unique())
    .addColumn("created_at", "text", (c) => c.notNull())
    .addColumn("last_used_at", "text")
    .addColumn("revoked_at", "text")
    .execute();
  await db.schema.createIndex("api_tokens_user_id").on("api_tokens").column("user_id").execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("api_tokens").execute();
  await db.schema.dropTable("library_types").execute();
}
