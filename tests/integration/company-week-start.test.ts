// The company's first day of the planning week (companies.week_start) through GET and PATCH
// /api/company: Monday unless the company says otherwise (the words), admins only may
// change it, a value that is not a day the setting knows is 422 naming weekStart.
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
  for (const role of ["admin", "manager", "buyer", "kitchen_lead", "accountant"] as const) cookie[role] = await sessionCookieFor(co.users[role].id);
  cookie.other = await sessionCookieFor(other.users.admin.id);
});

const read = (who: string) => call(companyGet, { path: "/api/company", cookie: cookie[who] });
const change = (who: string, body: Record<string, unknown>) =>
  call(companyPatch, { method: "PATCH", path: "/api/company", cookie: cookie[who], body: { name: co.company.name, timeZone: "Europe/London", currency: "EUR", ...body } });

describe("the first day of the planning week", () => {
  it("is Monday for a company that has not chosen, and everyone in the company reads it", async () => {
    for (const who of ["admin", "kitchen_lead", "accountant"]) {
      const r = await read(who);
      expect(r.status).toBe(200);
      expect(r.body).toMatchObject({ id: co.company.id, weekStart: "monday" });
    }
  });

  it("an admin may change it; a PATCH without it leaves it as it is; another company's stays Monday", async () => {
    const r = await change("admin", { weekStart: "sunday" });
    expect(r.status, JSON.stringify(r.body)).toBe(200);
    expect(r.body.weekStart).toBe("sunday");
    expect((await read("kitchen_lead")).body.weekStart).toBe("sunday");
    // the three required fields alone (clients written before the setting) keep it
    const kept = await change("admin", { currency: "GBP" });
    expect(kept.body).toMatchObject({ currency: "GBP", weekStart: "sunday" });
    expect((await call(companyGet, { path: "/api/company", cookie: cookie.other })).body.weekStart).toBe("monday");
    const sat = await change("admin", { weekStart: "saturday" });
    expect(sat.body.weekStart).toBe("saturday");
  });

  it("nobody but an admin may change it (403), and it is unchanged after", async () => {
    const before = (await read("admin")).body.weekStart;
    for (const who of ["manager", "buyer", "kitchen_lead", "accountant"]) {
      const r = await change(who, { weekStart: before === "monday" ? "sunday" : "monday" });
      expect(r.status, who).toBe(403);
      expect(r.body.error.code).toBe("FORBIDDEN");
    }
    expect((await read("admin")).body.weekStart).toBe(before);
  });

  it("a day the setting does not know is 422 naming weekStart, and nothing is saved", async () => {
    const before = (await read("admin")).body;
    for (const bad of ["friday", "Monday", "", 1, null]) {
      const r = await change("admin", { weekStart: bad, name: "Renamed on the way" });
      expect(r.status, String(bad)).toBe(422);
      expect(Object.keys(r.body.error.details.fields)).toEqual(["weekStart"]);
    }
    expect((await read("admin")).body).toEqual(before);
  });
});
