import { data, Form, Link, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/sign-up";
import { FormField } from "#app/components/FormField.tsx";
import { Notice } from "#app/components/Notice.tsx";
import { createAccount, DUPLICATE_EMAIL, signUpWait, signUpWaitMessage } from "#app/lib/accounts.server.ts";
import { redirectIfSignedIn } from "#app/lib/auth.server.ts";
import { clientAddressOf } from "#app/lib/clientAddress.server.ts";
import { sendEmailVerification } from "#app/lib/emailVerification.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { fieldErrors, formFields, MIN_PASSWORD_LENGTH, signUpSchema } from "#app/lib/forms.ts";
import { safeRedirect } from "#app/lib/redirect.ts";
import { guardPageRequest } from "#app/lib/requestGuards.server.ts";
import { startSession } from "#app/lib/session.server.ts";

export const meta: Route.MetaFunction = () => [{ title: "Create an account · Kilostep" }];

export async function loader({ request }: Route.LoaderArgs) {
  const redirectTo = safeRedirect(new URL(request.url).searchParams.get("redirectTo"));
  await redirectIfSignedIn(request, redirectTo);
  return { redirectTo };
}

export async function action({ request, context }: Route.ActionArgs) {
  guardPageRequest(request);
  const form = await request.formData();
  const redirectTo = safeRedirect(form.get("redirectTo"));
  const parsed = signUpSchema.safeParse(formFields(form));
  if (!parsed.success) return data({ fieldErrors: fieldErrors(parsed.error) }, { status: 400 });
  const { name, email, password } = parsed.data;

  const wait = signUpWait(clientAddressOf(context));
  if (wait !== null) return data({ fieldErrors: { form: signUpWaitMessage(wait) } }, { status: 429, headers: { "Retry-After": String(wait) } });

  const db = await getDb();
  const user = await createAccount(db, { name, email, password, emailVerified: false });
  if (!user) return data({ fieldErrors: { email: DUPLICATE_EMAIL } }, { status: 400 });
  await sendEmailVerification(db, user);

  return redirect(redirectTo, { headers: { "Set-Cookie": await startSession(user.id) } });
}

export default function SignUp({ loaderData, actionData }: Route.ComponentProps) {
  const busy = useNavigation().state === "submitting";
  const errors: Record<string, string | undefined> = actionData?.fieldErrors ?? {};
  return (
    <div className="mx-auto max-w-md">
      <section aria-labelledby="sign-up-title" className="panel p-6 sm:p-8">
        <h1 id="sign-up-title" className="text-2xl">
          Create an account
        </h1>
        <p className="mt-1 text-ink-soft">You get a team of your own at once; invite colleagues to it later.</p>
        <Form method="post" className="mt-6 space-y-4" noValidate>
          <input type="hidden" name="redirectTo" value={loaderData.redirectTo} />
          {errors.form ? <Notice tone="error">{errors.form}</Notice> : null}
          <FormField label="Name" name="name" autoComplete="name" required error={errors.name} />
          <FormField label="E-mail" name="email" type="email" autoComplete="email" required error={errors.email} />
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
            {busy ? "Creating your account…" : "Create account"}
          </button>
        </Form>
      </section>
      <p className="mt-4 text-center text-ink-soft">
        Already have an account? <Link to="/sign-in">Sign in</Link>
      </p>
    </div>
  );
}
