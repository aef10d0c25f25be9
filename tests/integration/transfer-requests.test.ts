// A kitchen lead asks another kitchen for stock; that kitchen's lead or a manager fulfils it
// (posting the transfer) or declines it with a reason.
import { beforeAll, describe, expect, it } from "vitest";
import { POST as declineRoute } from "../../app/api/transfer-requests/[id]/decline/route";
import { POST as fulfilRoute } from "../../app/api/transfer-requests/[id]/fulfil/route";
import { GET as listRoute, POST as requestRoute } from "../../app/api/transfer-requests/route";
import { POST as moveRoute } from "../../app/api/movements/route";
import { createCompany, createUser, type TestCompany } from "../support/factory";
import { sessionCookieFor } from "../support/sessions";
import { call } from "../support/http";
import { createItem, onHand } from "../support/stock";

let co: TestCompany;
let leadA: string; // lead of kitchen A (the factory's lead)
let leadB: string; // lead of kitchen B
let manager: string;
beforeAll(async () => {
  co = await createCompany({ kitchens: 2 });
  leadA = await sessionCookieFor(co.users.kitchen_lead.id);
  leadB = await sessionCookieFor((await createUser(co.company.id, "kitchen_lead", { kitchenIds: [co.kitchens[1]!.id] })).id);
  manager = await sessionCookieFor(co.users.manager.id);
});

async function stockIn(kitchen: string, quantity: string) {
  const item = await createItem(co.company.id);
  const r = await call(moveRoute, { path: "/api/movements", cookie: manager, body: { kind: "receipt", kitchen, item: item.sku, quantity, unit: "g", lot: { unitCost: "0.01" } } });
  expect(r.status).toBe(201);
  return { item, lotId: r.body.movements[0].lot.id as string };
}
const ask = (cookie: string, body: Record<string, unknown>) => call(requestRoute, { path: "/api/transfer-requests", cookie, body });
const fulfil = (cookie: string, id: string) => call(fulfilRoute, { path: `/api/transfer-requests/${id}/fulfil`, params: { id }, cookie, body: {} });
const decline = (cookie: string, id: string, body: Record<string, unknown>) => call(declineRoute, { path: `/api/transfer-requests/${id}/decline`, params: { id }, cookie, body });

describe("transfer requests", () => {
  it("a lead asks another kitchen; that kitchen's lead fulfils it by posting the transfer", async () => {
    const [A, B] = co.kitchens as [typeof co.kitchens[0], typeof co.kitchens[0]];
    const { item, lotId } = await stockIn(B!.code, "1000");
    const asked = await ask(leadA, { fromKitchen: B!.code, toKitchen: A!.code, item: item.sku, quantity: "0.25", unit: "kg", note: "Short for Friday's batch" });
    expect(asked.status).toBe(201);
    expect(asked.body).toMatchObject({ status: "open", quantity: "250", fromKitchen: { code: B!.code }, toKitchen: { code: A!.code } });
    // the asking lead cannot fulfil (it acts only in its own kitchen A); B's lead can
    expect((await fulfil(leadA, asked.body.id)).status).toBe(403);
    const done = await fulfil(leadB, asked.body.id);
    expect(done.status).toBe(201);
    expect(done.body.request).toMatchObject({ status: "fulfilled" });
    expect(done.body.movements.map((m: { kitchen: { code: string }; delta: string }) => [m.kitchen.code, m.delta])).toEqual([[B!.code, "-250"], [A!.code, "250"]]);
    expect(await onHand(A!.id, lotId)).toBe("250.000000000000");
    const again = await fulfil(manager, asked.body.id);
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe("REQUEST_CLOSED");
    const open = await call(listRoute, { path: `/api/transfer-requests?status=fulfilled&kitchen=${A!.code}`, cookie: leadA });
    expect(open.body.requests.map((r: { id: string }) => r.id)).toContain(asked.body.id);
  });

  it("a shortfall leaves the request open; declining needs a reason", async () => {
    const [A, B] = co.kitchens;
    const { item } = await stockIn(B!.code, "10");
    const asked = await ask(leadA, { fromKitchen: B!.code, toKitchen: A!.code, item: item.sku, quantity: "11", unit: "g" });
    const short = await fulfil(manager, asked.body.id);
    expect(short.status).toBe(409);
    expect(short.body.error.code).toBe("INSUFFICIENT_STOCK");
    expect((await decline(leadB, asked.body.id, {})).status).toBe(422);
    const declined = await decline(leadB, asked.body.id, { reason: "We need it ourselves" });
    expect(declined.body).toMatchObject({ status: "declined", declineReason: "We need it ourselves" });
  });

  it("a lead asks only for its own kitchen, and not from itself", async () => {
    const [A, B] = co.kitchens;
    const { item } = await stockIn(A!.code, "10");
    expect((await ask(leadA, { fromKitchen: A!.code, toKitchen: B!.code, item: item.sku, quantity: "1", unit: "g" })).status).toBe(403);
    const self = await ask(leadA, { fromKitchen: A!.code, toKitchen: A!.code, item: item.sku, quantity: "1", unit: "g" });
    expect(self.status).toBe(422);
    expect(self.body.error.details.fields).toHaveProperty("fromKitchen");
  });
});
