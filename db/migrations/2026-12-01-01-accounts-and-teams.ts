// Frozen: people, their sessions, failed sign-ins (for throttling), teams and team roles.
// Migrations import nothing from the app, so later changes to the app cannot rewrite history.
import { sql, type Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("users")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("email", "text", (c) => c.notNull().unique())
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("password_hash", "text", (c) => c.notNull())
    .addColumn("created_at", "text", (c) => c.notNull())
    .execute();

  await db.schema
    .createTable("sessions")
    .addColumn("id", "text", (c) => c.primaryKey())
    .addColumn("user_id", "integer", (c) => c.notNull().references("users.id").onDelete("cascade"))
    .addColumn("created_at", "text", (c) => c.notNull())
    .addColumn("expires_at", "text", (c) => c.notNull())
    .execute();
  await db.schema.createIndex("sessions_user_id").on("sessions").column("user_id").execute();

  await db.schema
    .createTable("sign_in_failures")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("account", "text", (c) => c.notNull())
    .addColumn("address", "text")
    .addColumn("failed_at", "text", (c) => c.notNull())
    .execute();
  await db.schema.createIndex("sign_in_failures_account").on("sign_in_failures").columns(["account", "failed_at"]).execute();
  await db.schema.createIndex("sign_in_failures_address").on("sign_in_failures").columns(["address", "failed_at"]).execute();

  await db.schema
    .createTable("teams")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("created_at", "text", (c) => c.notNull())
    .execute();

  await db.schema
    .createTable("memberships")
    .addColumn("team_id", "integer", (c) => c.notNull().references("teams.id").onDelete("cascade"))
    .addColumn("user_id", "integer", (c) => c.notNull().references("users.id").onDelete("cascade"))
    .addColumn("role", "text", (c) => c.notNull().check(sql`role in ('owner', 'editor', 'viewer')`))
    .addColumn("created_at", "text", (c) => c.notNull())
    .addPrimaryKeyConstraint("memberships_pk", ["team_id", "user_id"])
    .execute();
  await db.schema.createIndex("memberships_user_id").on("memberships").column("user_id").execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("memberships").execute();
  await db.schema.dropTable("teams").execute();
  await db.schema.dropTable("sign_in_failures").execute();
  await db.schema.dropTable("sessions").execute();
  await db.schema.dropTable("users").execute();
}
