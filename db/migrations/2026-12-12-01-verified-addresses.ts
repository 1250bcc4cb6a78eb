// Frozen: whether an account's e-mail address is proven to be its holder's (a link mailed to it was
// opened), and the single-use links that prove it. Accounts made before this have no proof yet.
import type { Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable("users").addColumn("email_verified_at", "text").execute();
  await db.schema
    .createTable("email_verifications")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("user_id", "integer", (c) => c.notNull().references("users.id").onDelete("cascade"))
    .addColumn("email", "text", (c) => c.notNull())
    .addColumn("token_hash", "text", (c) => c.notNull().unique())
    .addColumn("created_at", "text", (c) => c.notNull())
    .addColumn("expires_at", "text", (c) => c.notNull())
    .addColumn("used_at", "text")
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("email_verifications").execute();
  await db.schema.alterTable("users").dropColumn("email_verified_at").execute();
}
