// POST /api/batches/reserve-all says per batch what happened: reserved now, already reserved (nothing
// to do), short (which lines), skipped (produced or cancelled), with counts; a second call holds
// nothing twice. Quantities: a spice at 2 g/kg of meat block, so 10 kg of meat takes 20 g (plain
// arithmetic on the recipe's rate; no trade figure is involved).
import { randomUUID } from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as cancelRoute } from "../../app/api/batches/[id]/cancel/route";
import { POST as produceRoute } from "../../app/api/batches/[id]/produce/route";
import { POST as reserveRoute } from "../../app/api/batches/[id]/reserve/route";
import { POST as reserveAllRoute } from "../../app/api/batches/reserve-all/route";
import { POST as batchCreate } from "../../app/api/batches/route";
import { POST as itemCreate } from "../../app/api/items/route";
import { POST as moveRoute } from "../../app/api/movements/route";
import { POST as recipeCreate } from "../../app/api/recipes/route";
import { db } from "../../db/client";
import { createCompany, createUser, tag, type TestCompany } from "../support/factory";
import { call } from "../support/http";
import { sessionCookieFor } from "../support/sessions";
import { ledgerMismatches } from "../support/stock";

let co: TestCompany;
const cookie: Record<string, string> = {};
const K = (i: number) => co.kitchens[i]!.code;
const day = (n: number) => new Date(Date.now() + n * 86400_000).toISOString().slice(0, 10);

beforeAll(async () => {
  co = await createCompany({ kitchens: 2 });
  for (const role of ["admin", "manager", "kitchen_lead"] as const) cookie[role] = await sessionCookieFor(co.users[role].id);
  cookie.lead2 = await sessionCookieFor((await createUser(co.company.id, "kitchen_lead", { kitchenIds: [co.kitchens[1]!.id] })).id);
});

const post = (handler: Parameters<typeof call>[0], path: string, body: unknown, who: string, extra: { params?: Record<string, string>; idempotencyKey?: string } = {}) =>
  call(handler, { path, body, cookie: cookie[who], ...extra });

async function planned(code: string, plannedFor: string, kg: string) {
  const r = await post(batchCreate, "/api/batches", { kitchen: K(0), recipe: code, plannedFor, meatBlock: { quantity: kg, unit: "kg" } }, "kitchen_lead");
  expect(r.status, JSON.stringify(r.body)).toBe(201);
  return r.body.id as string;
}

describe("reserve all", () => {
  it("reports each batch's outcome with counts, and a second call reports them already reserved and holds nothing twice", async () => {
    const spice = await post(itemCreate, "/api/items", { sku: `SP-${tag().toUpperCase()}`, name: "Mace", category: "spice", unit: "g" }, "admin");
    expect(spice.status, JSON.stringify(spice.body)).toBe(201);
    const receipt = await post(moveRoute, "/api/movements", {
      kind: "receipt", kitchen: K(0), item: spice.body.sku, quantity: "100", unit: "g", lot: { code: `L${tag()}`, date: day(60), dateKind: "best_before", unitCost: "0.05" },
    }, "admin");
    expect(receipt.status, JSON.stringify(receipt.body)).toBe(201);
    const lotId = receipt.body.movements[0].lot.id as string;
    const recipe = await post(recipeCreate, "/api/recipes", {
      code: `RA${tag().slice(0, 8).toUpperCase()}`, name: "Mace sausage", productClass: "comminuted", storage: "keep_refrigerated",
      meatBlock: [{ name: "Lean pork", percent: "100" }], lines: [{ item: spice.body.sku, rate: "2", unit: "g/kg" }],
    }, "manager");
    expect(recipe.status, JSON.stringify(recipe.body)).toBe(201);
    const code = recipe.body.code as string;

    // made before: 5 kg (10 g) reserved and produced; 90 g of the spice is left
    const made = await planned(code, day(2), "5");
    expect((await post(reserveRoute, `/api/batches/${made}/reserve`, undefined, "kitchen_lead", { params: { id: made } })).status).toBe(200);
    const produced = await post(produceRoute, `/api/batches/${made}/produce`, { actualMeatBlock: { quantity: "5", unit: "kg" } }, "kitchen_lead", { params: { id: made } });
    expect(produced.status, JSON.stringify(produced.body)).toBe(200);
    const first = await planned(code, day(2), "10"); // 20 g
    const second = await planned(code, day(3), "10"); // 20 g
    const dropped = await planned(code, day(3), "5");
    expect((await post(cancelRoute, `/api/batches/${dropped}/cancel`, undefined, "kitchen_lead", { params: { id: dropped } })).body.status).toBe("cancelled");
    const big = await planned(code, day(4), "40"); // 80 g, of which 90 - 20 - 20 = 50 g can be held

    const range = { kitchen: K(0), from: day(0), to: day(6) };
    const key = randomUUID();
    const once = await post(reserveAllRoute, "/api/batches/reserve-all", range, "kitchen_lead", { idempotencyKey: key });
    expect(once.status, JSON.stringify(once.body)).toBe(200);
    expect(once.body.counts).toEqual({ reserved: 2, alreadyReserved: 0, short: 1, skipped: 2 });
    expect(once.body.batches.map((b: { batchId: string; outcome: string; status: string; reserved: boolean }) => [b.batchId, b.outcome, b.status, b.reserved])).toEqual([
      [made, "skipped", "produced", false],
      [first, "reserved", "reserved", true],
      [second, "reserved", "reserved", true],
      [dropped, "skipped", "cancelled", false],
      [big, "short", "planned", false],
    ]);
    expect(once.body.batches.every((b: { recipeCode: string }) => b.recipeCode === code)).toBe(true);
    expect(once.body.batches.map((b: { plannedFor: string }) => b.plannedFor)).toEqual([day(2), day(2), day(3), day(3), day(4)]);
    expect(once.body.batches[4].short).toEqual([{ position: 1, sku: spice.body.sku, needed: "80", available: "50", unit: "g" }]);
    expect(once.body.batches.slice(0, 4).every((b: { short: unknown[] }) => b.short.length === 0)).toBe(true);

    const held = async () => ({
      balance: (await db()("stock_balances").where({ kitchen_id: co.kitchens[0]!.id, lot_id: lotId }).first("on_hand", "reserved")) as { on_hand: string; reserved: string },
      reservations: await db()("reservations").where({ company_id: co.company.id }).orderBy("id").select("id", "batch_id", "lot_id", "quantity"),
      movements: Number((await db()("stock_movements").where({ company_id: co.company.id }).count<{ n: string }[]>("* as n"))[0]!.n),
    });
    const after = await held();
    expect(Number(after.balance.reserved)).toBe(40);
    expect(Number(after.balance.on_hand)).toBe(90);
    expect(after.reservations.map((r: { batch_id: string }) => r.batch_id).sort()).toEqual([first, second].sort());

    // a second click (a new key): the two are already reserved, nothing is held or posted again
    const twice = await post(reserveAllRoute, "/api/batches/reserve-all", range, "kitchen_lead", { idempotencyKey: randomUUID() });
    expect(twice.status).toBe(200);
    expect(twice.body.counts).toEqual({ reserved: 0, alreadyReserved: 2, short: 1, skipped: 2 });
    expect(twice.body.batches.map((b: { outcome: string }) => b.outcome)).toEqual(["skipped", "already_reserved", "already_reserved", "skipped", "short"]);
    expect(twice.body.batches[1]).toMatchObject({ batchId: first, status: "reserved", reserved: true, short: [] });
    expect(await held()).toEqual(after);

    // the first key again: the first answer, replayed
    const replay = await post(reserveAllRoute, "/api/batches/reserve-all", range, "kitchen_lead", { idempotencyKey: key });
    expect(replay.body).toEqual(once.body);
    expect(await held()).toEqual(after);
    expect(await ledgerMismatches(co.company.id)).toEqual([]);

    // another kitchen's lead may not reserve here
    expect((await post(reserveAllRoute, "/api/batches/reserve-all", range, "lead2")).status).toBe(403);
  });
});
