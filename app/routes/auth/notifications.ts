// /account/notifications — the account page's mail settings post here: whether a team owner
// hears by e-mail of each new review note on the team's networks.
import { data } from "react-router";
import type { Route } from "./+types/notifications";
import { requireUser } from "#app/lib/auth.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { setReviewNoteMail } from "#app/lib/accounts.server.ts";

export async function action({ request }: Route.ActionArgs) {
  const user = await requireUser(request);
  const form = await request.formData();
  const value = form.get("reviewNoteMail");
  if (value !== "each" && value !== "off") {
    return data({ ok: false, message: 'Choose "each" or "off" for review note mail.' }, { status: 400 });
  }
  await setReviewNoteMail(await getDb(), user.id, value);
  return { ok: true, message: value === "each" ? "You will get an e-mail for each new review note." : "Review note e-mails are off." };
}
