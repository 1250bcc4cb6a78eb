// The session cookie carries only a signed session id; the session itself is a row in the
// sessions table, so signing out (or removing a user) ends it on the server, not just in the browser.
import { createCookie } from "react-router";
import { deleteSession, findSessionUser, insertSession, SESSION_LIFETIME_DAYS } from "#db/sessions.ts";
import type { User } from "#db/schema.ts";
import { getDb } from "./db.server.ts";
import { env } from "./env.server.ts";

export const sessionCookie = createCookie("kilostep_session", {
  httpOnly: true,
  sameSite: "lax",
  secure: env.isProduction,
  path: "/",
  secrets: [env.sessionSecret],
  maxAge: SESSION_LIFETIME_DAYS * 86_400,
});

async function readSessionId(request: Request): Promise<string | null> {
  const value: unknown = await sessionCookie.parse(request.headers.get("Cookie"));
  return typeof value === "string" && value.length > 0 ? value : null;
}

/** Start a session for the user; returns the Set-Cookie header value. */
export async function startSession(userId: number): Promise<string> {
  const db = await getDb();
  const session = await insertSession(db, userId);
  return sessionCookie.serialize(session.id, { expires: new Date(session.expires_at) });
}

/**
 * Each request's session, looked up once however many loaders ask (the root's and the page's run
 * on the same Request). Keyed by the Request object, so the next request looks again: signing out
 * or removing a user still ends the session at once. After an action, React Router calls the
 * loaders with a Request of their own, so a session started or ended by the action is seen.
 */
const sessionOfRequest = new WeakMap<Request, Promise<User | null>>();

async function lookUpSessionUser(request: Request): Promise<User | null> {
  const sessionId = await readSessionId(request);
  if (!sessionId) return null;
  const found = await findSessionUser(await getDb(), sessionId);
  return found?.user ?? null;
}

/** The user behind the request's session cookie, or null (no cookie, forged, expired or ended). */
export function getSessionUser(request: Request): Promise<User | null> {
  let found = sessionOfRequest.get(request);
  if (!found) {
    found = lookUpSessionUser(request);
    sessionOfRequest.set(request, found);
  }
  return found;
}

/** End the request's session on the server; returns the Set-Cookie header that clears the cookie. */
export async function endSession(request: Request): Promise<string> {
  sessionOfRequest.delete(request);
  const sessionId = await readSessionId(request);
  if (sessionId) await deleteSession(await getDb(), sessionId);
  return sessionCookie.serialize("", { maxAge: 0, expires: new Date(0) });
}
