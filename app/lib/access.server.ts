// The one prologue of every route that acts on a network or a team: who is asking (a session for
// pages; an API token or a session for the API), which network or team the path names, and
// whether that actor may do the action there. Refusals are thrown in the caller's own shape: a
// `data()` the page's error boundary shows, or the API's JSON error. The statuses are those of
// permissions.server.ts (404 for someone who may not know the thing exists, 403 for a role too low).
import { data } from "react-router";
import type { Db } from "#db/database.ts";
import type { NetworkRow, Team, TeamRole, User } from "#db/schema.ts";
import { parseId } from "./api.server.ts";
import { requireApiUser, requireUser, userActor } from "./auth.server.ts";
import { getDb } from "./db.server.ts";
import { networkAccess, teamAccess, type Actor, type NetworkAction, type Refusal, type TeamAction } from "./permissions.server.ts";

export interface NetworkGrant {
  db: Db;
  user: User;
  actor: Actor;
  network: NetworkRow;
  role: TeamRole;
}

export interface TeamGrant {
  db: Db;
  user: User;
  actor: Actor;
  team: Team;
  role: TeamRole;
}

type Caller = "page" | "api";

function refuse(caller: Caller, status: number, error: string): never {
  throw caller === "page" ? data(error, { status }) : Response.json({ error }, { status });
}

function granted<T extends { ok: true }>(caller: Caller, access: T | Refusal): T {
  if (!access.ok) refuse(caller, access.status, access.error);
  return access;
}

async function networkFor(caller: Caller, user: User, rawId: string | number | undefined, action: NetworkAction): Promise<NetworkGrant> {
  const networkId = typeof rawId === "number" ? rawId : parseId(rawId);
  if (networkId === null) refuse(caller, 404, `"${rawId}" is not a network number.`);
  const db = await getDb();
  const actor = userActor(user);
  const { network, role } = granted(caller, await networkAccess(db, actor, networkId, action));
  return { db, user, actor, network, role };
}

async function teamFor(caller: Caller, user: User, rawId: string | number | undefined, action: TeamAction): Promise<TeamGrant> {
  const teamId = typeof rawId === "number" ? rawId : parseId(rawId);
  if (teamId === null) refuse(caller, 404, `"${rawId}" is not a team number.`);
  const db = await getDb();
  const actor = userActor(user);
  const { team, role } = granted(caller, await teamAccess(db, actor, teamId, action));
  return { db, user, actor, team, role };
}

/** A page's network: signed in (else to the sign-in page), a network number, and the right to `action` on it. */
export async function requireNetwork(request: Request, params: { networkId?: string }, action: NetworkAction): Promise<NetworkGrant> {
  return networkFor("page", await requireUser(request), params.networkId, action);
}

/** The API's network: a token or a session (else 401), a network number, and the right to `action` on it. */
export async function requireApiNetwork(request: Request, params: { networkId?: string }, action: NetworkAction): Promise<NetworkGrant> {
  return networkFor("api", await requireApiUser(request), params.networkId, action);
}

/** A page's team: signed in, a team number, and the right to `action` in that team. */
export async function requireTeam(request: Request, params: { teamId?: string }, action: TeamAction): Promise<TeamGrant> {
  return teamFor("page", await requireUser(request), params.teamId, action);
}

/** A team named by a form field or a query rather than the path, for a caller already resolved. */
export async function teamOfUser(caller: Caller, user: User, teamId: number, action: TeamAction): Promise<TeamGrant> {
  return teamFor(caller, user, teamId, action);
}

/** A network named by a form field rather than the path, for a page whose user is already resolved. */
export async function networkOfUser(user: User, networkId: number, action: NetworkAction): Promise<NetworkGrant> {
  return networkFor("page", user, networkId, action);
}
