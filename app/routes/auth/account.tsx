import { data, Form, Link, useActionData } from "react-router";
import type { Route } from "./+types/account";
import { ApiTokensPanel } from "#app/components/ApiTokensPanel.tsx";
import { Notice } from "#app/components/Notice.tsx";
import { PageTitle } from "#app/components/PageTitle.tsx";
import { NoteMailSetting } from "#app/components/review/NoteMailSetting.tsx";
import { requireUser } from "#app/lib/auth.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { sendEmailVerification } from "#app/lib/emailVerification.server.ts";
import { mailAvailable } from "#app/lib/mail.server.ts";
import { formatDate } from "#app/lib/format.ts";
import { accountOverview } from "#app/lib/accounts.server.ts";

export const meta: Route.MetaFunction = () => [{ title: "Account · Kilostep" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const db = await getDb();
  const { teams, tokens, reviewNoteMail } = await accountOverview(db, user.id);
  return { name: user.name, email: user.email, verified: user.email_verified_at !== null, since: user.created_at, teams, tokens, reviewNoteMail };
}

/** The one write here: mail a new link that confirms the account's address. */
export async function action({ request }: Route.ActionArgs) {
  const user = await requireUser(request);
  if ((await request.formData()).get("intent") !== "send-verification")
    return data({ ok: false, message: "Unknown request: the form named no known action." }, { status: 400 });
  if (user.email_verified_at !== null) return { ok: true, message: "Your address is confirmed already." };
  if (!mailAvailable()) return data({ ok: false, message: "E-mail is not set up on this server, so no link can be sent." }, { status: 503 });
  if (!(await sendEmailVerification(await getDb(), user)))
    return data({ ok: false, message: "Three links have gone out in the last hour; open the newest, or try again later." }, { status: 429 });
  return { ok: true, message: `A link to confirm ${user.email} is on its way.` };
}

export default function Account({ loaderData }: Route.ComponentProps) {
  const { name, email, verified, since, teams, tokens, reviewNoteMail } = loaderData;
  const sent = useActionData<typeof action>();
  return (
    <>
      <PageTitle title="Account" lead={`Signed in as ${email}.`} />
      <div className="grid gap-6 md:grid-cols-2">
        <section aria-labelledby="you" className="panel p-6">
          <h2 id="you" className="text-lg">
            You
          </h2>
          <dl className="mt-3 grid grid-cols-[8rem_1fr] gap-y-2">
            <dt className="text-ink-muted">Name</dt>
            <dd>{name}</dd>
            <dt className="text-ink-muted">E-mail</dt>
            <dd>
              {email} {verified ? <span className="text-sm text-ink-muted">(confirmed)</span> : <span className="text-sm">(not confirmed yet)</span>}
            </dd>
            <dt className="text-ink-muted">Member since</dt>
            <dd>{formatDate(since)}</dd>
          </dl>
          {verified ? null : (
            <Form method="post" className="mt-4">
              <input type="hidden" name="intent" value="send-verification" />
              <p className="text-sm text-ink-soft">Team owners can add you by your address once you have confirmed it.</p>
              <button type="submit" className="btn btn-small mt-2">
                Send a link to confirm it
              </button>
            </Form>
          )}
          {sent ? <Notice tone={sent.ok ? "ok" : "error"}>{sent.message}</Notice> : null}
          <Form method="post" action="/sign-out" className="mt-6">
            <button type="submit" className="btn">
              Sign out
            </button>
          </Form>
        </section>
        <section aria-labelledby="your-teams" className="panel p-6">
          <h2 id="your-teams" className="text-lg">
            Your teams
          </h2>
          <ul className="mt-3 divide-y divide-paper-rule">
            {teams.map((team) => (
              <li key={team.id} className="flex items-center justify-between gap-3 py-2">
                <Link to={`/teams/${team.id}`}>{team.name}</Link>
                <span className="role-badge">{team.role}</span>
              </li>
            ))}
          </ul>
        </section>
        <NoteMailSetting value={reviewNoteMail} />
      </div>
      <ApiTokensPanel tokens={tokens} />
    </>
  );
}
