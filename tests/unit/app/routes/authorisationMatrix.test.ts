// The authorisation matrix: every route in app/routes.ts, called through its own loader or action
// as the server would, by nine actors: someone anonymous, a signed-in outsider, the team's
// viewer, editor and owner, a view-link holder (no account), an edit-link holder (signed in,
// holding a live grant), and holders of a revoked and of an expired link. Every expected status
// is written out by hand below; a route added to app/routes.ts without a line here fails the test.
import { readFileSync } from "node:fs";
import { beforeAll, describe, expect, it } from "vitest";
import routeConfig from "#app/routes.ts";
import { mailSettled } from "#app/lib/mail.server.ts";
import { call, cookieFor, ORIGIN, type Outcome } from "./harness.ts";
import { ACTORS, demoDocument, freshWorld, makePeople, type ActorName, type People, type World } from "./reviewWorld.ts";

type Expect = Record<ActorName, number>;
type Body = { form: Record<string, string> } | { json: unknown } | { upload: Record<string, string> };

interface Case {
  /** The route's path as app/routes.ts writes it. */
  route: string;
  method: "GET" | "POST" | "PUT" | "DELETE";
  /** With {network}, {other}, {team}, {token} and {share} filled in per world and actor. */
  path: string;
  body?: Body;
  expect: Expect;
  /** It changes what other cases rely on (deleting a network): a new world for each actor. */
  fresh?: boolean;
  /** It ends the session it is sent with (signing out): each actor sends a session of its own. */
  ownSession?: boolean;
}

// ---- expectation patterns, each written from the product's rules ----
const everyone = (status: number): Expect => Object.fromEntries(ACTORS.map((a) => [a, status])) as Expect;
/** Needs an account, nothing more: `anon` for those without one (302 to sign in, or 401 in the API). */
const signedIn = (ok: number, anon: number): Expect => ({
  ...everyone(ok),
  anonymous: anon,
  viewLink: anon,
});
/**
 * On this world's network: outsiders and holders of dead links learn nothing (404); a view-link
 * holder without an account is like anyone without one (`anon`) outside /s/…; the edit-link
 * holder has the editor's network role through their grant.
 */
const onNetwork = (roles: { viewer: number; editor: number; owner: number }, anon: number, editLink = roles.editor): Expect => ({
  anonymous: anon,
  viewLink: anon,
  outsider: 404,
  revokedLink: 404,
  expiredLink: 404,
  ...roles,
  editLink,
});
const view = (anon: number, ok = 200) => onNetwork({ viewer: ok, editor: ok, owner: ok }, anon);
/** On the team: a grant on one network is no membership, so link holders are outsiders here. */
const onTeam = (roles: { viewer: number; editor: number; owner: number }, anon: number): Expect => ({
  ...onNetwork(roles, anon),
  editLink: 404,
});
/** Under /s/:token: only the token counts; a live edit link always sends its holder on (302). */
const viaLink = (viewLink: number, editLink: number): Expect => ({
  ...everyone(404),
  viewLink,
  editLink,
  revokedLink: 410,
  expiredLink: 410,
});

const solveBody = () => ({ json: demoDocument("Matrix solve") });

const CASES: Case[] = [
  // Public pages
  { route: "", method: "GET", path: "/", expect: everyone(200) },
  { route: "sign-in", method: "GET", path: "/sign-in", expect: { ...everyone(302), anonymous: 200, viewLink: 200 } },
  { route: "sign-up", method: "GET", path: "/sign-up", expect: { ...everyone(302), anonymous: 200, viewLink: 200 } },
  { route: "sign-out", method: "GET", path: "/sign-out", expect: everyone(302) },
  { route: "sign-out", method: "POST", path: "/sign-out", body: { form: {} }, expect: everyone(302), ownSession: true },
  { route: "docs/api", method: "GET", path: "/docs/api", expect: everyone(200) },
  { route: "api/schema", method: "GET", path: "/api/schema", expect: everyone(200) },
  // The mail fake runs in tests (NODE_ENV=test); in production these answer 404 (mail.test.ts).
  { route: "dev/mail", method: "GET", path: "/dev/mail", expect: everyone(200) },
  { route: "dev/mail.json", method: "GET", path: "/dev/mail.json", expect: everyone(200) },
  { route: "forgot-password", method: "GET", path: "/forgot-password", expect: everyone(200) },
  { route: "forgot-password", method: "POST", path: "/forgot-password", body: { form: { email: "nobody.here@example.org" } }, expect: everyone(200) },
  { route: "reset-password", method: "GET", path: "/reset-password?token={token}", expect: everyone(404) },
  {
    route: "reset-password",
    method: "POST",
    path: "/reset-password",
    body: { form: { token: "A".repeat(43), password: "a long new password", confirm: "a long new password" } },
    expect: everyone(404),
  },
  { route: "invitations/:token", method: "GET", path: "/invitations/{token}", expect: everyone(404) },
  { route: "invitations/:token", method: "POST", path: "/invitations/{token}", body: { form: { intent: "accept" } }, expect: everyone(404) },

  // Account
  { route: "account", method: "GET", path: "/account", expect: signedIn(200, 302) },
  { route: "account", method: "POST", path: "/account", body: { form: { intent: "unknown" } }, expect: signedIn(400, 302) },
  { route: "verify-email", method: "GET", path: "/verify-email?token={token}", expect: everyone(410) },
  { route: "account/notifications", method: "POST", path: "/account/notifications", body: { form: { reviewNoteMail: "each" } }, expect: signedIn(200, 302) },
  { route: "account/tokens", method: "GET", path: "/account/tokens", expect: everyone(302) },
  { route: "account/tokens", method: "POST", path: "/account/tokens", body: { form: { intent: "revoke", tokenId: "987654" } }, expect: signedIn(404, 302) },

  // Share links
  { route: "s/:token", method: "GET", path: "/s/{token}", expect: viaLink(200, 302) },
  { route: "s/:token/report", method: "GET", path: "/s/{token}/report", expect: viaLink(200, 302) },
  { route: "s/:token/results.csv", method: "GET", path: "/s/{token}/results.csv?table=buses", expect: viaLink(200, 302) },
  // A view-link holder signs a note with a name; an edit link's holder writes on the network's page once signed in.
  {
    route: "s/:token/notes",
    method: "POST",
    path: "/s/{token}/notes",
    body: { form: { intent: "start", elementId: "", guestName: "Matrix guest", body: "A guest's note" } },
    expect: viaLink(200, 403),
  },
  { route: "s/:token/study", method: "GET", path: "/s/{token}/study", expect: viaLink(200, 302) },
  { route: "s/:token/study/run", method: "GET", path: "/s/{token}/study/run", expect: viaLink(200, 302) },
  { route: "s/:token/study.csv", method: "GET", path: "/s/{token}/study.csv?table=envelope", expect: viaLink(200, 302) },

  // Networks pages
  { route: "networks", method: "GET", path: "/networks", expect: signedIn(200, 302) },
  {
    route: "networks",
    method: "POST",
    path: "/networks",
    body: { form: { intent: "delete", networkId: "{network}" } },
    expect: onNetwork({ viewer: 403, editor: 403, owner: 200 }, 302),
    fresh: true,
  },
  { route: "networks/upload", method: "GET", path: "/networks/upload", expect: signedIn(200, 302) },
  {
    route: "networks/upload",
    method: "POST",
    path: "/networks/upload",
    body: { upload: { teamId: "{team}", intent: "preview" } },
    expect: onTeam({ viewer: 403, editor: 200, owner: 200 }, 302),
  },
  { route: "networks/:networkId", method: "GET", path: "/networks/{network}", expect: view(302) },
  { route: "networks/:networkId", method: "GET", path: "/networks/{other}", expect: { ...view(302), editLink: 404 } },
  { route: "networks/:networkId/document", method: "GET", path: "/networks/{network}/document", expect: view(302) },
  { route: "networks/:networkId/document", method: "GET", path: "/networks/{other}/document", expect: { ...view(302), editLink: 404 } },
  { route: "networks/:networkId/loads-import", method: "GET", path: "/networks/{network}/loads-import", expect: onNetwork({ viewer: 403, editor: 200, owner: 200 }, 302) },
  { route: "networks/:networkId/ladder", method: "GET", path: "/networks/{network}/ladder", expect: view(302) },
  {
    route: "networks/:networkId/ladder",
    method: "POST",
    path: "/networks/{network}/ladder",
    body: { json: { intent: "save", request: {} } },
    expect: onNetwork({ viewer: 403, editor: 400, owner: 400 }, 302),
  },
  // A job is seen only by whoever started it (jobs.test.ts, ladder.test.ts); here nobody started one.
  { route: "networks/:networkId/jobs/:jobId", method: "GET", path: "/networks/{network}/jobs/no-such-job", expect: view(302, 404) },
  {
    route: "networks/:networkId/jobs/:jobId",
    method: "POST",
    path: "/networks/{network}/jobs/no-such-job",
    body: { form: { intent: "cancel" } },
    expect: view(302, 404),
  },
  { route: "networks/:networkId/report", method: "GET", path: "/networks/{network}/report", expect: view(302) },
  { route: "networks/:networkId/report", method: "GET", path: "/networks/{other}/report", expect: { ...view(302), editLink: 404 } },
  { route: "networks/:networkId/study", method: "GET", path: "/networks/{network}/study", expect: view(302) },
  { route: "networks/:networkId/study", method: "GET", path: "/networks/{other}/study?outages=on", expect: { ...view(302), editLink: 404 } },
  { route: "networks/:networkId/study/run", method: "GET", path: "/networks/{network}/study/run", expect: view(302) },
  { route: "networks/:networkId/study.csv", method: "GET", path: "/networks/{network}/study.csv?table=cases", expect: view(302) },
  { route: "networks/:networkId/cases", method: "GET", path: "/networks/{network}/cases", expect: view(302) },
  {
    route: "networks/:networkId/cases",
    method: "POST",
    path: "/networks/{network}/cases",
    // A case without a name: whoever may edit is let in and told what to fix; nothing is written.
    body: { form: { intent: "save", revision: "1", originalId: "", name: "" } },
    expect: onNetwork({ viewer: 403, editor: 400, owner: 400 }, 302),
  },
  { route: "networks/:networkId/share", method: "GET", path: "/networks/{network}/share", expect: onNetwork({ viewer: 403, editor: 403, owner: 200 }, 302) },
  {
    route: "networks/:networkId/share",
    method: "POST",
    path: "/networks/{network}/share",
    body: { form: { intent: "create", role: "viewer", expiresInDays: "2" } },
    expect: onNetwork({ viewer: 403, editor: 403, owner: 200 }, 302),
  },
  { route: "networks/:networkId/notes", method: "GET", path: "/networks/{network}/notes", expect: view(302) },
  {
    route: "networks/:networkId/notes",
    method: "POST",
    path: "/networks/{network}/notes",
    body: { form: { intent: "start", elementId: "l-fell", body: "Is 48 km the surveyed route length?" } },
    expect: view(302),
  },
  { route: "networks/:networkId/revisions", method: "GET", path: "/networks/{network}/revisions", expect: view(302) },
  {
    route: "networks/:networkId/revisions",
    method: "POST",
    path: "/networks/{network}/revisions",
    // Revision 1 is the current one: an editor is let in, then told so (409).
    body: { form: { intent: "restore", number: "1" } },
    expect: onNetwork({ viewer: 403, editor: 409, owner: 409 }, 302),
  },
  { route: "networks/:networkId/revisions/:number", method: "GET", path: "/networks/{network}/revisions/1", expect: view(302) },

  // Teams
  { route: "teams", method: "GET", path: "/teams", expect: signedIn(200, 302) },
  { route: "teams/new", method: "GET", path: "/teams/new", expect: signedIn(200, 302) },
  { route: "teams/new", method: "POST", path: "/teams/new", body: { form: { name: "" } }, expect: signedIn(400, 302) },
  { route: "teams/:teamId", method: "GET", path: "/teams/{team}", expect: onTeam({ viewer: 200, editor: 200, owner: 200 }, 302) },
  {
    route: "teams/:teamId",
    method: "POST",
    path: "/teams/{team}",
    body: { form: { intent: "change-role", userId: "1", role: "chief" } },
    expect: onTeam({ viewer: 403, editor: 403, owner: 400 }, 302),
  },
  {
    route: "teams/:teamId/invitations",
    method: "POST",
    path: "/teams/{team}/invitations",
    body: { form: { intent: "invite", email: "not an address", role: "viewer" } },
    expect: onTeam({ viewer: 403, editor: 403, owner: 400 }, 302),
  },
  { route: "teams/:teamId/library", method: "GET", path: "/teams/{team}/library", expect: onTeam({ viewer: 200, editor: 200, owner: 200 }, 302) },
  {
    route: "teams/:teamId/library",
    method: "POST",
    path: "/teams/{team}/library",
    body: { form: { intent: "delete-type", id: "987654" } },
    expect: onTeam({ viewer: 403, editor: 404, owner: 404 }, 302),
  },

  // The HTTP API
  { route: "api/solve", method: "POST", path: "/api/solve", body: solveBody(), expect: signedIn(200, 401) },
  { route: "api/networks", method: "GET", path: "/api/networks", expect: signedIn(200, 401) },
  {
    route: "api/networks",
    method: "POST",
    path: "/api/networks?team={team}",
    body: { json: demoDocument("Matrix created") },
    expect: onTeam({ viewer: 403, editor: 201, owner: 201 }, 401),
  },
  { route: "api/networks/:networkId", method: "GET", path: "/api/networks/{network}", expect: view(401) },
  { route: "api/networks/:networkId", method: "GET", path: "/api/networks/{other}", expect: { ...view(401), editLink: 404 } },
  {
    route: "api/networks/:networkId",
    method: "PUT",
    path: "/api/networks/{network}",
    // A stale revision: whoever may edit is let in and told 409; nothing is written.
    body: { json: { revision: 99, document: demoDocument("Matrix stale") } },
    expect: onNetwork({ viewer: 403, editor: 409, owner: 409 }, 401),
  },
  {
    route: "api/networks/:networkId",
    method: "PUT",
    path: "/api/networks/{other}",
    body: { json: { revision: 99, document: demoDocument("Matrix stale") } },
    expect: { ...onNetwork({ viewer: 403, editor: 409, owner: 409 }, 401), editLink: 404 },
  },
  {
    route: "api/networks/:networkId",
    method: "DELETE",
    path: "/api/networks/{network}",
    expect: onNetwork({ viewer: 403, editor: 403, owner: 200 }, 401),
    fresh: true,
  },
  { route: "api/networks/:networkId/solve", method: "POST", path: "/api/networks/{network}/solve", body: { json: {} }, expect: view(401) },
  { route: "api/networks/:networkId/export", method: "GET", path: "/api/networks/{network}/export", expect: view(401) },
  { route: "api/networks/:networkId/results.csv", method: "GET", path: "/api/networks/{network}/results.csv?table=branches", expect: view(401) },
  { route: "api/networks/:networkId/results.csv", method: "GET", path: "/api/networks/{other}/results.csv?table=buses", expect: { ...view(401), editLink: 404 } },
  {
    route: "api/networks/:networkId/ladder",
    method: "POST",
    path: "/api/networks/{network}/ladder",
    body: { json: {} },
    expect: view(401, 400),
  },
  { route: "api/networks/:networkId/study", method: "POST", path: "/api/networks/{network}/study", body: { json: {} }, expect: view(401) },
  { route: "api/networks/:networkId/study/jobs", method: "POST", path: "/api/networks/{network}/study/jobs", body: { json: {} }, expect: view(401, 202) },
  // A study job is seen and cancelled only by whoever started it (api/study.test.ts); here nobody started this one.
  { route: "api/networks/:networkId/study/jobs/:jobId", method: "GET", path: "/api/networks/{network}/study/jobs/no-such-job", expect: view(401, 404) },
  { route: "api/networks/:networkId/study/jobs/:jobId", method: "DELETE", path: "/api/networks/{network}/study/jobs/no-such-job", expect: view(401, 404) },
  { route: "api/networks/:networkId/shares", method: "GET", path: "/api/networks/{network}/shares", expect: onNetwork({ viewer: 403, editor: 403, owner: 200 }, 401) },
  {
    route: "api/networks/:networkId/shares",
    method: "POST",
    path: "/api/networks/{network}/shares",
    body: { json: { role: "editor", expiresInDays: 3 } },
    expect: onNetwork({ viewer: 403, editor: 403, owner: 201 }, 401),
  },
  {
    route: "api/shares/:shareId",
    method: "DELETE",
    path: "/api/shares/{share}",
    expect: onNetwork({ viewer: 403, editor: 403, owner: 200 }, 401),
    fresh: true,
  },
  { route: "api/networks/:networkId/revisions", method: "GET", path: "/api/networks/{network}/revisions", expect: view(401) },
  { route: "api/networks/:networkId/revisions/:number", method: "GET", path: "/api/networks/{network}/revisions/1", expect: view(401) },
];

// ---- the route table, flattened ----
interface RouteEntry {
  path: string;
  file: string;
}
function flatten(entries: readonly { path?: string; file: string; index?: boolean; children?: unknown[] }[], base = ""): RouteEntry[] {
  return entries.flatMap((e) => {
    const path = [base, e.path ?? ""].filter(Boolean).join("/");
    const own = { path, file: e.file };
    return [own, ...flatten((e.children ?? []) as never, path)];
  });
}
const ROUTES = flatten(routeConfig as never);

/** The route's params, read off the concrete path by its pattern. */
function paramsFor(pattern: string, pathname: string): Record<string, string> {
  const want = pattern.split("/").filter(Boolean);
  const got = pathname.split("/").filter(Boolean);
  const params: Record<string, string> = {};
  want.forEach((segment, i) => {
    if (segment.startsWith(":")) params[segment.slice(1)] = decodeURIComponent(got[i]);
  });
  return params;
}

function fill(template: string, people: People, world: World, actor: ActorName): string {
  return template
    .replaceAll("{network}", String(world.networkId))
    .replaceAll("{other}", String(world.otherNetworkId))
    .replaceAll("{team}", String(people.team.id))
    .replaceAll("{share}", String(world.liveShareId))
    .replaceAll("{token}", world.tokens[actor]);
}

async function requestFor(c: Case, people: People, world: World, actor: ActorName): Promise<Request> {
  const headers = new Headers();
  const user = people.users[actor];
  const cookie = c.ownSession && user ? await cookieFor(user) : people.cookies[actor];
  if (cookie) headers.set("Cookie", cookie);
  let body: BodyInit | undefined;
  if (c.body && "form" in c.body) {
    body = new URLSearchParams(Object.fromEntries(Object.entries(c.body.form).map(([k, v]) => [k, fill(v, people, world, actor)])));
  } else if (c.body && "json" in c.body) {
    headers.set("Content-Type", "application/json");
    body = JSON.stringify(c.body.json);
  } else if (c.body && "upload" in c.body) {
    const form = new FormData();
    for (const [k, v] of Object.entries(c.body.upload)) form.set(k, fill(v, people, world, actor));
    form.set("file", new File([readFileSync("tests/fixtures/tarn-head-calder-flats.json")], "tarn-head.json", { type: "application/json" }));
    body = form;
  }
  return new Request(`${ORIGIN}${fill(c.path, people, world, actor)}`, { method: c.method, headers, body });
}

async function run(c: Case, people: People, world: World, actor: ActorName): Promise<Outcome> {
  const route = ROUTES.find((r) => r.path === c.route);
  if (!route) throw new Error(`No route "${c.route}" in app/routes.ts`);
  const module = (await import(/* @vite-ignore */ new URL(`../../../../app/${route.file}`, import.meta.url).pathname)) as Record<string, unknown>;
  const request = await requestFor(c, people, world, actor);
  const fn = (c.method === "GET" ? module.loader : module.action) as ((args: unknown) => unknown) | undefined;
  if (!fn) {
    // A page with no loader has nothing on the server to guard: the router renders it for anyone.
    if (c.method === "GET" && module.default) return { status: 200, body: null, headers: new Headers() };
    throw new Error(`${route.file} has no ${c.method === "GET" ? "loader" : "action"}`);
  }
  return call(fn, request, paramsFor(c.route, new URL(request.url).pathname));
}

describe("authorisation matrix", () => {
  let people: People;
  let shared: World;

  beforeAll(async () => {
    people = await makePeople("Matrix");
    shared = await freshWorld(people, "Matrix shared");
  });

  it("has a case for every route in app/routes.ts", () => {
    const covered = new Set(CASES.map((c) => c.route));
    const missing = ROUTES.map((r) => r.path).filter((path) => !covered.has(path));
    expect(missing, "routes without a line in the authorisation matrix").toEqual([]);
  });

  it("answers every actor on every route with the expected status", async () => {
    const unexpected: string[] = [];
    let count = 0;
    for (const c of CASES) {
      for (const actor of ACTORS) {
        const world = c.fresh ? await freshWorld(people, `Matrix ${c.method} ${c.route} ${actor}`) : shared;
        const outcome = await run(c, people, world, actor);
        count++;
        if (outcome.status !== c.expect[actor]) {
          const detail = typeof outcome.body === "string" ? outcome.body.slice(0, 120) : JSON.stringify(outcome.body)?.slice(0, 120);
          unexpected.push(`${c.method} ${c.path} as ${actor}: ${outcome.status}, expected ${c.expect[actor]} (${detail})`);
        }
      }
    }
    await mailSettled();
    console.log(`matrix: ${count} cases, ${unexpected.length} unexpected`);
    expect(unexpected).toEqual([]);
  }, 120_000);
});
