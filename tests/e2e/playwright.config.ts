import { defineConfig } from "@playwright/test";

// Browser stories against a production build, on the test services db/test.sh started.
// Debian's chromium; no browser downloads. One worker: the machine has 2 cores.
const port = Number(process.env.PORT ?? 3100);
const distDir = process.env.NEXT_DIST_DIR ?? ".next";

export default defineConfig({
  testDir: ".",
  testMatch: "**/*.spec.ts",
  outputDir: "../../test-results",
  fullyParallel: false,
  workers: 1,
  retries: 0,
  timeout: 60_000,
  reporter: [["list"]],
  use: {
    baseURL: `http://127.0.0.1:${port}`,
    viewport: { width: 1024, height: 768 },
    launchOptions: {
      executablePath: "/usr/bin/chromium",
      args: ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
    },
    trace: "off",
    screenshot: "only-on-failure",
  },
  webServer: {
    command: `node node_modules/next/dist/bin/next start -H 127.0.0.1 -p ${port}`,
    cwd: "../..",
    url: `http://127.0.0.1:${port}/sign-in`,
    reuseExistingServer: false,
    timeout: 60_000,
    env: { NEXT_DIST_DIR: distDir },
  },
});
