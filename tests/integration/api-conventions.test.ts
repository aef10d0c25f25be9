import { afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import { POST as signInRoute } from "../../app/api/auth/sign-in/route";
import { GET as kitchenGet, PATCH as kitchenPatch } from "../../app/api/kitchens/[id]/route";
import { GET as meRoute } from "../../app/api/me/route";
import { POST as inviteRoute } from "../../app/api/invitations/route";
import { db } from "../../db/client";
import { route } from "../../lib/http/route";
import { createCompany, TEST_PASSWORD, uniqueEmail, type TestCompany } from "../support/factory";
import { sessionCookieFor } from "../support/sessions";
import { baseUrl, call, type CallResult } from "../support/http";

let co: TestCompany;
let adminCookie: string;
beforeAll(async () => {
  co = await createCompany({ kitchens: 2 });
  adminCookie = await sessionCookieFor(co.users.admin.id);
});

// every error answer any test here sees, checked for the one error shape at the end of each test
const errors: CallResult[] = [];
afterEach(() => {
  for (const res of errors.splice(0)) {
    expect(Object.keys(res.body)).toEqual(["error"]);
    expect(res.body.error).toEqual({ code: expect.stringMatching(/^[A-Z_]+$/), message: expect.any(String), ...(res.body.error.details ? { details: expect.anything() } : {}) });
    expect(res.headers.get("content-type")).toContain("application/json");
  }
});
const expectError = (res: CallResult, status: number, code: string) => {
  errors.push(res);
  expect(res.status).toBe(status);
  expect(res.body.error.code).toBe(code);
  return res;
};

const signIn = (o: { body?: unknown; rawBody?: string; contentType?: string; origin?: string; headers?: Record<string, string> }) =>
  call(signInRoute, { method: "POST", path: "/api/auth/sign-in", ...o });
const invite = (o: { body?: unknown; rawBody?: string; headers?: Record<string, string> }) =>
  call(inviteRoute, { method: "POST", path: "/api/invitations", cookie: adminCookie, ...o });

describe("body parsing", () => {
  it("malformed JSON is 400 BAD_REQUEST", async () => {
    expectError(await signIn({ rawBody: '{"email": "a@b.test",' }), 400, "BAD_REQUEST");
  });

  it("a body that is not JSON is 415 UNSUPPORTED_MEDIA_TYPE", async () => {
    expectError(await signIn({ rawBody: "email=a@b.test&password=x", contentType: "application/x-www-form-urlencoded" }), 415, "UNSUPPORTED_MEDIA_TYPE");
    expectError(await signIn({ rawBody: '{"email":"a@b.test"}', contentType: "text/plain" }), 415, "UNSUPPORTED_MEDIA_TYPE");
  });

  it("accepts application/json with a charset", async () => {
    const res = await signIn({ body: { email: co.users.manager.email, password: TEST_PASSWORD }, contentType: "application/json; charset=utf-8" });
    expect(res.status).toBe(200);
  });

  it("a body over the limit is 413, whether or not its length is declared", async () => {
    const big = JSON.stringify({ email: uniqueEmail(), name: "x".repeat(300 * 1024), role: "buyer" }); // limit: 256 KiB
    // streamed: no Content-Length, the wrapper counts as it reads
    expectError(await invite({ rawBody: big }), 413, "PAYLOAD_TOO_LARGE");
    // declared: refused before reading
    expectError(await invite({ rawBody: "{}", headers: { "content-length": String(1024 * 1024) } }), 413, "PAYLOAD_TOO_LARGE");
    expect(await db()("invitations").where({ company_id: co.company.id }).first()).toBeUndefined();
  });

  it("422 VALIDATION names every bad field by its path", async () => {
    const res = expectError(await invite({ body: { email: "not-an-email", name: "", role: "chef", kitchenIds: ["K1"] } }), 422, "VALIDATION");
    expect(Object.keys(res.body.error.details.fields).sort()).toEqual(["email", "kitchenIds.0", "name", "role"]);
    for (const messages of Object.values(res.body.error.details.fields)) expect(messages).toEqual([expect.any(String)]);
  });

  it("an over-long Idempotency-Key is a 422 on that header", async () => {
    const res = await call(inviteRoute, { path: "/api/invitations", cookie: adminCookie, idempotencyKey: "k".repeat(201), body: { email: uniqueEmail(), name: "X", role: "buyer" } });
    expectError(res, 422, "VALIDATION");
    expect(res.body.error.details.fields).toHaveProperty("Idempotency-Key");
  });
});

describe("cross-site writes", () => {
  const good = () => ({ body: { email: co.users.buyer.email, password: TEST_PASSWORD } });

  it("a write with another site's Origin is 403", async () => {
    expectError(await signIn({ ...good(), origin: "https://evil.example" }), 403, "FORBIDDEN");
    // same host name on another port is another origin's host
    const other = new URL(baseUrl());
    other.port = String(Number(other.port || 80) + 1);
    expectError(await signIn({ ...good(), origin: other.origin }), 403, "FORBIDDEN");
    expectError(await signIn({ ...good(), origin: "null" }), 403, "FORBIDDEN");
  });

  it("a same-host Origin passes, and so does no Origin", async () => {
    expect((await signIn({ ...good(), origin: new URL(baseUrl()).origin })).status).toBe(200);
    expect((await signIn(good())).status).toBe(200);
  });

  it("behind a proxy, the forwarded host is the one compared", async () => {
    const headers = { "x-forwarded-host": "stock.example.com" };
    expect((await signIn({ ...good(), origin: "https://stock.example.com", headers })).status).toBe(200);
    expectError(await signIn({ ...good(), origin: new URL(baseUrl()).origin, headers }), 403, "FORBIDDEN");
  });

  it("reads are not origin-checked", async () => {
    const res = await call(meRoute, { path: "/api/me", cookie: adminCookie, origin: "https://evil.example" });
    expect(res.status).toBe(200);
  });
});

describe("authentication and errors", () => {
  it("no or an unknown session is 401", async () => {
    expectError(await call(meRoute, { path: "/api/me" }), 401, "UNAUTHENTICATED");
    expectError(await call(meRoute, { path: "/api/me", cookie: "hl_session=forged" }), 401, "UNAUTHENTICATED");
    expectError(await invite({ body: {}, headers: { cookie: "" } }), 401, "UNAUTHENTICATED");
  });

  it("authentication comes before parsing: an unauthenticated bad body is 401, not 400", async () => {
    const res = await call(inviteRoute, { path: "/api/invitations", rawBody: "{oops" });
    expectError(res, 401, "UNAUTHENTICATED");
  });

  it("an id that is not a uuid is 404", async () => {
    expectError(await call(kitchenGet, { path: "/api/kitchens/not-a-uuid", params: { id: "not-a-uuid" }, cookie: adminCookie }), 404, "NOT_FOUND");
  });

  it("an empty PATCH changes nothing and answers the record", async () => {
    const k = co.kitchens[1]!;
    const res = await call(kitchenPatch, { method: "PATCH", path: `/api/kitchens/${k.id}`, params: { id: k.id }, cookie: adminCookie, body: {} });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ id: k.id, code: k.code, name: k.name, archived: false });
  });

  it("a PATCH changes only the fields it names", async () => {
    const k = co.kitchens[0]!;
    await db()("kitchens").where({ id: k.id }).update({ address: "1 Brine Street", time_zone: "Europe/Vienna" });
    const res = await call(kitchenPatch, { method: "PATCH", path: `/api/kitchens/${k.id}`, params: { id: k.id }, cookie: adminCookie, body: { name: "Renamed" } });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ id: k.id, code: k.code, name: "Renamed", address: "1 Brine Street", timeZone: "Europe/Vienna" });
    expect(await db()("kitchens").where({ id: k.id }).first()).toMatchObject({ name: "Renamed", address: "1 Brine Street", time_zone: "Europe/Vienna" });
  });

  it("an unexpected error is a generic 500 that never leaks its message, and is logged", async () => {
    const logged = vi.spyOn(console, "error").mockImplementation(() => {});
    try {
      // the real wrapper around a handler that fails the way a bug would
      const broken = route({ auth: false }, async () => {
        throw new Error("relation secret_table does not exist at 10.0.0.7");
      });
      const res = expectError(await call(broken, { path: "/api/broken" }), 500, "INTERNAL");
      expect(JSON.stringify(res.body)).not.toMatch(/secret_table|10\.0\.0\.7/);
      expect(res.body.error.details).toBeUndefined();
      expect(logged).toHaveBeenCalledWith(expect.stringContaining("GET /api/broken"), expect.any(Error));
    } finally {
      logged.mockRestore();
    }
  });

  it("a thrown string is a 500 too", async () => {
    const logged = vi.spyOn(console, "error").mockImplementation(() => {});
    try {
      const broken = route({ auth: false }, async () => {
        throw "password=hunter2"; // eslint-disable-line no-throw-literal
      });
      const res = expectError(await call(broken, { path: "/api/broken" }), 500, "INTERNAL");
      expect(JSON.stringify(res.body)).not.toContain("hunter2");
    } finally {
      logged.mockRestore();
    }
  });
});
