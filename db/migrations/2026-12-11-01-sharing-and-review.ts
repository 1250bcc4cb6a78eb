// Frozen: share links and who used them, the network grants an opened link gives a signed-in
// person, team invitations, password resets, review notes, per-person mail settings and the
// team audit log. Every secret (link, invitation, reset) is stored only as the SHA-256 of its
// text, so a copy of the database opens nothing.
import { sql, type Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("share_links")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("network_id", "integer", (c) => c.notNull().references("networks.id").onDelete("cascade"))
    .addColumn("role", "text", (c) => c.notNull().check(sql`role in ('viewer', 'editor')`))
    .addColumn("token_hash", "text", (c) => c.notNull().unique())
    .addColumn("label", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("created_by", "integer", (c) => c.references("users.id").onDelete("set null"))
    .addColumn("created_at", "text", (c) => c.notNull())
    .addColumn("expires_at", "text")
    .addColumn("revoked_at", "text")
    .addColumn("revoked_by", "integer", (c) => c.references("users.id").onDelete("set null"))
    .execute();
  await db.schema.createIndex("share_links_network_id").on("share_links").column("network_id").execute();

  await db.schema
    .createTable("share_link_uses")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("share_link_id", "integer", (c) => c.notNull().references("share_links.id").onDelete("cascade"))
    .addColumn("user_id", "integer", (c) => c.references("users.id").onDelete("set null"))
    .addColumn("used_at", "text", (c) => c.notNull())
    .execute();
  await db.schema.createIndex("share_link_uses_link").on("share_link_uses").columns(["share_link_id", "used_at"]).execute();

  await db.schema
    .createTable("network_grants")
    .addColumn("share_link_id", "integer", (c) => c.notNull().references("share_links.id").onDelete("cascade"))
    .addColumn("user_id", "integer", (c) => c.notNull().references("users.id").onDelete("cascade"))
    .addColumn("network_id", "integer", (c) => c.notNull().references("networks.id").onDelete("cascade"))
    .addColumn("role", "text", (c) => c.notNull().check(sql`role in ('viewer', 'editor')`))
    .addColumn("created_at", "text", (c) => c.notNull())
    .addPrimaryKeyConstraint("network_grants_pk", ["share_link_id", "user_id"])
    .execute();
  await db.schema.createIndex("network_grants_user_network").on("network_grants").columns(["user_id", "network_id"]).execute();

  await db.schema
    .createTable("team_invitations")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("team_id", "integer", (c) => c.notNull().references("teams.id").onDelete("cascade"))
    .addColumn("email", "text", (c) => c.notNull())
    .addColumn("role", "text", (c) => c.notNull().check(sql`role in ('owner', 'editor', 'viewer')`))
    .addColumn("token_hash", "text", (c) => c.notNull().unique())
    .addColumn("invited_by", "integer", (c) => c.references("users.id").onDelete("set null"))
    .addColumn("created_at", "text", (c) => c.notNull())
    .addColumn("expires_at", "text", (c) => c.notNull())
    .addColumn("accepted_at", "text")
    .addColumn("accepted_by", "integer", (c) => c.references("users.id").onDelete("set null"))
    .addColumn("revoked_at", "text")
    .execute();
  await db.schema.createIndex("team_invitations_team_id").on("team_invitations").column("team_id").execute();

  await db.schema
    .createTable("password_resets")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("user_id", "integer", (c) => c.notNull().references("users.id").onDelete("cascade"))
    .addColumn("token_hash", "text", (c) => c.notNull().unique())
    .addColumn("created_at", "text", (c) => c.notNull())
    .addColumn("expires_at", "text", (c) => c.notNull())
    .addColumn("used_at", "text")
    .execute();
  await db.schema.createIndex("password_resets_user_id").on("password_resets").column("user_id").execute();

  await db.schema
    .createTable("review_threads")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("network_id", "integer", (c) => c.notNull().references("networks.id").onDelete("cascade"))
    .addColumn("element_id", "text")
    .addColumn("element_name", "text")
    .addColumn("revision", "integer", (c) => c.notNull())
    .addColumn("created_by", "integer", (c) => c.references("users.id").onDelete("set null"))
    .addColumn("created_at", "text", (c) => c.notNull())
    .addColumn("resolved_at", "text")
    .addColumn("resolved_by", "integer", (c) => c.references("users.id").onDelete("set null"))
    .execute();
  await db.schema.createIndex("review_threads_network_id").on("review_threads").column("network_id").execute();

  await db.schema
    .createTable("review_notes")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("thread_id", "integer", (c) => c.notNull().references("review_threads.id").onDelete("cascade"))
    .addColumn("author_id", "integer", (c) => c.references("users.id").onDelete("set null"))
    .addColumn("body", "text", (c) => c.notNull())
    .addColumn("created_at", "text", (c) => c.notNull())
    .execute();
  await db.schema.createIndex("review_notes_thread_id").on("review_notes").column("thread_id").execute();

  await db.schema
    .createTable("user_settings")
    .addColumn("user_id", "integer", (c) => c.primaryKey().references("users.id").onDelete("cascade"))
    .addColumn("review_note_mail", "text", (c) => c.notNull().defaultTo("each").check(sql`review_note_mail in ('each', 'off')`))
    .execute();

  await db.schema
    .createTable("audit_events")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("team_id", "integer", (c) => c.notNull().references("teams.id").onDelete("cascade"))
    .addColumn("kind", "text", (c) => c.notNull())
    .addColumn("actor_id", "integer", (c) => c.references("users.id").onDelete("set null"))
    .addColumn("network_id", "integer", (c) => c.references("networks.id").onDelete("set null"))
    .addColumn("summary", "text", (c) => c.notNull())
    .addColumn("created_at", "text", (c) => c.notNull())
    .execute();
  await db.schema.createIndex("audit_events_team").on("audit_events").columns(["team_id", "created_at"]).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("audit_events").execute();
  await db.schema.dropTable("user_settings").execute();
  await db.schema.dropTable("review_notes").execute();
  await db.schema.dropTable("review_threads").execute();
  await db.schema.dropTable("password_resets").execute();
  await db.schema.dropTable("team_invitations").execute();
  await db.schema.dropTable("network_grants").execute();
  await db.schema.dropTable("share_link_uses").execute();
  await db.schema.dropTable("share_links").execute();
}
