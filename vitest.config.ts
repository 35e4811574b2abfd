import { fileURLToPath } from "node:url";
import { defineConfig } from "vitest/config";

// One runner for every tier. Database tests create their own databases, so files may run in
// parallel; the pool is forks because the embedded server and pg-boss own native handles.
export default defineConfig({
  // Web code imports its own modules as `@/lib/...` (Next's alias); API tests import route modules.
  resolve: { alias: { "@": fileURLToPath(new URL("./web", import.meta.url)) } },
  test: {
    include: ["tests/**/*.test.ts"],
    pool: "forks",
    testTimeout: 60_000,
    hookTimeout: 120_000,
    globalSetup: ["tests/support/global-setup.ts"],
  },
});
