import { Link } from "react-router";
import type { Route } from "./+types/list";
import { PageTitle } from "#app/components/PageTitle.tsx";
import { requireUser } from "#app/lib/auth.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { teamsOf } from "#app/lib/teams.server.ts";

export const meta: Route.MetaFunction = () => [{ title: "Teams · Kilostep" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  return { teams: await teamsOf(await getDb(), user.id) };
}

export default function Teams({ loaderData }: Route.ComponentProps) {
  return (
    <>
      <PageTitle
        title="Teams"
        lead="A team shares its networks; each member is an owner, an editor or a viewer."
        actions={
          <Link to="/teams/new" className="btn btn-primary">
            New team
          </Link>
        }
      />
      <section aria-labelledby="teams-title" className="relative panel overflow-x-auto" tabIndex={0}>
        <h2 id="teams-title" className="sr-only">
          Your teams
        </h2>
        <table className="data-table">
          <thead>
            <tr>
              <th scope="col">Team</th>
              <th scope="col">Your role</th>
              <th scope="col" className="num">
                Members
              </th>
            </tr>
          </thead>
          <tbody>
            {loaderData.teams.map((team) => (
              <tr key={team.id}>
                <td>
                  <Link to={`/teams/${team.id}`} className="font-medium">
                    {team.name}
                  </Link>
                </td>
                <td>
                  <span className="role-badge">{team.role}</span>
                </td>
                <td className="num">{team.memberCount}</td>
              </tr>
            ))}
          </tbody>
        </table>
        {loaderData.teams.length === 0 ? <p className="p-6 text-ink-soft">You belong to no team yet.</p> : null}
      </section>
      <p className="mt-6 max-w-2xl text-ink-soft">
        <strong className="font-semibold text-ink">Who may do what.</strong> Owners manage members and may delete,
        restore and share networks. Editors create, change and rename networks. Viewers open and study them.
      </p>
    </>
  );
}
