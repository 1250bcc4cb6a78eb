// zod schemas of the forgotten-password forms, shared by the pages and their actions.
import { z } from "zod";
import { MIN_PASSWORD_LENGTH } from "./forms.ts";

export const forgotPasswordSchema = z.object({
  email: z.string().trim().min(1, "Enter your e-mail address.").pipe(z.email("Enter an e-mail address such as ada@example.org.")),
});

export const newPasswordSchema = z
  .object({
    token: z.string().min(1, "This page needs the link from the message; open it again."),
    password: z
      .string()
      .min(MIN_PASSWORD_LENGTH, `Choose a password of at least ${MIN_PASSWORD_LENGTH} characters.`)
      .max(200, "A password may have at most 200 characters."),
    confirm: z.string(),
  })
  .refine((form) => form.password === form.confirm, { path: ["confirm"], message: "The two passwords differ; type the same one twice." });

/** The same sentence for every address: it must not tell who has an account. */
export const RESET_REQUESTED_MESSAGE =
  "If an account uses that address, a message with a link to choose a new password is on its way. The link works for one hour.";
