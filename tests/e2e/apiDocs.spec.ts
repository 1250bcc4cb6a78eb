// Keeps /docs/api true: it documents exactly the endpoints the router has under /api, and every
// curl line the page shows is run, in the page's order, with the real curl against the built app.
import { execFileSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { expect, test } from "@playwright/test";
import { API_ENDPOINTS, curlCommand } from "../../app/lib/apiDocs.ts";
import { signIn } from "./accounts.ts";

const repository = join(import.meta.dirname, "..", "..");

/** The API routes in app/routes.ts, as "/api/…" patterns. */
function routedApiPaths(): string[] {
  const table = readFileSync(join(repository, "app", "routes.ts"), "utf8");
  const block = table.slice(table.indexOf('prefix("api"'));
  return [...block.slice(0, block.indexOf("]),")).matchAll(/route\("([^"]+)"/g)].map((m) => `/api/${m[1]}`);
}

test("every API route is documented, and nothing is documented that the router lacks", () => {
  const documented = [...new Set(API_ENDPOINTS.map((e) => e.route))].sort();
  expect(documented).toEqual([...new Set(routedApiPaths())].sort());
});

test("the page shows every example's curl line", async ({ page }) => {
  await page.goto("/docs/api");
  for (const endpoint of API_ENDPOINTS) await expect(page.getByText(curlCommand(endpoint), { exact: true })).toBeVisible();
});

test("every curl example runs against the server and answers 2xx", async ({ page, baseURL }) => {
  await signIn(page, "owner");
  await page.goto("/account");
  await page.getByLabel("Token name").fill("docs examples");
  await page.getByLabel("Scope").selectOption("write");
  await page.getByRole("button", { name: "Create token" }).click();
  const token = (await page.getByLabel("The new token").textContent())!.trim();
  // The examples change what they touch (a save, a share link), so they get a network of their own.
  const networks = (await (await page.request.get("/api/networks")).json()).networks as { id: number; name: string; team: { id: number } }[];
  const teamId = networks.find((n) => n.name.startsWith("Tarn Head"))!.team.id;
  const fixture = JSON.parse(readFileSync(join(repository, "tests", "fixtures", "tarn-head-calder-flats.json"), "utf8"));
  const own = await page.request.post(`/api/networks?team=${teamId}`, { data: { ...fixture, name: "API examples (fictional)" } });
  expect(own.status()).toBe(201);
  const networkId = (await own.json()).id as number;

  const folder = mkdtempSync(join(tmpdir(), "kilostep-docs-"));
  const variables: Record<string, string> = {
    KILOSTEP_URL: baseURL!,
    KILOSTEP_TOKEN: token,
    TEAM_ID: String(teamId),
    NETWORK_ID: String(networkId),
    SECTION_BUS: "b-tarn-66",
  };
  writeFileSync(join(folder, "network.json"), readFileSync(join(repository, "tests", "fixtures", "tarn-head-calder-flats.json")));
  const results: string[] = [];
  try {
    for (const endpoint of API_ENDPOINTS) {
      if (endpoint.example.body === "@put.json") {
        // As the page says: the revision just read, with the document.
        const current = JSON.parse(readFileSync(join(folder, "current.json"), "utf8"));
        writeFileSync(join(folder, "put.json"), JSON.stringify({ revision: current.revision, document: current.document }));
      }
      const command = curlCommand(endpoint);
      const output = execFileSync("bash", ["-c", `${command} -w '\\n%{http_code}'`], {
        cwd: folder,
        env: { ...process.env, ...variables },
        encoding: "utf8",
        timeout: 60_000,
      });
      const status = Number(output.slice(output.lastIndexOf("\n") + 1));
      const body = output.slice(0, output.lastIndexOf("\n"));
      results.push(`${status} ${endpoint.method} ${endpoint.route}`);
      expect(status, `${command}\n${body.slice(0, 500)}`).toBeGreaterThanOrEqual(200);
      expect(status, `${command}\n${body.slice(0, 500)}`).toBeLessThan(300);
      for (const [name, field] of Object.entries(endpoint.example.captures ?? {})) variables[name] = String(JSON.parse(body)[field]);
    }
  } finally {
    rmSync(folder, { recursive: true, force: true });
    console.log(`API examples run with curl:\n  ${results.join("\n  ")}`);
  }
});
