import { beforeAll, describe, expect, it, vi } from "vitest";

// A small solve budget, so that the rate limit shows within a few requests; read before any import.
vi.hoisted(() => {
  process.env.SOLVE_RATE_LIMIT_PER_MINUTE = "5";
});

import { getDb } from "#app/lib/db.server.ts";
import { hashApiToken } from "#app/lib/apiTokenText.server.ts";
import { loader as getNetwork, action as changeNetwork } from "#app/routes/api/network.ts";
import { loader as listNetworks } from "#app/routes/api/networks.ts";
import { action as solvePosted } from "#app/routes/api/solve.ts";
import { action as startStudyJob } from "#app/routes/api/network-study-jobs.ts";
import { action as studyJobAction, loader as studyJob } from "#app/routes/api/network-study-job.ts";
import { jobSettled } from "#app/lib/compute/jobs.server.ts";
import { action as tokenAction } from "#app/routes/auth/api-tokens.ts";
import { loader as accountPage } from "#app/routes/auth/account.tsx";
import { listApiTokens } from "#db/apiTokens.ts";
import { call, formRequest, getRequest, jsonRequest } from "../harness.ts";
import { fixtureText, makeTeam, networkFromFixture, type TeamFixture, type Who } from "../teamFixtures.ts";

let team: TeamFixture;
let networkId: number;

beforeAll(async () => {
  team = await makeTeam("Token");
  networkId = await networkFromFixture(team);
});

async function createToken(who: Who, scope: "read" | "write", name = `${who} ${scope}`): Promise<string> {
  const outcome = await call(tokenAction, formRequest("/account/tokens", { intent: "create", name, scope }, { cookie: team.cookies[who] }));
  expect(outcome.status).toBe(200);
  expect(outcome.headers.get("Cache-Control")).toBe("no-store");
  return outcome.body.token as string;
}

function withToken(method: string, path: string, token: string, body?: unknown) {
  const request = jsonRequest(method, path, { body });
  request.headers.set("Authorization", `Bearer ${token}`);
  return request;
}

async function put(token: string) {
  const current = await call(getNetwork, withToken("GET", `/api/networks/${networkId}`, token), { networkId: String(networkId) });
  return call(changeNetwork, withToken("PUT", `/api/networks/${networkId}`, token, { revision: current.body.revision, document: current.body.document }), {
    networkId: String(networkId),
  });
}

describe("API tokens", () => {
  it("are shown once and stored only as their SHA-256", async () => {
    const token = await createToken("editor", "read", "nightly study");
    const stored = await (await getDb()).selectFrom("api_tokens").selectAll().where("name", "=", "nightly study").executeTakeFirstOrThrow();
    expect(stored.token_hash).toBe(hashApiToken(token));
    expect(JSON.stringify(stored)).not.toContain(token);
    const page = await call(accountPage, getRequest("/account", team.cookies.editor));
    expect(JSON.stringify(page.body)).not.toContain(token);
    expect(page.body.tokens).toEqual([expect.objectContaining({ name: "nightly study", scope: "read", lastUsedAt: null, revokedAt: null })]);
  });

  it("refuse a token without a name", async () => {
    const outcome = await call(tokenAction, formRequest("/account/tokens", { intent: "create", name: " ", scope: "read" }, { cookie: team.cookies.editor }));
    expect(outcome.status).toBe(400);
    expect(outcome.body.fieldErrors.name).toMatch(/Give the token a name/);
  });

  it("act with the owner's roles: a bearer request lists the owner's networks and records the use", async () => {
    const token = await createToken("viewer", "read");
    const outcome = await call(listNetworks, withToken("GET", "/api/networks", token));
    expect(outcome.status).toBe(200);
    expect(outcome.body.networks.map((n: { id: number }) => n.id)).toContain(networkId);
    const listed = await listApiTokens(await getDb(), team.userIds.viewer);
    expect(listed.find((t) => t.name === "viewer read")?.lastUsedAt).not.toBeNull();
  });

  it("are capped by their scope: a read token may read and solve but not save", async () => {
    const token = await createToken("editor", "read", "editor reader");
    const refused = await put(token);
    expect(refused.status).toBe(403);
    expect(refused.body.error).toMatch(/scope is read; PUT \/api\/networks\/\d+ changes data/);
    const solved = await call(solvePosted, withToken("POST", "/api/solve", token, JSON.parse(fixtureText("hollin-moor-solar.json"))));
    expect(solved.status).toBe(200);
  });

  it("let a read token start, follow and cancel a study job, and no other DELETE", async () => {
    const token = await createToken("viewer", "read", "study jobs");
    const params = { networkId: String(networkId) };
    const started = await call(startStudyJob, withToken("POST", `/api/networks/${networkId}/study/jobs`, token, {}), params);
    expect(started.status).toBe(202);
    const jobId: string = started.body.id;
    await jobSettled(jobId);
    const done = await call(studyJob, withToken("GET", started.body.url, token), { ...params, jobId });
    expect(done.body.state).toBe("done");
    const cancelled = await call(studyJobAction, withToken("DELETE", started.body.url, token), { ...params, jobId });
    expect([cancelled.status, cancelled.body.state]).toEqual([200, "done"]);
    const deleteNetwork = await call(changeNetwork, withToken("DELETE", `/api/networks/${networkId}`, token), params);
    expect(deleteNetwork.status).toBe(403);
    expect(deleteNetwork.body.error).toMatch(/scope is read; DELETE/);
  });

  it("never exceed the role: a viewer's write token still cannot save (403), an editor's can", async () => {
    expect((await put(await createToken("viewer", "write"))).status).toBe(403);
    expect((await put(await createToken("editor", "write"))).status).toBe(200);
  });

  it("stop working the moment they are revoked (401), and a malformed header is 401 too", async () => {
    const token = await createToken("owner", "write", "to revoke");
    expect((await call(listNetworks, withToken("GET", "/api/networks", token))).status).toBe(200);
    const id = (await listApiTokens(await getDb(), team.userIds.owner)).find((t) => t.name === "to revoke")!.id;
    const revoked = await call(tokenAction, formRequest("/account/tokens", { intent: "revoke", tokenId: String(id), tokenName: "to revoke" }, { cookie: team.cookies.owner }));
    expect(revoked.body).toEqual({ intent: "revoke", ok: true, message: 'Revoked "to revoke": it no longer works.' });
    const after = await call(listNetworks, withToken("GET", "/api/networks", token));
    expect(after.status).toBe(401);
    expect(after.body.error).toMatch(/revoked/);
    const request = getRequest("/api/networks");
    request.headers.set("Authorization", "Bearer not-a-token");
    expect((await call(listNetworks, request)).status).toBe(401);
  });

  it("cannot revoke someone else's token", async () => {
    await createToken("editor", "read", "not yours");
    const id = (await listApiTokens(await getDb(), team.userIds.editor)).find((t) => t.name === "not yours")!.id;
    const outcome = await call(tokenAction, formRequest("/account/tokens", { intent: "revoke", tokenId: String(id) }, { cookie: team.cookies.viewer }));
    expect(outcome.status).toBe(404);
  });
});

describe("solve budget", () => {
  it("answers 429 with Retry-After once an account has solved its limit in a minute", async () => {
    const token = await createToken("outsider", "read", "busy script");
    const document = JSON.parse(fixtureText("hollin-moor-solar.json"));
    const statuses: number[] = [];
    let last: Awaited<ReturnType<typeof call>> | undefined;
    for (let i = 0; i < 6; i++) {
      last = await call(solvePosted, withToken("POST", "/api/solve", token, document));
      statuses.push(last.status);
    }
    expect(statuses).toEqual([200, 200, 200, 200, 200, 429]);
    expect(Number(last!.headers.get("Retry-After"))).toBeGreaterThan(0);
    expect(last!.body.error).toMatch(/at most 5 units a minute/);
  });
});
