// /forgot-password — ask for a link to choose a new password. The answer is the same sentence
// whether or not the address has an account, and comes back as fast either way.
import { data, Form, Link, useNavigation } from "react-router";
import type { Route } from "./+types/forgot-password";
import { FormField } from "#app/components/FormField.tsx";
import { Notice } from "#app/components/Notice.tsx";
import { getDb } from "#app/lib/db.server.ts";
import { fieldErrors, formFields } from "#app/lib/forms.ts";
import { forgotPasswordSchema, RESET_REQUESTED_MESSAGE } from "#app/lib/passwordForms.ts";
import { requestPasswordReset } from "#app/lib/passwordReset.server.ts";
import { guardPageRequest } from "#app/lib/requestGuards.server.ts";

export const meta: Route.MetaFunction = () => [{ title: "Forgotten password · Kilostep" }];

export async function action({ request }: Route.ActionArgs) {
  guardPageRequest(request);
  const parsed = forgotPasswordSchema.safeParse(formFields(await request.formData()));
  if (!parsed.success) return data({ sent: false, fieldErrors: fieldErrors(parsed.error) }, { status: 400 });
  await requestPasswordReset(await getDb(), { email: parsed.data.email });
  return { sent: true, fieldErrors: {} as Record<string, string> };
}

export default function ForgotPassword({ actionData }: Route.ComponentProps) {
  const busy = useNavigation().state === "submitting";
  const errors: Record<string, string | undefined> = actionData?.fieldErrors ?? {};
  return (
    <div className="mx-auto max-w-md">
      <section aria-labelledby="forgot-title" className="panel p-6 sm:p-8">
        <h1 id="forgot-title" className="text-2xl">
          Forgotten password
        </h1>
        <p className="mt-1 text-ink-soft">We send a link to choose a new one to the address of your account.</p>
        {actionData?.sent ? (
          <div className="mt-6">
            <Notice tone="ok">{RESET_REQUESTED_MESSAGE}</Notice>
          </div>
        ) : (
          <Form method="post" className="mt-6 space-y-4" noValidate>
            <FormField label="E-mail" name="email" type="email" autoComplete="email" required error={errors.email} />
            <button type="submit" className="btn btn-primary w-full" disabled={busy}>
              {busy ? "Sending…" : "Send the link"}
            </button>
          </Form>
        )}
      </section>
      <p className="mt-4 text-center text-ink-soft">
        Remembered it? <Link to="/sign-in">Sign in</Link>
      </p>
    </div>
  );
}
