// /reset-password?token=… — choose a new password with the link from the message. The link works
// once and for an hour; the new password ends every other session of the account and signs this
// browser in.
import { data, Form, Link, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/reset-password";
import { FormField } from "#app/components/FormField.tsx";
import { Notice } from "#app/components/Notice.tsx";
import { getDb } from "#app/lib/db.server.ts";
import { fieldErrors, formFields, MIN_PASSWORD_LENGTH } from "#app/lib/forms.ts";
import { newPasswordSchema } from "#app/lib/passwordForms.ts";
import { resetPassword, resetTokenState, type ResetState } from "#app/lib/passwordReset.server.ts";
import { guardPageRequest } from "#app/lib/requestGuards.server.ts";
import { startSession } from "#app/lib/session.server.ts";

export const meta: Route.MetaFunction = () => [{ title: "Choose a new password · Kilostep" }, { name: "robots", content: "noindex" }];

const CLOSED_WORDS: Record<Exclude<ResetState, "live">, string> = {
  unknown: "This is not a password link from Kilostep, or it was not copied whole.",
  expired: "This link is more than an hour old and no longer works.",
  used: "This link has already been used; each one works once.",
};

export async function loader({ request }: Route.LoaderArgs) {
  const token = new URL(request.url).searchParams.get("token") ?? "";
  const state = await resetTokenState(await getDb(), token);
  if (state !== "live") return data({ token: "", closed: CLOSED_WORDS[state] }, { status: state === "unknown" ? 404 : 410 });
  return { token, closed: null };
}

export async function action({ request }: Route.ActionArgs) {
  guardPageRequest(request);
  const parsed = newPasswordSchema.safeParse(formFields(await request.formData()));
  if (!parsed.success) return data({ fieldErrors: fieldErrors(parsed.error), closed: null }, { status: 400 });
  const reset = await resetPassword(await getDb(), { token: parsed.data.token, password: parsed.data.password });
  if (!reset.ok) return data({ fieldErrors: {}, closed: CLOSED_WORDS[reset.state] }, { status: reset.state === "unknown" ? 404 : 410 });
  return redirect("/networks", { headers: { "Set-Cookie": await startSession(reset.userId) } });
}

export default function ResetPassword({ loaderData, actionData }: Route.ComponentProps) {
  const busy = useNavigation().state === "submitting";
  const closed = actionData?.closed ?? loaderData.closed;
  const errors: Record<string, string | undefined> = actionData?.fieldErrors ?? {};
  return (
    <div className="mx-auto max-w-md">
      <section aria-labelledby="reset-title" className="panel p-6 sm:p-8">
        <h1 id="reset-title" className="text-2xl">
          Choose a new password
        </h1>
        {closed ? (
          <div className="mt-6 space-y-4">
            <Notice tone="error">{closed}</Notice>
            <p>
              <Link to="/forgot-password">Ask for a new link</Link>
            </p>
          </div>
        ) : (
          <>
            <p className="mt-1 text-ink-soft">Saving it signs this account out everywhere else.</p>
            <Form method="post" className="mt-6 space-y-4" noValidate>
              <input type="hidden" name="token" value={loaderData.token} />
              {errors.token ? <Notice tone="error">{errors.token}</Notice> : null}
              <FormField
                label="New password"
                name="password"
                type="password"
                autoComplete="new-password"
                required
                minLength={MIN_PASSWORD_LENGTH}
                hint={`At least ${MIN_PASSWORD_LENGTH} characters.`}
                error={errors.password}
              />
              <FormField label="The same again" name="confirm" type="password" autoComplete="new-password" required error={errors.confirm} />
              <button type="submit" className="btn btn-primary w-full" disabled={busy}>
                {busy ? "Saving…" : "Save the new password"}
              </button>
            </Form>
          </>
        )}
      </section>
    </div>
  );
}
