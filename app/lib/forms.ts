// zod schemas for the forms, shared by the page (what the fields require) and the action (checking).
import { z } from "zod";
import { chosenPasswordSchema, emailSchema } from "./fieldSchemas.ts";

export { MIN_PASSWORD_LENGTH } from "./fieldSchemas.ts";

const email = emailSchema();

export const signInSchema = z.object({
  email,
  password: z.string().min(1, "Enter your password."),
});

export const signUpSchema = z.object({
  name: z.string().trim().min(1, "Enter your name.").max(100, "A name may have at most 100 characters."),
  email,
  password: chosenPasswordSchema,
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
