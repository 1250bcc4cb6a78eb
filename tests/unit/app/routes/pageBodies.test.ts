// Issue #13, finding 8: page actions given a body that is not a form (text/plain, JSON, none) or
// another method (DELETE) answered 500. Every page route with an action is called with each, as
// the owner of a network and team (the caller who gets furthest), and must answer 400, 405 or 415
// with a sentence. New page actions are covered as soon as they appear in app/routes.ts.
import { beforeAll, describe, expect, it } from "vitest";
import routeConfig from "#app/routes.ts";
import { call, ORIGIN } from "./harness.ts";
import { freshWorld, makePeople, type People, type World } from "./reviewWorld.ts";

interface RouteEntry {
  path: string;
  file: string;
}
function flatten(entries: readonly { path?: string; file: string; children?: unknown[] }[], base = ""): RouteEntry[] {
  return entries.flatMap((e) => {
    const path = [base, e.path ?? ""].filter(Boolean).join("/");
    return [{ path, file: e.file }, ...flatten((e.children ?? []) as never, path)];
  });
}

const PAGE_ROUTES = flatten(routeConfig as never).filter((r) => !r.path.startsWith("api/"));

const BAD_BODIES: { what: string; method: string; headers: Record<string, string>; body?: string }[] = [
  { what: "text/plain", method: "POST", headers: { "Content-Type": "text/plain" }, body: "intent=delete" },
  { what: "JSON", method: "POST", headers: { "Content-Type": "application/json" }, body: '{"intent":"delete"' },
  { what: "no body", method: "POST", headers: {} },
  { what: "DELETE", method: "DELETE", headers: {} },
];

function sentenceOf(body: unknown): string {
  if (typeof body === "string") return body;
  const record = (body ?? {}) as Record<string, unknown>;
  const fieldErrors = record.fieldErrors as Record<string, string> | undefined;
  return String(record.error ?? record.message ?? record.formError ?? Object.values(fieldErrors ?? {})[0] ?? "");
}

let people: People;
let world: World;
beforeAll(async () => {
  people = await makePeople("Bodies");
  world = await freshWorld(people, "Bodies");
});

describe("page actions given a body they cannot read", () => {
  it("answer 400, 405 or 415 with a sentence, never 500", { timeout: 180_000 }, async () => {
    const failures: string[] = [];
    let checked = 0;
    for (const route of PAGE_ROUTES) {
      const module = (await import(/* @vite-ignore */ new URL(`../../../../app/${route.file}`, import.meta.url).pathname)) as { action?: (args: unknown) => unknown };
      if (!module.action) continue;
      const params: Record<string, string> = { networkId: String(world.networkId), teamId: String(people.team.id), token: world.tokens.viewLink, number: "1" };
      const path = `/${route.path}`.replace(/:(\w+)/g, (_, name: string) => params[name]);
      for (const bad of BAD_BODIES) {
        checked++;
        const request = new Request(`${ORIGIN}${path}`, { method: bad.method, headers: { ...bad.headers, Cookie: people.cookies.owner! }, body: bad.body });
        let status: number;
        let sentence = "";
        try {
          const outcome = await call(module.action, request, params);
          status = outcome.status;
          sentence = sentenceOf(outcome.body);
        } catch (error) {
          status = 500;
          sentence = String(error);
        }
        if (![400, 405, 415].includes(status) || sentence.length < 10) failures.push(`${bad.what} to ${route.path}: ${status} "${sentence}"`);
      }
    }
    expect(checked).toBeGreaterThan(40);
    expect(failures).toEqual([]);
  });
});
