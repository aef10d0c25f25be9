// The stock ledger through its endpoints: receipts create lots, withdrawals draw FEFO, counts post
// differences, reversals correct; all against the real PostgreSQL.
import { beforeAll, describe, expect, it } from "vitest";
import { POST as reverseRoute } from "../../app/api/movements/[id]/reverse/route";
import { GET as listRoute, POST as moveRoute } from "../../app/api/movements/route";
import { GET as stockRoute } from "../../app/api/stock/route";
import { GET as lotsRoute } from "../../app/api/lots/route";
import { POST as countsRoute } from "../../app/api/counts/route";
import { PUT as levelsRoute } from "../../app/api/stock-levels/route";
import { db } from "../../db/client";
import { createCompany, type TestCompany } from "../support/factory";
import { sessionCookieFor } from "../support/sessions";
import { buildRequest, call } from "../support/http";
import { createItem, ledgerMismatches, onHand } from "../support/stock";

let co: TestCompany;
let other: TestCompany;
const cookies: Record<string, string> = {};
beforeAll(async () => {
  co = await createCompany({ kitchens: 3 });
  other = await createCompany({ kitchens: 1 });
  for (const role of ["admin", "manager", "buyer", "kitchen_lead", "accountant"] as const) cookies[role] = await sessionCookieFor(co.users[role].id);
  cookies.other = await sessionCookieFor(other.users.admin.id);
});

const post = (body: Record<string, unknown>, who = "manager", idempotencyKey?: string) =>
  call(moveRoute, { path: "/api/movements", body, cookie: cookies[who], idempotencyKey });
const K = () => co.kitchens.map((k) => k.code);
const daysFromToday = (n: number) => new Date(Date.now() + n * 86400_000).toISOString().slice(0, 10);

async function receive(item: string, quantity: string, unit: string, lot: Record<string, unknown>, kitchen = K()[0]!) {
  const res = await post({ kind: "receipt", kitchen, item, quantity, unit, lot, supplier: "Test Supplier" });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.movements[0];
}

describe("receipts", () => {
  it("create the lot and its balance, keep what was typed, and convert the cost to the stock unit", async () => {
    const pepper = await createItem(co.company.id, { category: "spice" });
    // 1 lb = 453.59237 g exactly (NIST SP 811 appendix B)
    const m = await receive(pepper.sku, "2", "lb", { unitCost: "9.071848" });
    expect(m).toMatchObject({ kind: "receipt", delta: "907.18474", enteredQuantity: "2", enteredUnit: "lb", item: { unit: "g" } });
    // 9.071848 per lb = 0.0200000005... per g, stored half-even at 6 decimals
    expect(m.unitCost).toBe("0.02");
    expect(await onHand(co.kitchens[0]!.id, m.lot.id)).toBe("907.184740000000");
    const stock = await call(stockRoute, { path: `/api/stock?kitchen=${K()[0]}`, cookie: cookies.accountant });
    const row = stock.body.rows.find((r: { sku: string }) => r.sku === pepper.sku);
    expect(row).toMatchObject({ onHand: "907.18474", reserved: "0", available: "907.18474" });
    expect(row.lots).toHaveLength(1);
  });

  it("of a cure require the lot code and the date with its kind", async () => {
    const cure = await createItem(co.company.id, { category: "cure" });
    const res = await post({ kind: "receipt", kitchen: K()[0], item: cure.sku, quantity: "1", unit: "kg", lot: { unitCost: "4" } });
    expect(res.status).toBe(422);
    expect(Object.keys(res.body.error.details.fields).sort()).toEqual(["lot.code", "lot.date"]);
    const noKind = await post({ kind: "receipt", kitchen: K()[0], item: cure.sku, quantity: "1", unit: "kg", lot: { code: "C1", date: daysFromToday(90), unitCost: "4" } });
    expect(noKind.body.error.details.fields).toHaveProperty(["lot.dateKind"]);
    expect(await db()("lots").where({ item_id: cure.id })).toHaveLength(0);
  });

  it("refuse a lot code already received for the item", async () => {
    const item = await createItem(co.company.id, { trackLots: true });
    await receive(item.sku, "100", "g", { code: "DUP-1", unitCost: "0.01" });
    const again = await post({ kind: "receipt", kitchen: K()[0], item: item.sku, quantity: "100", unit: "g", lot: { code: "DUP-1", unitCost: "0.01" } });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe("LOT_EXISTS");
  });

  it("of natural casings count hanks, and metres convert through the length per hank", async () => {
    const casing = await createItem(co.company.id, { category: "casing" });
    // 45.72 m = half of a 91.44 m hank (100 yd; trade-facts §4, NIST yd = 0.9144 m)
    const m = await receive(casing.sku, "45.72", "m", { unitCost: "19" });
    expect(m.delta).toBe("0.5");
    // the cost was per metre: 19 per m x 91.44 m = 1737.36 per hank
    expect(m.unitCost).toBe("1737.36");
  });
});

describe("withdrawals", () => {
  it("draw first-expired-first-out across lots, skip expired lots, and split", async () => {
    const item = await createItem(co.company.id, { trackLots: true, trackDates: true });
    const kitchen = K()[1]!;
    const late = await receive(item.sku, "100", "g", { code: "LATE", date: daysFromToday(60), dateKind: "best_before", unitCost: "0.01" }, kitchen);
    const early = await receive(item.sku, "100", "g", { code: "EARLY", date: daysFromToday(10), dateKind: "best_before", unitCost: "0.01" }, kitchen);
    const expired = await receive(item.sku, "100", "g", { code: "GONE", date: daysFromToday(-1), dateKind: "use_by", unitCost: "0.01" }, kitchen);
    const res = await post({ kind: "use", kitchen, item: item.sku, quantity: "150", unit: "g" });
    expect(res.status).toBe(201);
    expect(res.body.movements.map((m: { lot: { code: string }; delta: string }) => [m.lot.code, m.delta])).toEqual([["EARLY", "-100"], ["LATE", "-50"]]);
    expect(await onHand(co.kitchens[1]!.id, expired.lot.id)).toBe("100.000000000000");
    expect(await onHand(co.kitchens[1]!.id, early.lot.id)).toBe("0.000000000000");
    expect(await onHand(co.kitchens[1]!.id, late.lot.id)).toBe("50.000000000000");

    // using the expired lot by name is refused; wasting it is fine
    const use = await post({ kind: "use", kitchen, item: item.sku, quantity: "1", unit: "g", lot: expired.lot.id });
    expect(use.status).toBe(409);
    expect(use.body.error.code).toBe("LOT_EXPIRED");
    const waste = await post({ kind: "waste", kitchen, item: item.sku, quantity: "100", unit: "g", lot: expired.lot.id, reason: "Past its use-by date" });
    expect(waste.status).toBe(201);
  });

  it("refuse more than is available with 409 INSUFFICIENT_STOCK and write nothing", async () => {
    const item = await createItem(co.company.id);
    await receive(item.sku, "1", "kg", { unitCost: "0.005" });
    const before = await db()("stock_movements").where({ item_id: item.id }).count<{ n: string }[]>("* as n");
    const res = await post({ kind: "use", kitchen: K()[0], item: item.sku, quantity: "1000.000000000001", unit: "g" });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({ code: "INSUFFICIENT_STOCK", details: { available: "1000", unit: "g" } });
    const after = await db()("stock_movements").where({ item_id: item.id }).count<{ n: string }[]>("* as n");
    expect(after[0]!.n).toBe(before[0]!.n);
  });

  it("transfer a lot's stock to another kitchen, and a reversal brings it back", async () => {
    const item = await createItem(co.company.id, { trackLots: true });
    const [a, b] = [co.kitchens[0]!, co.kitchens[2]!];
    const r = await receive(item.sku, "500", "g", { code: "T-1", unitCost: "0.01" }, a.code);
    const t = await post({ kind: "transfer", kitchen: a.code, toKitchen: b.code, item: item.sku, quantity: "200", unit: "g" });
    expect(t.status).toBe(201);
    expect(t.body.movements.map((m: { kitchen: { code: string }; delta: string }) => [m.kitchen.code, m.delta])).toEqual([[a.code, "-200"], [b.code, "200"]]);
    expect(await onHand(b.id, r.lot.id)).toBe("200.000000000000");
    const back = await call(reverseRoute, { path: `/api/movements/${t.body.movements[0].id}/reverse`, params: { id: t.body.movements[0].id }, body: {}, cookie: cookies.manager });
    expect(back.status).toBe(201);
    expect(back.body.movements).toHaveLength(2);
    expect(await onHand(a.id, r.lot.id)).toBe("500.000000000000");
    expect(await onHand(b.id, r.lot.id)).toBe("0.000000000000");
    const twice = await call(reverseRoute, { path: `/api/movements/${t.body.movements[1].id}/reverse`, params: { id: t.body.movements[1].id }, body: {}, cookie: cookies.manager });
    expect(twice.status).toBe(409);
    expect(twice.body.error.code).toBe("ALREADY_REVERSED");
  });
});

describe("counts and adjustments", () => {
  it("a count posts the difference, and records the count even when nothing differs", async () => {
    const item = await createItem(co.company.id);
    const r = await receive(item.sku, "300", "g", { unitCost: "0.01" });
    const short = await post({ kind: "count", kitchen: K()[0], item: item.sku, quantity: "0.25", unit: "kg" });
    expect(short.status).toBe(201);
    expect(short.body.movements[0]).toMatchObject({ kind: "count", delta: "-50", counted: "250" });
    const same = await post({ kind: "count", kitchen: K()[0], item: item.sku, quantity: "250", unit: "g" });
    expect(same.body.movements[0]).toMatchObject({ kind: "count", delta: "0", counted: "250" });
    expect(await onHand(co.kitchens[0]!.id, r.lot.id)).toBe("250.000000000000");
  });

  it("an adjustment is signed and never zero", async () => {
    const item = await createItem(co.company.id);
    await receive(item.sku, "100", "g", { unitCost: "0.01" });
    expect((await post({ kind: "adjustment", kitchen: K()[0], item: item.sku, quantity: "-30", unit: "g", reason: "Spilt" })).body.movements[0].delta).toBe("-30");
    expect((await post({ kind: "adjustment", kitchen: K()[0], item: item.sku, quantity: "5", unit: "g", reason: "Found" })).body.movements[0].delta).toBe("5");
    const zero = await post({ kind: "adjustment", kitchen: K()[0], item: item.sku, quantity: "0", unit: "g" });
    expect(zero.status).toBe(422);
    expect(zero.body.error.details.fields).toHaveProperty("quantity");
  });
});

describe("bad input", () => {
  it("names the field, and writes nothing", async () => {
    const item = await createItem(co.company.id);
    const casing = await createItem(co.company.id, { category: "casing" });
    await receive(item.sku, "100", "g", { unitCost: "0.01" });
    const cases: [Record<string, unknown>, string][] = [
      [{ kind: "use", kitchen: K()[0], item: item.sku, quantity: "1", unit: "furlong" }, "unit"],
      [{ kind: "use", kitchen: K()[0], item: item.sku, quantity: "1", unit: "m" }, "unit"],
      [{ kind: "use", kitchen: K()[0], item: casing.sku, quantity: "1", unit: "kg" }, "unit"],
      [{ kind: "use", kitchen: K()[0], item: item.sku, quantity: "-1", unit: "g" }, "quantity"],
      [{ kind: "use", kitchen: K()[0], item: item.sku, quantity: 1, unit: "g" }, "quantity"],
      [{ kind: "transfer", kitchen: K()[0], toKitchen: K()[0], item: item.sku, quantity: "1", unit: "g" }, "toKitchen"],
      [{ kind: "waste", kitchen: K()[0], item: item.sku, quantity: "1", unit: "g" }, "reason"],
      [{ kind: "use", kitchen: K()[0], item: item.sku, quantity: "1", unit: "g", occurredAt: new Date(Date.now() + 3600_000).toISOString() }, "occurredAt"],
    ];
    const before = await db()("stock_movements").where({ company_id: co.company.id }).count<{ n: string }[]>("* as n");
    for (const [body, field] of cases) {
      const res = await post(body);
      expect(res.status, JSON.stringify(body)).toBe(422);
      expect(Object.keys(res.body.error.details.fields), JSON.stringify(body)).toContain(field);
    }
    const after = await db()("stock_movements").where({ company_id: co.company.id }).count<{ n: string }[]>("* as n");
    expect(after[0]!.n).toBe(before[0]!.n);
  });

  it("refuses a lot of another item", async () => {
    const a = await createItem(co.company.id);
    const b = await createItem(co.company.id);
    const lotOfA = (await receive(a.sku, "10", "g", { unitCost: "0.01" })).lot.id;
    await receive(b.sku, "10", "g", { unitCost: "0.01" });
    const res = await post({ kind: "use", kitchen: K()[0], item: b.sku, quantity: "1", unit: "g", lot: lotOfA });
    expect(res.status).toBe(422);
    expect(res.body.error.details.fields).toHaveProperty("lot");
  });

  it("accepts a back-dated movement", async () => {
    const item = await createItem(co.company.id);
    await receive(item.sku, "10", "g", { unitCost: "0.01" });
    const at = "2026-01-15T09:00:00.000Z";
    const res = await post({ kind: "use", kitchen: K()[0], item: item.sku, quantity: "1", unit: "g", occurredAt: at });
    expect(res.body.movements[0].occurredAt).toBe(at);
  });
});

describe("scope", () => {
  it("keeps kitchen leads to their own kitchens, accountants from posting, and companies apart", async () => {
    const item = await createItem(co.company.id);
    await receive(item.sku, "100", "g", { unitCost: "0.01" }, K()[0]);
    await receive(item.sku, "100", "g", { unitCost: "0.01" }, K()[1]);
    // the kitchen lead is assigned the first kitchen only
    expect((await post({ kind: "use", kitchen: K()[0], item: item.sku, quantity: "1", unit: "g" }, "kitchen_lead")).status).toBe(201);
    expect((await post({ kind: "use", kitchen: K()[1], item: item.sku, quantity: "1", unit: "g" }, "kitchen_lead")).status).toBe(403);
    expect((await post({ kind: "use", kitchen: K()[0], item: item.sku, quantity: "1", unit: "g" }, "accountant")).status).toBe(403);
    expect((await post({ kind: "use", kitchen: K()[0], item: item.sku, quantity: "1", unit: "g" }, "buyer")).status).toBe(403);
    expect((await post({ kind: "receipt", kitchen: K()[1], item: item.sku, quantity: "1", unit: "g", lot: { unitCost: "0" } }, "buyer")).status).toBe(201);
    // another company: its admin cannot see or touch this company's kitchen or item
    expect((await post({ kind: "use", kitchen: K()[0], item: item.sku, quantity: "1", unit: "g" }, "other")).status).toBe(404);
    expect((await post({ kind: "use", kitchen: other.kitchens[0]!.code, item: item.sku, quantity: "1", unit: "g" }, "other")).status).toBe(404);
    const stock = await call(stockRoute, { path: `/api/stock?kitchen=${K()[0]}`, cookie: cookies.other });
    expect(stock.status).toBe(404);
    const own = await call(stockRoute, { path: "/api/stock", cookie: cookies.other });
    expect(JSON.stringify(own.body)).not.toContain(item.sku);
    const m = (await call(listRoute, { path: `/api/movements?kitchen=${K()[0]}`, cookie: cookies.manager })).body.movements[0];
    const foreign = await call(reverseRoute, { path: `/api/movements/${m.id}/reverse`, params: { id: m.id }, body: {}, cookie: cookies.other });
    expect(foreign.status).toBe(404);
  });
});

describe("idempotency", () => {
  it("a replayed request returns the first answer and posts once", async () => {
    const item = await createItem(co.company.id);
    const body = { kind: "receipt", kitchen: K()[0], item: item.sku, quantity: "10", unit: "g", lot: { unitCost: "0.01" } };
    const first = await post(body, "manager", `rcv-${item.sku}`);
    const again = await post(body, "manager", `rcv-${item.sku}`);
    expect(first.status).toBe(201);
    expect(again.status).toBe(201);
    expect(again.body).toEqual(first.body);
    expect(await db()("stock_movements").where({ item_id: item.id })).toHaveLength(1);
  });
});

describe("concurrency", () => {
  it("50 concurrent withdrawals of the last 20 units: exactly 20 succeed and the balance is exactly zero", async () => {
    const item = await createItem(co.company.id, { category: "casing" });
    const r = await receive(item.sku, "20", "hank", { unitCost: "30" }, K()[2]);
    const results = await Promise.all(
      Array.from({ length: 50 }, () => post({ kind: "use", kitchen: K()[2], item: item.sku, quantity: "1", unit: "hank", lot: r.lot.id })),
    );
    const statuses = results.map((x) => x.status);
    expect(statuses.filter((s) => s === 201)).toHaveLength(20);
    expect(statuses.filter((s) => s === 409)).toHaveLength(30);
    expect(await onHand(co.kitchens[2]!.id, r.lot.id)).toBe("0.000000000000");
    expect(await ledgerMismatches(co.company.id)).toEqual([]);
  });
});

describe("lots and movement history", () => {
  it("lists lots expiring soon, expired ones only when asked, and pages movements as JSON or CSV", async () => {
    const item = await createItem(co.company.id, { trackLots: true, trackDates: true });
    await receive(item.sku, "10", "g", { code: "SOON", date: daysFromToday(5), dateKind: "best_before", unitCost: "0.01" });
    await receive(item.sku, "10", "g", { code: "LATER", date: daysFromToday(100), dateKind: "best_before", unitCost: "0.01" });
    await receive(item.sku, "10", "g", { code: "PAST", date: daysFromToday(-3), dateKind: "use_by", unitCost: "0.01" });
    const soon = await call(lotsRoute, { path: "/api/lots?expiringWithinDays=30", cookie: cookies.manager });
    const codes = soon.body.lots.filter((l: { sku: string }) => l.sku === item.sku).map((l: { code: string; daysLeft: number }) => [l.code, l.daysLeft]);
    expect(codes).toEqual([["SOON", 5]]);
    const withExpired = await call(lotsRoute, { path: "/api/lots?expiringWithinDays=30&includeExpired=true", cookie: cookies.manager });
    expect(withExpired.body.lots.filter((l: { sku: string }) => l.sku === item.sku).map((l: { code: string }) => l.code)).toEqual(["PAST", "SOON"]);

    const page1 = await call(listRoute, { path: `/api/movements?item=${item.sku}&limit=2`, cookie: cookies.accountant });
    expect(page1.body.movements).toHaveLength(2);
    const page2 = await call(listRoute, { path: `/api/movements?item=${item.sku}&limit=2&cursor=${encodeURIComponent(page1.body.nextCursor)}`, cookie: cookies.accountant });
    expect(page2.body.movements).toHaveLength(1);
    expect(page2.body.nextCursor).toBeNull();
    const csv = await listRoute(buildRequest({ path: `/api/movements?item=${item.sku}&format=csv`, cookie: cookies.accountant }), { params: Promise.resolve({}) });
    expect(csv.headers.get("content-type")).toContain("text/csv");
    const lines = (await csv.text()).trim().split("\r\n");
    expect(lines[0]).toMatch(/^occurredAt,kind,kitchen/);
    expect(lines).toHaveLength(4);
  });
});

describe("count sheets and stock levels", () => {
  it("posts every line of a count together, or none of them", async () => {
    const a = await createItem(co.company.id);
    const b = await createItem(co.company.id);
    await receive(a.sku, "100", "g", { unitCost: "0.01" });
    await receive(b.sku, "100", "g", { unitCost: "0.01" });
    const bad = await call(countsRoute, { path: "/api/counts", cookie: cookies.kitchen_lead, body: {
      kitchen: K()[0], lines: [{ item: a.sku, counted: "90", unit: "g" }, { item: b.sku, counted: "1", unit: "parsec" }],
    } });
    expect(bad.status).toBe(422);
    expect(bad.body.error.details.fields).toHaveProperty(["lines.1.unit"]);
    expect(await db()("stock_movements").where({ item_id: a.id, kind: "count" })).toHaveLength(0);

    const ok = await call(countsRoute, { path: "/api/counts", cookie: cookies.kitchen_lead, body: {
      kitchen: K()[0], lines: [{ item: a.sku, counted: "90", unit: "g" }, { item: b.sku, counted: "0.1", unit: "kg" }],
    } });
    expect(ok.status).toBe(201);
    expect(ok.body.movements.map((m: { item: { sku: string }; delta: string }) => [m.item.sku, m.delta])).toEqual([[a.sku, "-10"], [b.sku, "0"]]);
    expect(new Set(ok.body.movements.map((m: { postingId: string }) => m.postingId))).toEqual(new Set([ok.body.countId]));
    expect(await db()("stock_counts").where({ id: ok.body.countId }).first()).toMatchObject({ line_count: 2 });
    // a kitchen lead counts only in their own kitchen
    const elsewhere = await call(countsRoute, { path: "/api/counts", cookie: cookies.kitchen_lead, body: { kitchen: K()[1], lines: [{ item: a.sku, counted: "1", unit: "g" }] } });
    expect(elsewhere.status).toBe(403);
  });

  it("sets par and reorder point per kitchen, converted to the stock unit, and shows them with the stock", async () => {
    const item = await createItem(co.company.id);
    const put = (body: Record<string, unknown>, who = "kitchen_lead") => call(levelsRoute, { method: "PUT", path: "/api/stock-levels", cookie: cookies[who], body });
    const res = await put({ kitchen: K()[0], item: item.sku, parLevel: "2", reorderPoint: "0.5", unit: "kg" });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ parLevel: "2000", reorderPoint: "500", unit: "g" });
    const wrong = await put({ kitchen: K()[0], item: item.sku, parLevel: "1", reorderPoint: "2" });
    expect(wrong.status).toBe(422);
    expect(wrong.body.error.details.fields).toHaveProperty("reorderPoint");
    expect((await put({ kitchen: K()[1], item: item.sku, parLevel: "1", reorderPoint: null })).status).toBe(403);
    const stock = await call(stockRoute, { path: `/api/stock?kitchen=${K()[0]}`, cookie: cookies.buyer });
    expect(stock.body.rows.find((r: { sku: string }) => r.sku === item.sku)).toMatchObject({ parLevel: "2000", reorderPoint: "500", onHand: "0" });
  });
});
