import { defineConfig } from "vitest/config";

// Vitest runs without the React Router plugin: unit tests import modules directly.
export default defineConfig({
  test: {
    include: ["tests/unit/**/*.test.ts"],
    setupFiles: ["tests/unit/setup.ts"],
    environment: "node",
    pool: "forks",
    testTimeout: 30_000,
  },
});
