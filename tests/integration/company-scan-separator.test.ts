// The company's stand-in for GS on case labels (companies.scan_separator) through GET and PATCH
// /api/company: none until an admin sets one, the rule of POST /api/gs1/parse's `separator`
// (1-8 characters, one of them outside GS1 character set 82: GS1 General Specifications 7.11,
// figure 7.11-1), 422 naming scanSeparator otherwise, null clears it.
import { beforeAll, describe, expect, it } from "vitest";
import { GET as companyGet, PATCH as companyPatch } from "../../app/api/company/route";
import { createCompany, type TestCompany } from "../support/factory";
import { call } from "../support/http";
import { sessionCookieFor } from "../support/sessions";

let co: TestCompany;
let other: TestCompany;
const cookie: Record<string, string> = {};
beforeAll(async () => {
  [co, other] = await Promise.all([createCompany({ kitchens: 1 }), createCompany({ kitchens: 1 })]);
  for (const role of ["admin", "manager", "buyer"] as const) cookie[role] = await sessionCookieFor(co.users[role].id);
  cookie.other = await sessionCookieFor(other.users.admin.id);
});

const read = (who: string) => call(companyGet, { path: "/api/company", cookie: cookie[who] });
const change = (who: string, body: Record<string, unknown>) =>
  call(companyPatch, { method: "PATCH", path: "/api/company", cookie: cookie[who], body: { name: co.company.name, timeZone: "Europe/London", currency: "EUR", ...body } });

describe("the scanners' stand-in for GS", () => {
  it("is null until set; an admin sets it, a PATCH without it keeps it, null clears it; another company's stays null", async () => {
    expect((await read("buyer")).body.scanSeparator).toBeNull();
    const set = await change("admin", { scanSeparator: "|" });
    expect(set.status, JSON.stringify(set.body)).toBe(200);
    expect(set.body.scanSeparator).toBe("|");
    expect((await read("buyer")).body.scanSeparator).toBe("|");
    expect((await change("admin", { currency: "EUR" })).body.scanSeparator).toBe("|");
    expect((await call(companyGet, { path: "/api/company", cookie: cookie.other })).body.scanSeparator).toBeNull();
    expect((await change("admin", { scanSeparator: "~~" })).body.scanSeparator).toBe("~~");
    expect((await change("admin", { scanSeparator: null })).body.scanSeparator).toBeNull();
  });

  it("only an admin may change it (403)", async () => {
    for (const who of ["manager", "buyer"]) expect((await change(who, { scanSeparator: "#" })).status, who).toBe(403);
    expect((await read("admin")).body.scanSeparator).toBeNull();
  });

  it("a stand-in that breaks the rule is 422 naming scanSeparator, nothing saved", async () => {
    // "X", "A1" and "-" are all in character set 82 (would be read as data); "" is too short, 9 characters too long
    for (const bad of ["", "X", "A1", "-", "|||||||||", 7]) {
      const r = await change("admin", { scanSeparator: bad, name: "Renamed on the way" });
      expect(r.status, String(bad)).toBe(422);
      expect(Object.keys(r.body.error.details.fields)).toEqual(["scanSeparator"]);
    }
    expect((await read("admin")).body).toMatchObject({ name: co.company.name, scanSeparator: null });
  });
});
