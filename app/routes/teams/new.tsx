import { data, Form, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/new";
import { FormField } from "#app/components/FormField.tsx";
import { PageTitle } from "#app/components/PageTitle.tsx";
import { requireUser } from "#app/lib/auth.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { TEAM_NAME_MAX } from "#app/lib/fieldSchemas.ts";
import { checkTeamName, createTeam } from "#app/lib/teams.server.ts";

export const meta: Route.MetaFunction = () => [{ title: "New team · Kilostep" }];

export async function loader({ request }: Route.LoaderArgs) {
  await requireUser(request);
  return null;
}

/** Anyone signed in may start a team; they become its owner. */
export async function action({ request }: Route.ActionArgs) {
  const user = await requireUser(request);
  const form = await request.formData();
  const checked = checkTeamName(form.get("name"));
  if (!checked.ok) return data({ error: checked.error }, { status: 400 });
  const team = await createTeam(await getDb(), checked.name, user.id);
  return redirect(`/teams/${team.id}`);
}

export default function NewTeam({ actionData }: Route.ComponentProps) {
  const busy = useNavigation().state === "submitting";
  return (
    <div className="max-w-xl">
      <PageTitle title="New team" lead="You will be its owner; add colleagues by e-mail once it exists." />
      <Form method="post" className="panel space-y-4 p-6" noValidate>
        <FormField label="Team name" name="name" required maxLength={TEAM_NAME_MAX} error={actionData?.error} />
        <button type="submit" className="btn btn-primary" disabled={busy}>
          {busy ? "Creating…" : "Create team"}
        </button>
      </Form>
    </div>
  );
}
