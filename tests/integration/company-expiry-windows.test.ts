// The expiry scan's warning windows as a company setting (companies.expiry_windows) through GET and
// PATCH /api/company, and the scan following them. The defaults (cure 60/30/7, casing 30/7, spice
// 90/30 days) are the product's planning defaults from issue 6, not trade figures.
import { addDays, formatISO } from "date-fns";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as companyGet, PATCH as companyPatch } from "../../app/api/company/route";
import { db } from "../../db/client";
import { runExpiryScan } from "../../jobs/definitions/expiry-scan";
import { postMovement } from "../../lib/data/ledger";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { call } from "../support/http";
import { currentUser, sessionCookieFor } from "../support/sessions";
import { createItem } from "../support/stock";

let co: TestCompany;
const cookie: Record<string, string> = {};
beforeAll(async () => {
  co = await createCompany({ kitchens: 1 });
  for (const role of ["admin", "manager"] as const) cookie[role] = await sessionCookieFor(co.users[role].id);
});

const read = (who: string) => call(companyGet, { path: "/api/company", cookie: cookie[who] });
const change = (who: string, body: Record<string, unknown>) =>
  call(companyPatch, { method: "PATCH", path: "/api/company", cookie: cookie[who], body: { name: co.company.name, timeZone: "Europe/London", currency: "EUR", ...body } });

describe("the expiry warning windows", () => {
  it("start at the defaults; an admin replaces one category's list, the others stay; the list is kept largest first", async () => {
    expect((await read("manager")).body.expiryWindows).toEqual({ cure: [60, 30, 7], casing: [30, 7], spice: [90, 30], ingredient: [] });
    const r = await change("admin", { expiryWindows: { cure: [14, 45], ingredient: [10] } });
    expect(r.status, JSON.stringify(r.body)).toBe(200);
    expect(r.body.expiryWindows).toEqual({ cure: [45, 14], casing: [30, 7], spice: [90, 30], ingredient: [10] });
    expect((await change("admin", { currency: "EUR" })).body.expiryWindows.cure).toEqual([45, 14]); // left out: unchanged
    expect((await change("admin", { expiryWindows: { spice: [] } })).body.expiryWindows.spice).toEqual([]);
  });

  it("refuses bad lists with 422 naming expiryWindows, nothing saved; only admins (403)", async () => {
    for (const bad of [{ cure: [0] }, { cure: [7, 7] }, { cure: [1.5] }, { cure: [1, 2, 3, 4, 5, 6] }, { cure: "60,30" }, { casing: [4000] }]) {
      const res = await change("admin", { expiryWindows: bad });
      expect(res.status, JSON.stringify(bad)).toBe(422);
      expect(Object.keys(res.body.error.details.fields).every((k) => k.startsWith("expiryWindows"))).toBe(true);
    }
    expect((await change("manager", { expiryWindows: { cure: [5] } })).status).toBe(403);
    expect((await read("admin")).body.expiryWindows.cure).toEqual([45, 14]);
  });

  it("the scan follows the saved windows", async () => {
    const item = await createItem(co.company.id, { category: "cure", trackLots: true, trackDates: true });
    await postMovement(await currentUser(co.users.manager.id), {
      kind: "receipt", kitchen: co.kitchens[0]!.code, item: item.sku, quantity: "100", unit: "g",
      lot: { code: `W-${tag()}`, date: formatISO(addDays(new Date(), 40), { representation: "date" }), dateKind: "use_by", unitCost: "0.01" },
    } as never);
    await runExpiryScan(db(), { companyId: co.company.id });
    // 40 days out under [45, 14]: the 45-day warning only (under the default 60/30/7 it would be 60 only, too: so 45 proves the setting)
    expect(await db()("alerts").where({ company_id: co.company.id }).pluck("threshold_days")).toEqual([45]);
  });
});

describe("the cost formula", () => {
  it("is fifo until an admin changes it; it cannot change while a month is closed (409), and nothing else in the request is saved", async () => {
    expect((await read("manager")).body.costFormula).toBe("fifo");
    const avg = await change("admin", { costFormula: "average" });
    expect(avg.status, JSON.stringify(avg.body)).toBe(200);
    expect(avg.body.costFormula).toBe("average");
    expect((await change("admin", { costFormula: "lifo" })).status).toBe(422); // IAS 2 para. 25 allows no LIFO
    await db()("accounting_periods").insert({ company_id: co.company.id, month: "2026-01-01" });
    const locked = await change("admin", { costFormula: "fifo", name: "Renamed on the way" });
    expect(locked.status).toBe(409);
    expect(locked.body.error.code).toBe("COST_FORMULA_LOCKED");
    expect((await read("admin")).body).toMatchObject({ costFormula: "average", name: co.company.name });
    expect((await change("admin", { costFormula: "average" })).status).toBe(200); // the same formula again is no change
    await db()("accounting_periods").where({ company_id: co.company.id }).delete();
    expect((await change("admin", { costFormula: "fifo" })).body.costFormula).toBe("fifo");
  });
});
