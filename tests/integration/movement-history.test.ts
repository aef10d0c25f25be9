// The movement history names the person who posted each movement (looked up in the company's own
// users), in JSON and in the CSV export; a movement whose user is not (or no longer) known there
// says so instead of showing an id.
import { randomUUID } from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as listRoute, POST as moveRoute } from "../../app/api/movements/route";
import { db } from "../../db/client";
import { createCompany, createUser, type TestCompany } from "../support/factory";
import { sessionCookieFor } from "../support/sessions";
import { buildRequest, call } from "../support/http";
import { createItem, type TestItem } from "../support/stock";

let co: TestCompany;
let stranger: TestCompany;
let item: TestItem;
let manager: string;
beforeAll(async () => {
  co = await createCompany({ kitchens: 1 });
  stranger = await createCompany();
  manager = await sessionCookieFor(co.users.manager.id);
  item = await createItem(co.company.id);
});

/** A movement written straight to the ledger table with the given user (what a job or an old import could leave). */
async function rawMovement(userId: string | null, lotId: string, reason: string) {
  await db()("stock_movements").insert({
    company_id: co.company.id, posting_id: randomUUID(), kind: "adjustment", kitchen_id: co.kitchens[0]!.id, item_id: item.id, lot_id: lotId,
    delta: "1", unit_cost: "0.01", reason, user_id: userId, occurred_at: new Date(),
  });
}

describe("who posted a movement", () => {
  it("is named in the history and the CSV export; an unknown user and none are told apart", async () => {
    const k = co.kitchens[0]!.code;
    const receipt = await call(moveRoute, { path: "/api/movements", cookie: manager, body: { kind: "receipt", kitchen: k, item: item.sku, quantity: "100", unit: "g", lot: { unitCost: "0.01" } } });
    expect(receipt.status).toBe(201);
    const lotId = receipt.body.movements[0].lot.id;
    // a lead who has since been disabled is still named
    const lead = await createUser(co.company.id, "kitchen_lead", { kitchenIds: [co.kitchens[0]!.id] });
    const used = await call(moveRoute, { path: "/api/movements", cookie: await sessionCookieFor(lead.id), body: { kind: "use", kitchen: k, item: item.sku, quantity: "5", unit: "g" } });
    expect(used.status).toBe(201);
    await db()("app_users").where({ id: lead.id }).update({ disabled_at: new Date() });
    // another company's user is never looked up, and a movement without a user is the system's
    await rawMovement(stranger.users.admin.id, lotId, "by someone not of this company");
    await rawMovement(null, lotId, "by no one");

    const res = await call(listRoute, { path: `/api/movements?item=${item.sku}`, cookie: manager });
    expect(res.status).toBe(200);
    const by = Object.fromEntries(res.body.movements.map((m: { kind: string; reason: string | null; userId: string | null; userName: string | null }) =>
      [m.reason ?? m.kind, [m.userId, m.userName]]));
    expect(by).toEqual({
      receipt: [co.users.manager.id, co.users.manager.name],
      use: [lead.id, lead.name],
      "by someone not of this company": [stranger.users.admin.id, null],
      "by no one": [null, null],
    });
    expect(JSON.stringify(res.body)).not.toContain(stranger.users.admin.name);

    const csv = await listRoute(buildRequest({ path: `/api/movements?item=${item.sku}&format=csv`, cookie: manager }), { params: Promise.resolve({}) });
    const rows = (await csv.text()).trim().split("\r\n");
    expect(rows[0]).toMatch(/^occurredAt,kind,kitchen,.*,id,user$/);
    const userOf = (needle: string) => rows.find((r) => r.includes(needle))!.split(",").at(-1);
    expect(userOf(",receipt,")).toBe(co.users.manager.name);
    expect(userOf(",use,")).toBe(lead.name);
    expect(userOf("by someone not of this company")).toBe("former user");
    expect(userOf("by no one")).toBe("");
  });
});
