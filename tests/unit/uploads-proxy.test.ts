// Upload routes must stay out of the Next proxy (proxy.ts, formerly middleware.ts): when the proxy
// matches a route, Next 16 buffers at most 10 MB of the request body and silently drops the rest
// (shared/stack.md), so a 20 MB price list would arrive cut off. This test reads the project's
// proxy, if there is one, and runs its matcher through Next's own matcher compiler.
import { existsSync } from "node:fs";
import { createRequire } from "node:module";
import path from "node:path";
import { describe, expect, it } from "vitest";

const require = createRequire(import.meta.url);
const { getMiddlewareMatchers } = require("next/dist/build/analysis/get-page-static-info") as {
  getMiddlewareMatchers: (matcher: unknown, config: object) => { regexp: string }[];
};

const ROOT = path.join(import.meta.dirname, "../..");
const PROXY_FILES = ["proxy.ts", "proxy.js", "middleware.ts", "middleware.js", "src/proxy.ts", "src/middleware.ts"];
/** Paths that take uploads now or will (price lists, delivery notes): none may reach the proxy. */
const UPLOAD_PATHS = [
  "/api/uploads", "/api/uploads/0b6f3c1e-0000-4000-8000-000000000001",
  "/api/deliveries", "/api/deliveries/0b6f3c1e-0000-4000-8000-000000000001/documents",
  "/api/suppliers/0b6f3c1e-0000-4000-8000-000000000001/price-lists",
  "/api/suppliers/0b6f3c1e-0000-4000-8000-000000000001/price-lists/0b6f3c1e-0000-4000-8000-000000000002",
];
/** The matcher DEVELOPERS.md gives for a future proxy. */
const DOCUMENTED_MATCHER = "/((?!api/uploads|api/deliveries|api/suppliers/[^/]+/price-lists|_next/static|_next/image|favicon.ico).*)";

function reaches(matcher: unknown, pathname: string): boolean {
  return getMiddlewareMatchers(matcher, {}).some((m) => new RegExp(m.regexp).test(pathname));
}

describe("the proxy and upload routes", () => {
  it("the documented matcher keeps every upload path out and still covers pages and other API routes", () => {
    for (const p of UPLOAD_PATHS) expect(reaches(DOCUMENTED_MATCHER, p), p).toBe(false);
    for (const p of ["/", "/stock", "/api/items", "/api/suppliers/0b6f3c1e-0000-4000-8000-000000000001"]) expect(reaches(DOCUMENTED_MATCHER, p), p).toBe(true);
  });

  it("the project's proxy, if any, has a matcher that leaves upload paths alone", async () => {
    const found = PROXY_FILES.filter((f) => existsSync(path.join(ROOT, f)));
    // today there is none: every request goes straight to its route
    for (const f of found) {
      const mod = (await import(path.join(ROOT, f))) as { config?: { matcher?: unknown } };
      expect(mod.config?.matcher, `${f} has no matcher, so it runs for every path, uploads included`).toBeDefined();
      for (const p of UPLOAD_PATHS) expect(reaches(mod.config!.matcher, p), `${f} matches ${p}`).toBe(false);
    }
    expect(found.length).toBeLessThanOrEqual(1); // Next takes one proxy
  });
});
