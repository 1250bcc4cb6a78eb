// zod schemas for the forms, shared by the page (what the fields require) and the action (checking).
import { z } from "zod";

export const MIN_PASSWORD_LENGTH = 10;

const email = z.string().trim().min(1, "Enter your e-mail address.").pipe(z.email("Enter an e-mail address such as ada@example.org."));

export const signInSchema = z.object({
  email,
  password: z.string().min(1, "Enter your password."),
});

export const signUpSchema = z.object({
  name: z.string().trim().min(1, "Enter your name.").max(100, "A name may have at most 100 characters."),
  email,
  password: z
    .string()
    .min(MIN_PASSWORD_LENGTH, `Choose a password of at least ${MIN_PASSWORD_LENGTH} characters.`)
    .max(200, "A password may have at most 200 characters."),
});

/** Field name → first message, for showing each error beside its field. */
export function fieldErrors(error: z.ZodError): Record<string, string> {
  const out: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = String(issue.path[0] ?? "form");
    out[key] ??= issue.message;
  }
  return out;
}

/** A FormData's text fields as a plain object for zod (files are not expected in these forms). */
export function formFields(form: FormData): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [key, value] of form.entries()) if (typeof value === "string") out[key] = value;
  return out;
}
