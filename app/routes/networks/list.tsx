import { data, Form, Link, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/list";
import { Notice } from "#app/components/Notice.tsx";
import { PageTitle } from "#app/components/PageTitle.tsx";
import { TeamSelect } from "#app/components/TeamSelect.tsx";
import { NetworkRows, RecentlyDeleted } from "#app/components/NetworkList.tsx";
import { SharedWithYou } from "#app/components/review/SharedWithYou.tsx";
import { networkOfUser, teamOfUser } from "#app/lib/access.server.ts";
import { parseId } from "#app/lib/api.server.ts";
import { requireUser } from "#app/lib/auth.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { firstIssue, NETWORK_NAME_MAX, optionalNetworkNameSchema } from "#app/lib/fieldSchemas.ts";
import { documentFromTemplate, TEMPLATE_IDS, TEMPLATES, type TemplateId } from "#app/lib/demo/networkTemplates.server.ts";
import { networksOfUser, restorableNetworksOfUser, teamsToCreateIn } from "#app/lib/networkLists.server.ts";
import { createNetwork, deleteNetwork, renameNetwork, restoreDeletedNetwork } from "#app/lib/networks.server.ts";
import { abilitiesOf } from "#app/lib/permissions.server.ts";

export const meta: Route.MetaFunction = () => [{ title: "Networks · Kilostep" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const db = await getDb();
  const [{ own, shared }, deleted, createTeams] = await Promise.all([
    networksOfUser(db, user.id),
    restorableNetworksOfUser(db, user.id),
    teamsToCreateIn(db, user.id),
  ]);
  return {
    networks: own.map((n) => ({ ...n, may: abilitiesOf(n.role) })),
    shared,
    deleted,
    createTeams,
    templates: TEMPLATES.map(({ id, label, hint }) => ({ id, label, hint })),
  };
}

type ActionResult = { ok: boolean; message: string; networkId?: number };

function fail(message: string, status = 400) {
  return data<ActionResult>({ ok: false, message }, { status });
}

export async function action({ request }: Route.ActionArgs) {
  const user = await requireUser(request);
  const form = await request.formData();
  const intent = form.get("intent");

  if (intent === "create") {
    const teamId = parseId(String(form.get("teamId") ?? ""));
    if (teamId === null) return fail("Choose the team the network belongs to.");
    const { db } = await teamOfUser("page", user, teamId, "create-in-team");
    const template = String(form.get("template") ?? "blank");
    if (!TEMPLATE_IDS.includes(template as TemplateId)) return fail(`There is no starting point called "${template}".`);
    const name = optionalNetworkNameSchema.safeParse(String(form.get("name") ?? ""));
    if (!name.success) return fail(firstIssue(name.error));
    const created = await createNetwork(db, {
      teamId,
      document: documentFromTemplate(template as TemplateId, name.data),
      authorId: user.id,
      message: template === "blank" ? "Created blank" : `Created from the ${template} demo`,
    });
    if (!created.ok) return fail(created.issues.map((i) => `${i.path}: ${i.message}`).join("; "));
    return redirect(`/networks/${created.network.id}`);
  }

  const networkId = parseId(String(form.get("networkId") ?? ""));
  if (networkId === null) return fail("Which network? The request names none.");

  if (intent === "rename") {
    const { db, network } = await networkOfUser(user, networkId, "rename");
    const renamed = await renameNetwork(db, { networkId, name: String(form.get("name") ?? ""), authorId: user.id });
    if (!renamed.ok) return data<ActionResult>({ ok: false, message: renamed.error, networkId }, { status: 400 });
    return data<ActionResult>({ ok: true, message: `Renamed "${network.name}" to "${String(form.get("name")).trim()}".`, networkId });
  }
  if (intent === "delete") {
    const { db, network } = await networkOfUser(user, networkId, "delete");
    await deleteNetwork(db, { network, by: user });
    return data<ActionResult>({ ok: true, message: `Deleted "${network.name}". You can restore it from "Recently deleted" for 30 days.` });
  }
  if (intent === "restore") {
    const { db, network } = await networkOfUser(user, networkId, "restore");
    if (!(await restoreDeletedNetwork(db, { network, by: user, reviveLinks: form.get("reviveLinks") === "on" }))) return fail(`"${network.name}" is not deleted, or its 30 days have passed.`, 409);
    return data<ActionResult>({ ok: true, message: `Restored "${network.name}".`, networkId });
  }
  return fail("Unknown request: the form named no known action.");
}

export default function Networks({ loaderData, actionData }: Route.ComponentProps) {
  const { networks, shared, deleted, createTeams, templates } = loaderData;
  const creating = useNavigation().formData?.get("intent") === "create";
  return (
    <>
      <PageTitle
        title="Networks"
        lead="Every study of the teams you belong to, most recently changed first."
        actions={
          createTeams.length > 0 ? (
            <Link to="/networks/upload" className="btn btn-small">
              Upload a network file
            </Link>
          ) : undefined
        }
      />
      {actionData ? (
        <div className="mb-6">
          <Notice tone={actionData.ok ? "ok" : "error"}>{actionData.message}</Notice>
        </div>
      ) : null}
      <div className={createTeams.length > 0 ? "grid grid-cols-1 items-start gap-6 lg:grid-cols-[minmax(0,1fr)_20rem]" : ""}>
        <section aria-labelledby="network-list-title" className="relative panel overflow-x-auto" tabIndex={0}>
          <h2 id="network-list-title" className="sr-only">
            Your networks
          </h2>
          <NetworkRows networks={networks} />
        </section>
        {createTeams.length > 0 ? (
          <section aria-labelledby="new-network-title" className="panel p-5">
            <h2 id="new-network-title" className="text-lg">
              Start a network
            </h2>
            <Form method="post" className="mt-4 space-y-4">
              <input type="hidden" name="intent" value="create" />
              <div>
                <label htmlFor="new-network-name" className="field-label">
                  Name
                </label>
                <input
                  id="new-network-name"
                  name="name"
                  className="input"
                  maxLength={NETWORK_NAME_MAX}
                  aria-describedby="new-network-name-hint"
                />
                <p id="new-network-name-hint" className="field-hint">
                  Leave empty to use the starting point's name.
                </p>
              </div>
              <TeamSelect id="new-network-team" teams={createTeams} />
              <fieldset>
                <legend className="field-label">Start from</legend>
                <div className="space-y-2">
                  {templates.map((template, i) => (
                    <label
                      key={template.id}
                      className="flex cursor-pointer gap-3 rounded border border-paper-rule p-2.5 has-[:checked]:border-accent has-[:checked]:bg-accent-wash"
                    >
                      <input
                        type="radio"
                        name="template"
                        value={template.id}
                        defaultChecked={i === 0}
                        className="mt-1 accent-[var(--color-accent)]"
                      />
                      <span>
                        <span className="block font-medium">{template.label}</span>
                        <span className="block text-sm text-ink-muted">{template.hint}</span>
                      </span>
                    </label>
                  ))}
                </div>
              </fieldset>
              <button type="submit" className="btn btn-primary w-full" disabled={creating}>
                {creating ? "Creating…" : "Create network"}
              </button>
              <p className="text-sm text-ink-muted">
                Need a new team first? <Link to="/teams/new">Create a team</Link>.
              </p>
            </Form>
          </section>
        ) : null}
      </div>
      {shared.length > 0 ? <SharedWithYou networks={shared} /> : null}
      {deleted.length > 0 ? <RecentlyDeleted networks={deleted} /> : null}
    </>
  );
}
