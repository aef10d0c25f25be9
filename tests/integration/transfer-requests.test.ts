// A kitchen lead asks another kitchen for stock; that kitchen's lead or a manager fulfils it
// (posting the transfer: first expired first out, or a lot of its choosing) or declines it with a
// reason.
import { randomUUID } from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as declineRoute } from "../../app/api/transfer-requests/[id]/decline/route";
import { POST as fulfilRoute } from "../../app/api/transfer-requests/[id]/fulfil/route";
import { GET as lotsRoute } from "../../app/api/transfer-requests/[id]/lots/route";
import { GET as listRoute, POST as requestRoute } from "../../app/api/transfer-requests/route";
import { POST as moveRoute } from "../../app/api/movements/route";
import { db } from "../../db/client";
import { createCompany, createUser, type TestCompany } from "../support/factory";
import { sessionCookieFor } from "../support/sessions";
import { call } from "../support/http";
import { createItem, ledgerMismatches, onHand, type TestItem } from "../support/stock";

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
const fulfil = (cookie: string, id: string, body: Record<string, unknown> = {}, idempotencyKey?: string) =>
  call(fulfilRoute, { path: `/api/transfer-requests/${id}/fulfil`, params: { id }, cookie, body, idempotencyKey });
const lotsOf = (cookie: string, id: string) => call(lotsRoute, { path: `/api/transfer-requests/${id}/lots`, params: { id }, cookie });
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

describe("fulfilling with a lot of the sender's choosing", () => {
  const daysFromToday = (n: number) => new Date(Date.now() + n * 86400_000).toISOString().slice(0, 10);
  const lines = (movements: { kitchen: { code: string }; lot: { code: string }; delta: string }[]) => movements.map((m) => [m.kitchen.code, m.lot.code, m.delta]);

  /** A dated item with lots in kitchen B: EARLY (in 20 days), LATE (in 200 days) and PAST (expired 3 days ago). */
  async function datedStock() {
    const [, B] = co.kitchens;
    const item = await createItem(co.company.id, { category: "spice", trackLots: true, trackDates: true });
    const lots: Record<string, string> = {};
    for (const [code, qty, days, kind] of [["EARLY", "100", 20, "best_before"], ["LATE", "400", 200, "use_by"], ["PAST", "50", -3, "use_by"]] as const) {
      const r = await call(moveRoute, { path: "/api/movements", cookie: manager, body: {
        kind: "receipt", kitchen: B!.code, item: item.sku, quantity: qty, unit: "g", lot: { code, date: daysFromToday(days), dateKind: kind, unitCost: "0.01" },
      } });
      expect(r.status, JSON.stringify(r.body)).toBe(201);
      lots[code] = r.body.movements[0].lot.id;
    }
    return { item, lots };
  }
  const askFor = async (item: TestItem, quantity: string, unit = "g") => {
    const [A, B] = co.kitchens;
    const asked = await ask(leadA, { fromKitchen: B!.code, toKitchen: A!.code, item: item.sku, quantity, unit });
    expect(asked.status).toBe(201);
    return asked.body.id as string;
  };

  it("lists the sending kitchen's lots with days left and what first expired first out would take", async () => {
    const { item, lots } = await datedStock();
    const id = await askFor(item, "150");
    const res = await lotsOf(leadB, id);
    expect(res.status).toBe(200);
    expect(res.body.item).toMatchObject({ sku: item.sku, unit: "g", trackLots: true, cure: false });
    expect(res.body.kitchen.code).toBe(co.kitchens[1]!.code);
    expect(res.body.lots.map((l: { code: string; available: string; expired: boolean; dateKind: string }) => [l.code, l.available, l.expired, l.dateKind])).toEqual([
      ["PAST", "50", true, "use_by"], ["EARLY", "100", false, "best_before"], ["LATE", "400", false, "use_by"],
    ]);
    const early = res.body.lots.find((l: { code: string }) => l.code === "EARLY");
    expect(early.daysLeft).toBeGreaterThanOrEqual(19);
    expect(early.daysLeft).toBeLessThanOrEqual(21);
    expect(res.body.lots[0].daysLeft).toBeLessThan(0);
    // the expired lot is skipped, as the ledger's own draw skips it
    expect(res.body.fefo).toEqual({ takes: [{ lotId: lots.EARLY, code: "EARLY", quantity: "100" }, { lotId: lots.LATE, code: "LATE", quantity: "50" }], short: "0" });
    // the asking kitchen's lead may look too (everyone reads stock); another company may not
    expect((await lotsOf(leadA, id)).status).toBe(200);
    const stranger = await sessionCookieFor((await createCompany()).users.admin.id);
    expect((await lotsOf(stranger, id)).status).toBe(404);

    // fulfilled without a lot, the transfer takes exactly what was shown
    const done = await fulfil(leadB, id);
    expect(done.status).toBe(201);
    expect(lines(done.body.movements)).toEqual([
      [co.kitchens[1]!.code, "EARLY", "-100"], [co.kitchens[1]!.code, "LATE", "-50"], [co.kitchens[0]!.code, "EARLY", "100"], [co.kitchens[0]!.code, "LATE", "50"],
    ]);
  });

  it("sends the lot named, and the receiving kitchen then has that lot", async () => {
    const [A, B] = co.kitchens;
    const { item, lots } = await datedStock();
    const id = await askFor(item, "0.25", "kg");
    const done = await fulfil(leadB, id, { lot: lots.LATE });
    expect(done.status, JSON.stringify(done.body)).toBe(201);
    expect(done.body.request).toMatchObject({ status: "fulfilled", decidedBy: expect.any(String) });
    expect(lines(done.body.movements)).toEqual([[B!.code, "LATE", "-250"], [A!.code, "LATE", "250"]]);
    expect(await onHand(A!.id, lots.LATE!)).toBe("250.000000000000");
    expect(await onHand(B!.id, lots.LATE!)).toBe("150.000000000000");
    expect(await onHand(B!.id, lots.EARLY!)).toBe("100.000000000000"); // untouched, though it expires first
    expect(await ledgerMismatches(co.company.id)).toEqual([]);
  });

  it("refuses a lot of another item, an unknown lot or another company's, naming the lot, and leaves the request open", async () => {
    const { item } = await datedStock();
    const { lotId: otherItemsLot } = await stockIn(co.kitchens[1]!.code, "500");
    const stranger = await createCompany();
    const strangerItem = await createItem(stranger.company.id);
    const strangerLot = await call(moveRoute, { path: "/api/movements", cookie: await sessionCookieFor(stranger.users.manager.id), body: {
      kind: "receipt", kitchen: stranger.kitchens[0]!.code, item: strangerItem.sku, quantity: "5", unit: "g", lot: { unitCost: "1" },
    } });
    const id = await askFor(item, "10");
    for (const lot of [otherItemsLot, randomUUID(), strangerLot.body.movements[0].lot.id]) {
      const res = await fulfil(leadB, id, { lot });
      expect(res.status).toBe(422);
      expect(res.body.error.details.fields).toHaveProperty("lot");
    }
    expect((await fulfil(leadB, id, { lot: otherItemsLot })).body.error.details.fields.lot[0]).toContain("another item");
    const notAnId = await fulfil(leadB, id, { lot: "LATE" });
    expect(notAnId.status).toBe(422);
    expect(notAnId.body.error.details.fields).toHaveProperty("lot");
    expect((await db()("transfer_requests").where({ id }).first()).status).toBe("open");
  });

  it("refuses a lot with too little or no stock in the sending kitchen (409 naming the lot); stock never goes negative", async () => {
    const [A, B] = co.kitchens;
    const { item, lots } = await datedStock();
    // a lot of the item that only kitchen A holds
    const atA = await call(moveRoute, { path: "/api/movements", cookie: manager, body: {
      kind: "receipt", kitchen: A!.code, item: item.sku, quantity: "30", unit: "g", lot: { code: "ONLY-A", date: daysFromToday(90), dateKind: "use_by", unitCost: "0.01" },
    } });
    const id = await askFor(item, "120");
    const none = await fulfil(leadB, id, { lot: atA.body.movements[0].lot.id });
    expect(none.status).toBe(409);
    expect(none.body.error.code).toBe("INSUFFICIENT_STOCK");
    expect(none.body.error.details.fields.lot[0]).toBe(`Lot ONLY-A has no stock available in ${B!.code}.`);
    const short = await fulfil(leadB, id, { lot: lots.EARLY });
    expect(short.status).toBe(409);
    expect(short.body.error.details).toMatchObject({ available: "100", requested: "120", unit: "g" });
    expect(short.body.error.details.fields.lot[0]).toContain("Lot EARLY has only 100 g available");
    expect(await onHand(B!.id, lots.EARLY!)).toBe("100.000000000000");
    expect((await db()("transfer_requests").where({ id }).first()).status).toBe("open");
    expect(await db()("stock_movements").where({ item_id: item.id, kind: "transfer" })).toHaveLength(0);
  });

  it("an expired lot is sent only when named, as the ledger allows for transfers", async () => {
    const [A, B] = co.kitchens;
    const item = await createItem(co.company.id, { category: "cure" });
    const past = await call(moveRoute, { path: "/api/movements", cookie: manager, body: {
      kind: "receipt", kitchen: B!.code, item: item.sku, quantity: "80", unit: "g", lot: { code: "OLD", date: daysFromToday(-5), dateKind: "use_by", unitCost: "0.01" },
    } });
    const lot = past.body.movements[0].lot.id;
    const id = await askFor(item, "40");
    const choices = await lotsOf(leadB, id);
    expect(choices.body.item.cure).toBe(true);
    expect(choices.body.fefo).toEqual({ takes: [], short: "40" });
    // without a lot: nothing in date to draw
    const fefo = await fulfil(leadB, id);
    expect(fefo.status).toBe(409);
    expect(fefo.body.error.code).toBe("INSUFFICIENT_STOCK");
    // named: sent; using it at the receiving kitchen stays refused (LOT_EXPIRED)
    const named = await fulfil(leadB, id, { lot });
    expect(named.status).toBe(201);
    expect(await onHand(A!.id, lot)).toBe("40.000000000000");
    const use = await call(moveRoute, { path: "/api/movements", cookie: leadA, body: { kind: "use", kitchen: A!.code, item: item.sku, quantity: "1", unit: "g", lot } });
    expect(use.status).toBe(409);
    expect(use.body.error.code).toBe("LOT_EXPIRED");
  });

  it("a retry with the same Idempotency-Key sends once; the same key with another lot is refused", async () => {
    const [A] = co.kitchens;
    const { item, lots } = await datedStock();
    const id = await askFor(item, "20");
    const key = randomUUID();
    const first = await fulfil(leadB, id, { lot: lots.LATE }, key);
    const again = await fulfil(leadB, id, { lot: lots.LATE }, key);
    expect(first.status).toBe(201);
    expect(again.status).toBe(201);
    expect(again.body).toEqual(first.body);
    expect(await onHand(A!.id, lots.LATE!)).toBe("20.000000000000");
    expect(await db()("stock_movements").where({ item_id: item.id, kind: "transfer" })).toHaveLength(2);
    const otherLot = await fulfil(leadB, id, { lot: lots.EARLY }, key);
    expect(otherLot.status).toBe(422);
    // a new key on a closed request: refused, nothing posted
    const closed = await fulfil(leadB, id, { lot: lots.EARLY }, randomUUID());
    expect(closed.status).toBe(409);
    expect(closed.body.error.code).toBe("REQUEST_CLOSED");
    expect(await db()("stock_movements").where({ item_id: item.id, kind: "transfer" })).toHaveLength(2);
  });
});
