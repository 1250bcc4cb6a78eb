// Frozen: a review note written by someone holding a view link without an account carries the name
// they gave and the link it came through (author_id stays null for them).
import type { Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable("review_notes").addColumn("guest_name", "text").execute();
  await db.schema
    .alterTable("review_notes")
    .addColumn("share_link_id", "integer", (c) => c.references("share_links.id").onDelete("set null"))
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable("review_notes").dropColumn("share_link_id").execute();
  await db.schema.alterTable("review_notes").dropColumn("guest_name").execute();
}
