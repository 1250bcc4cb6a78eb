// Who calls the API: a personal token in `Authorization: Bearer …`, or else the session cookie.
// A token acts with its owner's roles, capped by its scope: a read token may only read (GET, and
// the POSTs that compute without saving: solving, the voltage ladder and studies, and the DELETE
// that cancels such a computation's job). The cap is by request,
// so a new write route is closed to read tokens without anyone remembering to close it.
import type { User } from "#db/schema.ts";
import { useApiToken } from "#db/apiTokens.ts";
import { bearerToken, hashApiToken, looksLikeApiToken } from "./apiTokenText.server.ts";
import { getDb } from "./db.server.ts";

const READ_METHODS = new Set(["GET", "HEAD"]);
/** POSTs that compute an answer and store nothing. */
const READ_ONLY_POSTS = [/^\/api\/solve\/?$/, /^\/api\/networks\/[^/]+\/(solve|ladder|study|study\/jobs)\/?$/];
/** Cancelling a study job a read token started stores nothing either. */
const READ_ONLY_DELETES = [/^\/api\/networks\/[^/]+\/study\/jobs\/[^/]+\/?$/];

export function readScopeAllows(request: Request): boolean {
  const method = request.method.toUpperCase();
  if (READ_METHODS.has(method)) return true;
  const path = new URL(request.url).pathname;
  if (method === "DELETE") return READ_ONLY_DELETES.some((pattern) => pattern.test(path));
  return method === "POST" && READ_ONLY_POSTS.some((pattern) => pattern.test(path));
}

function unauthorized(error: string): Response {
  return Response.json({ error }, { status: 401, headers: { "WWW-Authenticate": 'Bearer realm="Kilostep API"' } });
}

/**
 * The token's owner when the request carries a bearer token; null when it carries none. A bad or
 * revoked token, or a write through a read token, is a thrown 401 or 403 in the API's error shape.
 */
export async function userFromApiToken(request: Request): Promise<User | null> {
  const token = bearerToken(request);
  if (token === null) return null;
  if (!looksLikeApiToken(token))
    throw unauthorized("The Authorization header must be \"Bearer\" followed by a Kilostep API token (kst_…).");
  const found = await useApiToken(await getDb(), hashApiToken(token));
  if (!found) throw unauthorized("This API token is not known or has been revoked. Create a new one on your account page.");
  if (found.scope === "read" && !readScopeAllows(request))
    throw Response.json(
      { error: `This token's scope is read; ${request.method.toUpperCase()} ${new URL(request.url).pathname} changes data and needs a token with write scope.` },
      { status: 403 },
    );
  return found.user;
}
