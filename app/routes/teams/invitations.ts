// /teams/:id/invitations — the team page's invitation forms post here (owners only): intent
// "invite" sends an invitation by e-mail, "revoke" withdraws one that is still pending.
import { data } from "react-router";
import type { Route } from "./+types/invitations";
import { requireTeam } from "#app/lib/access.server.ts";
import { parseId } from "#app/lib/api.server.ts";
import { fieldErrors, formFields } from "#app/lib/forms.ts";
import { invitationFormSchema, inviteToTeam, withdrawInvitation } from "#app/lib/invitations.server.ts";

export async function action({ request, params }: Route.ActionArgs) {
  const { db, user, team } = await requireTeam(request, params, "manage-members");
  const form = await request.formData();
  const intent = form.get("intent");

  if (intent === "invite") {
    const parsed = invitationFormSchema.safeParse(formFields(form));
    if (!parsed.success) {
      const errors = fieldErrors(parsed.error);
      return data({ ok: false, message: errors.email ?? errors.role ?? "Check the form." , fieldErrors: errors }, { status: 400 });
    }
    const outcome = await inviteToTeam(db, { team, email: parsed.data.email, role: parsed.data.role, by: user });
    return data(
      outcome.ok ? { ok: true, message: outcome.message, fieldErrors: {} } : { ok: false, message: outcome.error, fieldErrors: {} },
      { status: outcome.ok ? 200 : 400 },
    );
  }
  if (intent === "revoke") {
    const invitationId = parseId(String(form.get("invitationId") ?? ""));
    if (invitationId === null) return data({ ok: false, message: "Which invitation? The request names none.", fieldErrors: {} }, { status: 400 });
    const revoked = await withdrawInvitation(db, team.id, invitationId);
    return data(
      revoked
        ? { ok: true, message: "Invitation withdrawn; its link no longer works.", fieldErrors: {} }
        : { ok: false, message: "That invitation is no longer pending.", fieldErrors: {} },
      { status: revoked ? 200 : 409 },
    );
  }
  return data({ ok: false, message: "Unknown request: the form named no known action.", fieldErrors: {} }, { status: 400 });
}
