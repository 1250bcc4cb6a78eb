import { data, Form, Link, redirect } from "react-router";
import type { Route } from "./+types/team";
import { Notice } from "#app/components/Notice.tsx";
import { PageTitle } from "#app/components/PageTitle.tsx";
import { TeamMembers } from "#app/components/TeamMembers.tsx";
import { TeamAuditLog } from "#app/components/review/TeamAuditLog.tsx";
import { TeamInvitations } from "#app/components/review/TeamInvitations.tsx";
import { requireTeam } from "#app/lib/access.server.ts";
import { parseId } from "#app/lib/api.server.ts";
import { addMemberAudited, changeRoleAudited, ownerPanels, removeMemberAudited } from "#app/lib/audit.server.ts";
import { abilitiesOf, grantedOrPageError, ROLES, teamAccess, type TeamRole } from "#app/lib/permissions.server.ts";
import { teamMembers, type Outcome } from "#app/lib/teams.server.ts";

const ROLE_CHOICES: readonly TeamRole[] = ["owner", "editor", "viewer"];

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.team.name ?? "Team"} · Kilostep` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const { db, user, team, role } = await requireTeam(request, params, "view-team");
  const may = abilitiesOf(role);
  const [{ members, ownerCount }, owner] = await Promise.all([teamMembers(db, team.id), may["manage-members"] ? ownerPanels(db, team) : null]);
  return { team: { id: team.id, name: team.name }, role, me: user.id, may, ownerCount, members, owner };
}

function asRole(value: FormDataEntryValue | null): TeamRole | null {
  return ROLES.includes(value as TeamRole) ? (value as TeamRole) : null;
}

export async function action({ request, params }: Route.ActionArgs) {
  // Every member may leave; the other intents need manage-members, asked once the intent is known.
  const { db, user, actor, team } = await requireTeam(request, params, "leave-team");
  const teamId = team.id;
  const form = await request.formData();
  const intent = form.get("intent");
  const answer = (outcome: Outcome) =>
    data(outcome.ok ? { ok: true, message: outcome.message } : { ok: false, message: outcome.error }, {
      status: outcome.ok ? 200 : 400,
    });

  if (intent === "leave") {
    const outcome = await removeMemberAudited(db, { teamId, by: user, memberId: user.id });
    return outcome.ok ? redirect("/teams") : answer(outcome);
  }

  grantedOrPageError(await teamAccess(db, actor, teamId, "manage-members"));
  if (intent === "add") {
    const email = String(form.get("email") ?? "").trim();
    const role = asRole(form.get("role"));
    if (!email) return answer({ ok: false, error: "Enter the e-mail address of the person to add." });
    if (!role) return answer({ ok: false, error: "Choose owner, editor or viewer." });
    return answer(await addMemberAudited(db, { teamId, by: user, email, role }));
  }
  const memberId = parseId(String(form.get("userId") ?? ""));
  if (memberId === null) return answer({ ok: false, error: "Which member? The request names none." });
  if (intent === "change-role") {
    const role = asRole(form.get("role"));
    if (!role) return answer({ ok: false, error: "Choose owner, editor or viewer." });
    return answer(await changeRoleAudited(db, { teamId, by: user, memberId, role }));
  }
  if (intent === "remove") {
    const outcome = await removeMemberAudited(db, { teamId, by: user, memberId });
    return outcome.ok && memberId === user.id ? redirect("/teams") : answer(outcome);
  }
  return answer({ ok: false, error: "Unknown request: the form named no known action." });
}

export default function TeamPage({ loaderData, actionData }: Route.ComponentProps) {
  const { team, role, me, may, members, ownerCount, owner } = loaderData;
  const lastOwner = role === "owner" && ownerCount === 1;
  return (
    <>
      <PageTitle
        title={team.name}
        actions={
          <Link to={`/teams/${team.id}/library`} className="btn btn-small">
            Equipment library
          </Link>
        }
        lead={
          <>
            Your role <span className="role-badge">{role}</span> · {members.length}{" "}
            {members.length === 1 ? "member" : "members"}
          </>
        }
      />
      {actionData ? (
        <div className="mb-6">
          <Notice tone={actionData.ok ? "ok" : "error"}>{actionData.message}</Notice>
        </div>
      ) : null}
      <div className={may["manage-members"] ? "grid grid-cols-1 items-start gap-6 lg:grid-cols-[minmax(0,1fr)_20rem]" : ""}>
        <TeamMembers members={members} me={me} canManage={may["manage-members"]} ownerCount={ownerCount} />
        {may["manage-members"] ? (
          <section aria-labelledby="add-member-title" className="panel p-5">
            <h2 id="add-member-title" className="text-lg">
              Add a member
            </h2>
            <p className="mt-1 text-sm text-ink-muted">They need a Kilostep account already.</p>
            <Form method="post" className="mt-4 space-y-4">
              <input type="hidden" name="intent" value="add" />
              <div>
                <label htmlFor="add-email" className="field-label">
                  E-mail
                </label>
                <input id="add-email" name="email" type="email" required className="input" autoComplete="off" />
              </div>
              <div>
                <label htmlFor="add-role" className="field-label">
                  Role
                </label>
                <select id="add-role" name="role" defaultValue="editor" className="input">
                  {ROLE_CHOICES.map((r) => (
                    <option key={r} value={r}>
                      {r}
                    </option>
                  ))}
                </select>
              </div>
              <button type="submit" className="btn btn-primary w-full">
                Add member
              </button>
            </Form>
          </section>
        ) : null}
      </div>
      {owner ? (
        <>
          <TeamInvitations teamId={team.id} invitations={owner.invitations} />
          <TeamAuditLog events={owner.audit} />
        </>
      ) : null}
      <section aria-labelledby="leave-title" className="mt-10 max-w-2xl">
        <h2 id="leave-title" className="text-lg">
          Leave this team
        </h2>
        {lastOwner ? (
          <p className="mt-1 text-ink-soft">
            You are this team's only owner, so you cannot leave it. Make another member owner first.
          </p>
        ) : (
          <Form method="post" className="mt-2 flex flex-wrap items-center gap-3">
            <input type="hidden" name="intent" value="leave" />
            <p className="text-ink-soft">You will lose access to the team's networks.</p>
            <button type="submit" className="btn btn-danger btn-small">
              Leave {team.name}
            </button>
          </Form>
        )}
      </section>
    </>
  );
}
