// Calls route loaders and actions directly, the way the server would, and reduces whatever they
// return or throw (Response, data(), plain object) to a status, a body and headers.
import { getDb } from "#app/lib/db.server.ts";
import { hashPassword } from "#app/lib/password.server.ts";
import { startSession } from "#app/lib/session.server.ts";
import type { User } from "#db/schema.ts";
import { insertTeamWithOwner } from "#db/teams.ts";
import { insertUser } from "#db/users.ts";

export const ORIGIN = "http://kilostep.test";

export interface Outcome {
  status: number;
  body: any;
  headers: Headers;
}

type RouteFunction = (args: any) => unknown;

async function fromResponse(response: Response): Promise<Outcome> {
  const type = response.headers.get("Content-Type") ?? "";
  const text = await response.text();
  return { status: response.status, body: type.includes("json") && !type.includes("ndjson") && text ? JSON.parse(text) : text, headers: response.headers };
}

function isDataWithInit(value: unknown): value is { data: unknown; init: ResponseInit | null } {
  return typeof value === "object" && value !== null && (value as { type?: unknown }).type === "DataWithResponseInit";
}

/** `context` is what the server puts in the load context (app/server.ts): the client's address. */
export async function call(
  fn: RouteFunction,
  request: Request,
  params: Record<string, string> = {},
  context: { clientAddress?: string | null } = {},
): Promise<Outcome> {
  let result: unknown;
  try {
    result = await fn({ request, url: new URL(request.url), pattern: "", params, context });
  } catch (thrown) {
    if (thrown instanceof Response || isDataWithInit(thrown)) result = thrown;
    else throw thrown;
  }
  if (result instanceof Response) return fromResponse(result);
  if (isDataWithInit(result)) {
    return { status: result.init?.status ?? 200, body: result.data, headers: new Headers(result.init?.headers) };
  }
  return { status: 200, body: result, headers: new Headers() };
}

export function jsonRequest(method: string, path: string, options: { cookie?: string; body?: unknown; raw?: string } = {}) {
  const headers = new Headers({ "Content-Type": "application/json" });
  if (options.cookie) headers.set("Cookie", options.cookie);
  const body = options.raw ?? (options.body === undefined ? undefined : JSON.stringify(options.body));
  return new Request(`${ORIGIN}${path}`, { method, headers, body });
}

export function formRequest(path: string, fields: Record<string, string>, options: { cookie?: string; headers?: Record<string, string> } = {}) {
  const headers = new Headers(options.headers);
  if (options.cookie) headers.set("Cookie", options.cookie);
  return new Request(`${ORIGIN}${path}`, { method: "POST", headers, body: new URLSearchParams(fields) });
}

export function getRequest(path: string, cookie?: string) {
  return new Request(`${ORIGIN}${path}`, { headers: cookie ? { Cookie: cookie } : {} });
}

let counter = 0;

/** A new user with a password (and, like sign-up, a team of their own unless told otherwise). */
export async function makeUser(name: string, options: { password?: string; ownTeam?: boolean } = {}): Promise<User> {
  counter++;
  const db = await getDb();
  const email = `${name.toLowerCase().replace(/\W+/g, ".")}.${counter}@example.org`;
  const user = await insertUser(db, {
    email,
    name,
    passwordHash: await hashPassword(options.password ?? "long enough password"),
    emailVerifiedAt: new Date().toISOString(),
  });
  if (options.ownTeam) await db.transaction().execute((trx) => insertTeamWithOwner(trx, `${name}'s team`, user.id));
  return user;
}

/** The Cookie header a browser would send after this user signed in. */
export async function cookieFor(user: User): Promise<string> {
  return cookieFromSetCookie(await startSession(user.id));
}

export function cookieFromSetCookie(setCookie: string | null): string {
  if (!setCookie) throw new Error("No Set-Cookie header");
  return setCookie.split(";")[0];
}
