import { Form, Link } from "react-router";
import type { Route } from "./+types/account";
import { ApiTokensPanel } from "#app/components/ApiTokensPanel.tsx";
import { PageTitle } from "#app/components/PageTitle.tsx";
import { NoteMailSetting } from "#app/components/review/NoteMailSetting.tsx";
import { requireUser } from "#app/lib/auth.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { formatDate } from "#app/lib/format.ts";
import { listApiTokens } from "#db/apiTokens.ts";
import { teamsOfUser } from "#db/teams.ts";
import { reviewNoteMailSetting } from "#db/userSettings.ts";

export const meta: Route.MetaFunction = () => [{ title: "Account · Kilostep" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const db = await getDb();
  const [teams, tokens, reviewNoteMail] = await Promise.all([
    teamsOfUser(db, user.id),
    listApiTokens(db, user.id),
    reviewNoteMailSetting(db, user.id),
  ]);
  return { name: user.name, email: user.email, since: user.created_at, teams, tokens, reviewNoteMail };
}

export default function Account({ loaderData }: Route.ComponentProps) {
  const { name, email, since, teams, tokens, reviewNoteMail } = loaderData;
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
            <dd>{email}</dd>
            <dt className="text-ink-muted">Member since</dt>
            <dd>{formatDate(since)}</dd>
          </dl>
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
