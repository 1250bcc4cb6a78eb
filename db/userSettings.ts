// Per-person settings. A person without a row has the defaults (mail about each review note).
import type { Db } from "./database.ts";
import type { ReviewNoteMail } from "./schema.ts";

export async function reviewNoteMailSetting(db: Db, userId: number): Promise<ReviewNoteMail> {
  const row = await db.selectFrom("user_settings").select("review_note_mail").where("user_id", "=", userId).executeTakeFirst();
  return row?.review_note_mail ?? "each";
}

export async function saveReviewNoteMailSetting(db: Db, userId: number, value: ReviewNoteMail): Promise<void> {
  await db
    .insertInto("user_settings")
    .values({ user_id: userId, review_note_mail: value })
    .onConflict((oc) => oc.column("user_id").doUpdateSet({ review_note_mail: value }))
    .execute();
}

/** The team's owners who want mail about review notes, leaving out `exceptUserId`. */
export async function ownersWantingNoteMail(db: Db, teamId: number, exceptUserId: number | null): Promise<{ name: string; email: string }[]> {
  const owners = db
    .selectFrom("memberships as m")
    .innerJoin("users as u", "u.id", "m.user_id")
    .leftJoin("user_settings as s", "s.user_id", "u.id")
    .select(["u.name", "u.email"])
    .where("m.team_id", "=", teamId)
    .where("m.role", "=", "owner")
    .where((eb) => eb.or([eb("s.review_note_mail", "is", null), eb("s.review_note_mail", "=", "each")]))
    .orderBy("u.name");
  return (exceptUserId === null ? owners : owners.where("u.id", "!=", exceptUserId)).execute();
}
