import { fileURLToPath } from "node:url";
import { defineConfig } from "vitest/config";

// Unit and integration suites. Services (PostgreSQL, Redis, mail catcher, worker) are started by
// db/test.sh, which sets DATABASE_URL, REDIS_URL and MAIL_DIR; tests/setup.ts refuses to run without them.
export default defineConfig({
  resolve: {
    alias: {
      "@": fileURLToPath(new URL("./", import.meta.url)),
      // outside Next's server build the guard module would throw; the real guard runs in `next build`
      "server-only": fileURLToPath(new URL("./tests/support/empty-module.ts", import.meta.url)),
    },
  },
  test: {
    environment: "node",
    include: ["tests/unit/**/*.test.ts", "tests/integration/**/*.test.ts"],
    setupFiles: ["tests/support/setup.ts"],
    testTimeout: 20_000,
    hookTimeout: 30_000,
    pool: "forks",
  },
});
