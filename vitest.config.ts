import { defineConfig } from "vitest/config";

// Vitest runs without the React Router plugin: unit tests import modules directly.
export default defineConfig({
  test: {
    include: ["tests/unit/**/*.test.ts"],
    setupFiles: ["tests/unit/setup.ts"],
    environment: "node",
    pool: "forks",
    // Vitest's default leaves one core to itself (one worker on a two-core machine); the files are
    // independent (own database each), so use every core.
    maxWorkers: "100%",
    testTimeout: 30_000,
  },
});
