import { data, Form, Link, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/sign-in";
import { FormField } from "#app/components/FormField.tsx";
import { Notice } from "#app/components/Notice.tsx";
import { authenticator, InvalidCredentials, redirectIfSignedIn } from "#app/lib/auth.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { fieldErrors, formFields, signInSchema } from "#app/lib/forms.ts";
import { safeRedirect } from "#app/lib/redirect.ts";
import { guardPageRequest } from "#app/lib/requestGuards.server.ts";
import { startSession } from "#app/lib/session.server.ts";
import { clientAddressOf } from "#app/lib/clientAddress.server.ts";
import { beginSignInAttempt, isKnownBrowser, rememberBrowser, signInFailed, signInSucceeded, throttledMessage } from "#app/lib/signInThrottle.server.ts";
import { normalizeEmail } from "#app/lib/accounts.server.ts";

export const meta: Route.MetaFunction = () => [{ title: "Sign in · Kilostep" }];

export async function loader({ request }: Route.LoaderArgs) {
  const redirectTo = safeRedirect(new URL(request.url).searchParams.get("redirectTo"));
  await redirectIfSignedIn(request, redirectTo);
  return { redirectTo };
}

export async function action({ request, context }: Route.ActionArgs) {
  guardPageRequest(request);
  // The form strategy reads the body itself, so read a clone here and leave the original unread.
  const form = await request.clone().formData();
  const redirectTo = safeRedirect(form.get("redirectTo"));
  const parsed = signInSchema.safeParse(formFields(form));
  if (!parsed.success) {
    return data({ fieldErrors: fieldErrors(parsed.error), formError: null }, { status: 400 });
  }

  const db = await getDb();
  const account = normalizeEmail(parsed.data.email);
  // Counted before the password is checked, so parallel guesses cannot pass the limit together.
  const verdict = await beginSignInAttempt(db, {
    account,
    address: clientAddressOf(context),
    knownBrowser: await isKnownBrowser(request, account),
  });
  if (!verdict.allowed) {
    return data(
      { fieldErrors: {}, formError: throttledMessage(verdict.retryAfterSeconds) },
      { status: 429, headers: { "Retry-After": String(verdict.retryAfterSeconds) } },
    );
  }

  try {
    const user = await authenticator.authenticate("form", request);
    await signInSucceeded(db, account);
    const headers = new Headers();
    headers.append("Set-Cookie", await startSession(user.id));
    headers.append("Set-Cookie", await rememberBrowser(request, account));
    return redirect(redirectTo, { headers });
  } catch (error) {
    if (!(error instanceof InvalidCredentials)) throw error;
    await signInFailed(db);
    return data({ fieldErrors: {}, formError: error.message }, { status: 400 });
  }
}

export default function SignIn({ loaderData, actionData }: Route.ComponentProps) {
  const busy = useNavigation().state === "submitting";
  const errors: Record<string, string | undefined> = actionData?.fieldErrors ?? {};
  const signUpHref =
    loaderData.redirectTo === "/networks" ? "/sign-up" : `/sign-up?${new URLSearchParams({ redirectTo: loaderData.redirectTo })}`;
  return (
    <div className="mx-auto max-w-md">
      <section aria-labelledby="sign-in-title" className="panel p-6 sm:p-8">
        <h1 id="sign-in-title" className="text-2xl">
          Sign in
        </h1>
        <p className="mt-1 text-ink-soft">Open your team's networks and studies.</p>
        <Form method="post" className="mt-6 space-y-4" noValidate>
          <input type="hidden" name="redirectTo" value={loaderData.redirectTo} />
          {actionData?.formError ? <Notice tone="error">{actionData.formError}</Notice> : null}
          <FormField label="E-mail" name="email" type="email" autoComplete="email" required error={errors.email} />
          <FormField
            label="Password"
            name="password"
            type="password"
            autoComplete="current-password"
            required
            error={errors.password}
          />
          <button type="submit" className="btn btn-primary w-full" disabled={busy}>
            {busy ? "Signing in…" : "Sign in"}
          </button>
        </Form>
      </section>
      <p className="mt-4 text-center text-ink-soft">
        New to Kilostep? <Link to={signUpHref}>Create an account</Link>
      </p>
      <p className="mt-2 text-center text-ink-soft">
        <Link to="/forgot-password">Forgotten your password?</Link>
      </p>
    </div>
  );
}
