// What a share link request may ask for, shared by the Share page's form, its action and the API.
import { z } from "zod";

export const SHARE_EXPIRY_MAX_DAYS = 365;

export const shareRequestSchema = z.strictObject({
  role: z.enum(["viewer", "editor"], { error: 'role must be "viewer" or "editor"' }),
  expiresInDays: z
    .number({ error: "expiresInDays must be a whole number of days, or null for a link that does not expire" })
    .int("expiresInDays must be a whole number of days")
    .min(1, "expiresInDays must be at least 1")
    .max(SHARE_EXPIRY_MAX_DAYS, `expiresInDays may be at most ${SHARE_EXPIRY_MAX_DAYS}`)
    .nullable()
    .optional(),
  label: z.string().trim().max(200, "label may have at most 200 characters").optional(),
});
export type ShareRequest = z.infer<typeof shareRequestSchema>;
