import { defineConfig } from "vitest/config";

// One runner for every tier. Database tests create their own databases, so files may run in
// parallel; the pool is forks because the embedded server and pg-boss own native handles.
export default defineConfig({
  test: {
    include: ["tests/**/*.test.ts"],
    pool: "forks",
    testTimeout: 60_000,
    hookTimeout: 120_000,
    globalSetup: ["tests/support/global-setup.ts"],
  },
});
