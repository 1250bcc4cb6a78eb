// zod schemas of the forgotten-password forms, shared by the pages and their actions.
import { z } from "zod";
import { chosenPasswordSchema, emailSchema } from "./fieldSchemas.ts";

export const forgotPasswordSchema = z.object({
  email: emailSchema(),
});

export const newPasswordSchema = z
  .object({
    token: z.string().min(1, "This page needs the link from the message; open it again."),
    password: chosenPasswordSchema,
    confirm: z.string(),
  })
  .refine((form) => form.password === form.confirm, { path: ["confirm"], message: "The two passwords differ; type the same one twice." });

/** The same sentence for every address: it must not tell who has an account. */
export const RESET_REQUESTED_MESSAGE =
  "If an account uses that address, a message with a link to choose a new password is on its way. The link works for one hour.";
