// /invitations/:token — the link in an invitation message. Signed in with the invited address:
// one button joins the team. Not signed in: create an account for that address right here, or
// sign in and come back. The link works once and until it expires.
import { data, Form, Link, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/invitation";
import { FormField } from "#app/components/FormField.tsx";
import { Notice } from "#app/components/Notice.tsx";
import { PageTitle } from "#app/components/PageTitle.tsx";
import { accountExists, createAccount, signUpWait, signUpWaitMessage } from "#app/lib/accounts.server.ts";
import { clientAddressOf } from "#app/lib/clientAddress.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { fieldErrors, formFields, MIN_PASSWORD_LENGTH, signUpSchema } from "#app/lib/forms.ts";
import { acceptInvitation, openInvitation, type OpenedInvitation } from "#app/lib/invitations.server.ts";
import { guardPageRequest } from "#app/lib/requestGuards.server.ts";
import { getSessionUser, startSession } from "#app/lib/session.server.ts";

export const meta: Route.MetaFunction = () => [{ title: "Team invitation · Kilostep" }, { name: "robots", content: "noindex" }];

const CLOSED: Record<Exclude<OpenedInvitation["state"], "live">, string> = {
  unknown: "This is not a Kilostep invitation link, or it was not copied whole.",
  expired: "This invitation has expired. Ask the team's owner to invite you again.",
  revoked: "The team's owner withdrew this invitation.",
  used: "This invitation has already been accepted; each one works once.",
};

export async function loader({ request, params }: Route.LoaderArgs) {
  const db = await getDb();
  const opened = await openInvitation(db, params.token);
  if (opened.state !== "live") return data({ kind: "closed" as const, sentence: CLOSED[opened.state] }, { status: opened.state === "unknown" ? 404 : 410 });
  const { invitation, team } = opened;
  const user = await getSessionUser(request);
  const hasAccount = user ? true : await accountExists(db, invitation.email);
  return {
    kind: "live" as const,
    teamName: team.name,
    role: invitation.role,
    email: invitation.email,
    signedInAs: user?.email ?? null,
    hasAccount,
    back: `/invitations/${params.token}`,
  };
}

export async function action({ request, params, context }: Route.ActionArgs) {
  guardPageRequest(request);
  const db = await getDb();
  const opened = await openInvitation(db, params.token);
  if (opened.state !== "live") return data({ error: CLOSED[opened.state], fieldErrors: {} as Record<string, string> }, { status: opened.state === "unknown" ? 404 : 410 });
  const { invitation, team } = opened;
  const form = await request.formData();

  let user = await getSessionUser(request);
  let setCookie: string | undefined;
  if (!user && form.get("intent") === "sign-up") {
    // The address comes from the invitation, not the form: holding the link shows it is theirs.
    const parsed = signUpSchema.safeParse({ ...formFields(form), email: invitation.email });
    if (!parsed.success) return data({ error: null, fieldErrors: fieldErrors(parsed.error) }, { status: 400 });
    const wait = signUpWait(clientAddressOf(context));
    if (wait !== null) return data({ error: signUpWaitMessage(wait), fieldErrors: {} }, { status: 429 });
    // Holding a link mailed to the address proves it.
    user = await createAccount(db, { name: parsed.data.name, email: invitation.email, password: parsed.data.password, emailVerified: true });
    if (!user) return data({ error: `An account with ${invitation.email} exists already: sign in, then open the link again.`, fieldErrors: {} }, { status: 400 });
    setCookie = await startSession(user.id);
  }
  if (!user) return data({ error: "Sign in first, or create an account.", fieldErrors: {} }, { status: 401 });

  const outcome = await acceptInvitation(db, { invitation, team, user });
  const headers = setCookie ? { "Set-Cookie": setCookie } : undefined;
  if (!outcome.ok) return data({ error: outcome.error, fieldErrors: {} }, { status: 409, headers });
  return redirect(`/teams/${team.id}`, { headers });
}

export default function Invitation({ loaderData, actionData }: Route.ComponentProps) {
  const busy = useNavigation().state === "submitting";
  if (loaderData.kind === "closed") {
    return (
      <section aria-labelledby="invitation-title" className="panel mx-auto max-w-xl p-6">
        <PageTitle title={<span id="invitation-title">This invitation no longer works</span>} />
        <p className="text-ink-soft">{loaderData.sentence}</p>
      </section>
    );
  }
  const { teamName, role, email, signedInAs, hasAccount, back } = loaderData;
  const errors: Record<string, string | undefined> = actionData?.fieldErrors ?? {};
  const signIn = `/sign-in?${new URLSearchParams({ redirectTo: back })}`;
  return (
    <section aria-labelledby="invitation-title" className="panel mx-auto max-w-xl p-6 sm:p-8">
      <PageTitle
        title={<span id="invitation-title">Join {teamName}</span>}
        lead={
          <>
            You are invited as <span className="role-badge">{role}</span> ({email}).
          </>
        }
      />
      {actionData?.error ? <Notice tone="error">{actionData.error}</Notice> : null}
      {signedInAs && signedInAs !== email ? (
        <p className="mt-4 text-ink-soft">
          You are signed in as {signedInAs}, but the invitation is for {email}. Sign out, then open the link again.
        </p>
      ) : signedInAs ? (
        <Form method="post" className="mt-4">
          <input type="hidden" name="intent" value="accept" />
          <button type="submit" className="btn btn-primary" disabled={busy}>
            Join {teamName} as {role}
          </button>
        </Form>
      ) : hasAccount ? (
        <p className="mt-4">
          An account uses {email}. <Link to={signIn}>Sign in</Link> and you come back here to join.
        </p>
      ) : (
        <>
          <p className="mt-4 text-ink-soft">Create your Kilostep account for {email} and join at once.</p>
          <Form method="post" className="mt-4 space-y-4" noValidate>
            <input type="hidden" name="intent" value="sign-up" />
            <FormField label="Name" name="name" autoComplete="name" required error={errors.name} />
            <FormField
              label="Password"
              name="password"
              type="password"
              autoComplete="new-password"
              required
              minLength={MIN_PASSWORD_LENGTH}
              hint={`At least ${MIN_PASSWORD_LENGTH} characters.`}
              error={errors.password}
            />
            <button type="submit" className="btn btn-primary w-full" disabled={busy}>
              Create account and join
            </button>
          </Form>
        </>
      )}
    </section>
  );
}
