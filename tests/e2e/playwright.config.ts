import { defineConfig } from "@playwright/test";

// Debian's chromium, never a downloaded browser; the built app on a throwaway database (serve.ts).
const port = Number(process.env.E2E_PORT ?? 3111);
const baseURL = `http://localhost:${port}`;

export default defineConfig({
  testDir: ".",
  outputDir: "../../test-results",
  fullyParallel: false,
  workers: 1,
  retries: 0,
  forbidOnly: true,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  reporter: [["list"]],
  use: {
    baseURL,
    browserName: "chromium",
    screenshot: "on",
    trace: "retain-on-failure",
    launchOptions: {
      executablePath: "/usr/bin/chromium",
      args: [
        "--no-sandbox",
        "--disable-gpu",
        "--disable-background-networking",
        "--disable-component-update",
        "--disable-sync",
        "--no-first-run",
      ],
    },
  },
  webServer: {
    command: "npx tsx tests/e2e/serve.ts",
    cwd: "../..",
    url: `${baseURL}/sign-in`,
    env: { PORT: String(port) },
    reuseExistingServer: false,
    timeout: 120_000,
    gracefulShutdown: { signal: "SIGTERM", timeout: 5_000 },
    stdout: "ignore",
    stderr: "pipe",
  },
});
