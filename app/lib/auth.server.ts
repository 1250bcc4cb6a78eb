// Who is asking. remix-auth's Authenticator checks a sign-in form and hands back the user; it keeps
// no session itself, so the sign-in action starts ours (session.server.ts) once it succeeds.
import { redirect } from "react-router";
import { Authenticator } from "remix-auth";
import { FormStrategy } from "remix-auth-form";
import { findUserByEmail } from "#db/users.ts";
import type { User } from "#db/schema.ts";
import { getDb } from "./db.server.ts";
import { verifyPassword } from "./password.server.ts";
import { userFromApiToken } from "./apiAuth.server.ts";
import type { Actor } from "./permissions.server.ts";
import { guardApiRequest, guardPageRequest } from "./requestGuards.server.ts";
import { getSessionUser } from "./session.server.ts";

/** Wrong e-mail or wrong password: deliberately one case, so the answer reveals neither. */
export class InvalidCredentials extends Error {
  constructor() {
    super("The e-mail or password is not right.");
    this.name = "InvalidCredentials";
  }
}

export const authenticator = new Authenticator<User>().use(
  new FormStrategy(async ({ form }) => {
    const email = form.get("email");
    const password = form.get("password");
    if (typeof email !== "string" || typeof password !== "string") throw new InvalidCredentials();
    const user = await findUserByEmail(await getDb(), email);
    const matches = await verifyPassword(password, user?.password_hash);
    if (!user || !matches) throw new InvalidCredentials();
    return user;
  }),
  "form",
);

export function userActor(user: User): Actor {
  return { kind: "user", userId: user.id };
}

/** The signed-in user, or a redirect to the sign-in page that comes back here afterwards; refuses unsafe writes first. */
export async function requireUser(request: Request): Promise<User> {
  guardPageRequest(request);
  const user = await getSessionUser(request);
  if (user) return user;
  const url = new URL(request.url);
  const back = `${url.pathname}${url.search}`;
  throw redirect(`/sign-in?${new URLSearchParams({ redirectTo: back })}`);
}

/**
 * For the JSON API: the owner of the request's API token (Authorization: Bearer, capped by its
 * scope), else the signed-in user, or a 401 answer in JSON (an API client cannot follow a sign-in
 * page). Cross-origin writes, oversized bodies and too many solves are refused here too.
 */
export async function requireApiUser(request: Request): Promise<User> {
  const user = (await userFromApiToken(request)) ?? (await getSessionUser(request));
  if (user) {
    guardApiRequest(request);
    return user;
  }
  throw Response.json(
    { error: "Sign in first: this request carries neither a valid session cookie nor an API token (Authorization: Bearer …)." },
    { status: 401 },
  );
}

/** Pages for signing in or up make no sense to someone already signed in. */
export async function redirectIfSignedIn(request: Request, to = "/networks"): Promise<void> {
  if (await getSessionUser(request)) throw redirect(to);
}
