// POST /api/gs1/parse through its route handler, against the real PostgreSQL (sessions, roles).
// Vectors: "01123456789012311012345" and "31001234561012345" (trade-facts §6, GS1 barcode engine
// test vectors); "]C1011231231231233310ABC123<GS>99TESTING" (GS1 Barcode Syntax Engine,
// scandata.c test_scandata_processScanData); 12345678901234 has a wrong check digit (trade-facts §6);
// the rest constructed. Century window: GS1 General Specifications 7.12.
import { beforeAll, describe, expect, it } from "vitest";
import { PATCH as companyPatch } from "../../app/api/company/route";
import { POST as gs1Parse } from "../../app/api/gs1/parse/route";
import { parseLabel } from "../../lib/data/gs1-labels";
import { createCompany, type TestCompany } from "../support/factory";
import { call } from "../support/http";
import { currentUser, sessionCookieFor } from "../support/sessions";

let a: TestCompany;
const cookie: Record<string, string> = {};
const scan = (body: unknown, who = "buyer", extra: { origin?: string } = {}) => call(gs1Parse, { path: "/api/gs1/parse", body, cookie: cookie[who], ...extra });

beforeAll(async () => {
  a = await createCompany();
  for (const role of ["admin", "manager", "buyer", "kitchen_lead", "accountant"] as const) cookie[role] = await sessionCookieFor(a.users[role].id);
});

describe("POST /api/gs1/parse", () => {
  it("needs a session", async () => {
    const res = await call(gs1Parse, { path: "/api/gs1/parse", body: { data: "01123456789012311012345" } });
    expect(res.status).toBe(401);
  });

  it("answers those who buy or receive (purchasing.read or stock.receive), not a kitchen lead", async () => {
    for (const who of ["admin", "manager", "buyer", "accountant"]) expect((await scan({ data: "01123456789012311012345" }, who)).status, who).toBe(200);
    const res = await scan({ data: "01123456789012311012345" }, "kitchen_lead");
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe("FORBIDDEN");
  });

  it("reads the trade-facts vectors, every field present and null when absent", async () => {
    const res = await scan({ data: "01123456789012311012345" });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({
      sscc: null, gtin: "12345678901231", containedGtin: null, lot: "12345", productionDate: null, packagingDate: null, bestBefore: null,
      sellBy: null, expiry: null, netWeightKg: null, netWeightLb: null, count: null, tradeItemCount: null, other: {},
    });
    expect((await scan({ data: "31001234561012345" })).body).toMatchObject({ netWeightKg: "123456", lot: "12345" });
  });

  it("takes GS in JSON and a symbology identifier", async () => {
    const res = await scan({ data: "]C1011231231231233310ABC123\u001d99TESTING" });
    expect(res.body).toMatchObject({ gtin: "12312312312333", lot: "ABC123", other: { "99": "TESTING" } });
  });

  it("takes a stand-in separator and the bracketed form", async () => {
    const piped = await scan({ data: "0112345678901231|10L2611-07|3102001250|17270300", separator: "|" });
    expect(piped.status).toBe(200);
    expect(piped.body).toMatchObject({ gtin: "12345678901231", lot: "L2611-07", netWeightKg: "12.50", expiry: "2027-03-31" });
    const bracketed = await scan({ data: "(01)12345678901231(10)L2611-07(3102)001250(17)270300" });
    expect(bracketed.body).toEqual(piped.body);
  });

  it("uses the company's stand-in when the request sends none; the request's own wins", async () => {
    const b = await createCompany();
    const [admin, buyer] = await Promise.all([sessionCookieFor(b.users.admin.id), sessionCookieFor(b.users.buyer.id)]);
    const bScan = (body: unknown) => call(gs1Parse, { path: "/api/gs1/parse", body, cookie: buyer });
    // without a stand-in, "|" is not character set 82: reported, not swallowed
    expect((await bScan({ data: "0112345678901231|10L2611-07" })).status).toBe(422);
    const bad = await call(companyPatch, { method: "PATCH", path: "/api/company", cookie: admin, body: { name: b.company.name, timeZone: "Europe/London", currency: "EUR", scanSeparator: "X" } });
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.body.error.details.fields)).toEqual(["scanSeparator"]);
    const set = await call(companyPatch, { method: "PATCH", path: "/api/company", cookie: admin, body: { name: b.company.name, timeZone: "Europe/London", currency: "EUR", scanSeparator: "|" } });
    expect(set.status, JSON.stringify(set.body)).toBe(200);
    const piped = await bScan({ data: "0112345678901231|10L2611-07|17270300" });
    expect(piped.status, JSON.stringify(piped.body)).toBe(200);
    expect(piped.body).toMatchObject({ gtin: "12345678901231", lot: "L2611-07", expiry: "2027-03-31" });
    expect((await bScan({ data: "0112345678901231~10L2611-07", separator: "~" })).body.lot).toBe("L2611-07");
    // company a has none: the same scan is still refused there
    expect((await scan({ data: "0112345678901231|10L2611-07|17270300" })).status).toBe(422);
  });

  it("answers 422 naming the AI and what is wrong", async () => {
    const res = await scan({ data: "0112345678901234" });
    expect(res.status).toBe(422);
    expect(res.body.error).toEqual({
      code: "VALIDATION",
      message: "(01) GTIN: the check digit is wrong: 12345678901234 should end in 1.",
      details: {
        fields: { data: ["(01) GTIN: the check digit is wrong: 12345678901234 should end in 1."] },
        gs1: { reason: "BAD_CHECK_DIGIT", ai: "01", position: 0 },
      },
    });
    const together = await scan({ data: "(01)12345678901231(37)12" });
    expect(together.status).toBe(422);
    expect(together.body.error.details.gs1).toMatchObject({ reason: "NOT_ALLOWED_TOGETHER", ai: "37" });
    const blank = await scan({ data: "  " });
    expect(blank.body.error.details.gs1.reason).toBe("EMPTY");
  });

  it("refuses a bad body with the usual field errors", async () => {
    const missing = await scan({});
    expect(missing.status).toBe(422);
    expect(Object.keys(missing.body.error.details.fields)).toEqual(["data"]);
    const badSeparator = await scan({ data: "0112345678901231", separator: "X" });
    expect(badSeparator.status).toBe(422);
    expect(Object.keys(badSeparator.body.error.details.fields)).toEqual(["separator"]);
    const tooLong = await scan({ data: "9".repeat(2501) });
    expect(Object.keys(tooLong.body.error.details.fields)).toEqual(["data"]);
  });

  it("refuses a cross-site request", async () => {
    const res = await scan({ data: "01123456789012311012345" }, "buyer", { origin: "https://elsewhere.example" });
    expect(res.status).toBe(403);
  });
});

describe("the century of two-digit years follows the user's today", () => {
  it("(17)770101 at 2026-12-31T12:00Z is 2077 where it is already 2027, 1977 where it is still 2026", async () => {
    const [east, west] = await Promise.all([createCompany({ timeZone: "Pacific/Kiritimati" }), createCompany({ timeZone: "Pacific/Pago_Pago" })]);
    const now = new Date("2026-12-31T12:00:00Z"); // Kiritimati UTC+14: 1 Jan 2027; Pago Pago UTC-11: 31 Dec 2026
    const input = { data: "]C10112345678901231" + "17770101" };
    expect((await parseLabel(await currentUser(east.users.buyer.id), input, now)).expiry).toBe("2077-01-01"); // +50 from 2027
    expect((await parseLabel(await currentUser(west.users.buyer.id), input, now)).expiry).toBe("1977-01-01"); // +51 from 2026 -> -49
  });
});
