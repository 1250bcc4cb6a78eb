import { data } from "react-router";
import type { Route } from "./+types/api-tokens";
import { parseId } from "#app/lib/api.server.ts";
import { apiTokenFormSchema, createApiToken, revokeOwnApiToken } from "#app/lib/apiTokens.server.ts";
import { requireUser } from "#app/lib/auth.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { fieldErrors, formFields } from "#app/lib/forms.ts";

export type ApiTokenActionResult =
  | { intent: "create"; ok: true; token: string; name: string; scope: "read" | "write" }
  | { intent: "create"; ok: false; fieldErrors: Record<string, string> }
  | { intent: "revoke"; ok: boolean; message: string };

/**
 * POST /account/tokens, from the account page: create a token (shown once, in this answer only)
 * or revoke one of the caller's own. Only a signed-in person may do either: a token cannot make
 * or revoke tokens, since this is a page action and pages never accept tokens.
 */
export async function action({ request }: Route.ActionArgs) {
  const user = await requireUser(request);
  const db = await getDb();
  const fields = formFields(await request.formData());
  if (fields.intent === "revoke") {
    const tokenId = parseId(fields.tokenId);
    const revoked = tokenId !== null && (await revokeOwnApiToken(db, user.id, tokenId));
    if (!revoked) return data<ApiTokenActionResult>({ intent: "revoke", ok: false, message: "That token is not yours or is already revoked." }, { status: 404 });
    return { intent: "revoke", ok: true, message: `Revoked "${fields.tokenName ?? "the token"}": it no longer works.` } satisfies ApiTokenActionResult;
  }
  const parsed = apiTokenFormSchema.safeParse(fields);
  if (!parsed.success) return data<ApiTokenActionResult>({ intent: "create", ok: false, fieldErrors: fieldErrors(parsed.error) }, { status: 400 });
  const created = await createApiToken(db, user.id, parsed.data);
  // The token is in this answer only: no cache may keep a copy.
  return data<ApiTokenActionResult>(
    { intent: "create", ok: true, token: created.token, name: created.name, scope: created.scope },
    { headers: { "Cache-Control": "no-store" } },
  );
}

/** Reached by a GET: the tokens are listed on the account page. */
export function loader() {
  throw new Response(null, { status: 302, headers: { Location: "/account" } });
}
