// A batch's transfer suggestion asked for in one step: POST /api/transfer-requests naming the batch.
// The request shows on the batch's line while open; a second one for the same batch and item is
// refused (409 ALREADY_REQUESTED) also when two arrive at once; an Idempotency-Key replays the
// first. Quantities: a spice at 2 g/kg of meat block, so 20 kg of meat needs 40 g (plain arithmetic
// on the recipe's rate; no trade figure is involved).
import { randomUUID } from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as cancelRoute } from "../../app/api/batches/[id]/cancel/route";
import { POST as reserveRoute } from "../../app/api/batches/[id]/reserve/route";
import { GET as batchGet } from "../../app/api/batches/[id]/route";
import { POST as batchCreate } from "../../app/api/batches/route";
import { POST as itemCreate } from "../../app/api/items/route";
import { POST as moveRoute } from "../../app/api/movements/route";
import { POST as recipeCreate } from "../../app/api/recipes/route";
import { POST as declineRoute } from "../../app/api/transfer-requests/[id]/decline/route";
import { POST as fulfilRoute } from "../../app/api/transfer-requests/[id]/fulfil/route";
import { GET as listRoute, POST as requestRoute } from "../../app/api/transfer-requests/route";
import { db } from "../../db/client";
import { createCompany, createUser, tag, type TestCompany } from "../support/factory";
import { call } from "../support/http";
import { sessionCookieFor } from "../support/sessions";
import { createItem, ledgerMismatches } from "../support/stock";

let co: TestCompany;
let other: TestCompany;
const cookie: Record<string, string> = {};
const K = (i: number) => co.kitchens[i]!.code;
const day = (n: number) => new Date(Date.now() + n * 86400_000).toISOString().slice(0, 10);

beforeAll(async () => {
  [co, other] = await Promise.all([createCompany({ kitchens: 3 }), createCompany({ kitchens: 2 })]);
  for (const role of ["admin", "manager", "kitchen_lead", "accountant"] as const) cookie[role] = await sessionCookieFor(co.users[role].id);
  cookie.lead2 = await sessionCookieFor((await createUser(co.company.id, "kitchen_lead", { kitchenIds: [co.kitchens[1]!.id] })).id);
  cookie.other = await sessionCookieFor(other.users.admin.id);
});

const send = (handler: Parameters<typeof call>[0], path: string, body: unknown, who: string, extra: { params?: Record<string, string>; idempotencyKey?: string } = {}) =>
  call(handler, { path, body, cookie: cookie[who], ...extra });
const ask = (who: string, body: Record<string, unknown>, idempotencyKey?: string) => send(requestRoute, "/api/transfer-requests", body, who, { idempotencyKey });
const batchOf = async (id: string, who = "kitchen_lead") => (await call(batchGet, { path: `/api/batches/${id}`, params: { id }, cookie: cookie[who] })).body;
const openFor = async (batchId: string) => db()("transfer_requests").where({ batch_id: batchId, status: "open" }).select("id");

/** A spice with 10 g in the lead's kitchen and 1 kg in the second, and a 2 g/kg recipe of it. */
async function setUp() {
  const spice = await send(itemCreate, "/api/items", { sku: `SP-${tag().toUpperCase()}`, name: "Fenugreek", category: "spice", unit: "g", trackLots: false, trackDates: false }, "admin");
  expect(spice.status, JSON.stringify(spice.body)).toBe(201);
  for (const [kitchen, quantity] of [[K(0), "10"], [K(1), "1000"]] as const) {
    const r = await send(moveRoute, "/api/movements", { kind: "receipt", kitchen, item: spice.body.sku, quantity, unit: "g", lot: { unitCost: "0.02" } }, "admin");
    expect(r.status, JSON.stringify(r.body)).toBe(201);
  }
  const recipe = await send(recipeCreate, "/api/recipes", {
    code: `TR${tag().slice(0, 8).toUpperCase()}`, name: "Fenugreek link", productClass: "comminuted", storage: "keep_refrigerated",
    meatBlock: [{ name: "Lean pork", percent: "100" }], lines: [{ item: spice.body.sku, rate: "2", unit: "g/kg" }],
  }, "manager");
  expect(recipe.status, JSON.stringify(recipe.body)).toBe(201);
  return { spice: spice.body as { id: string; sku: string }, code: recipe.body.code as string };
}
async function plan(code: string, kitchen = K(0), who = "kitchen_lead") {
  const r = await send(batchCreate, "/api/batches", { kitchen, recipe: code, plannedFor: day(3), meatBlock: { quantity: "20", unit: "kg" } }, who);
  expect(r.status, JSON.stringify(r.body)).toBe(201);
  return r.body as { id: string; lines: { item: { id: string }; short: string | null; suggestions: unknown[]; openRequests: unknown[] }[] };
}
const askFor = (batchId: string, sku: string, over: Record<string, unknown> = {}) => ({
  batch: batchId, fromKitchen: K(1), toKitchen: K(0), item: sku, quantity: "30", unit: "g", note: "For the fenugreek batch", ...over,
});

describe("a transfer request for a batch's shortage", () => {
  it("is asked from the suggestion, shows on the batch's line, and is not asked twice", async () => {
    const { spice, code } = await setUp();
    const batch = await plan(code);
    // 40 g needed, 10 g here: 30 g short; the second kitchen has 1 kg and no par level or plans
    expect(batch.lines[0]).toMatchObject({ short: "30", suggestions: [{ kind: "transfer", kitchen: { code: K(1) }, quantity: "30" }], openRequests: [] });

    const key = randomUUID();
    const asked = await ask("kitchen_lead", askFor(batch.id, spice.sku), key);
    expect(asked.status, JSON.stringify(asked.body)).toBe(201);
    expect(asked.body).toMatchObject({ status: "open", batchId: batch.id, quantity: "30", fromKitchen: { code: K(1) }, toKitchen: { code: K(0) }, item: { id: spice.id }, note: "For the fenugreek batch" });
    // a double click with the same key: the same answer, one request
    const again = await ask("kitchen_lead", askFor(batch.id, spice.sku), key);
    expect(again).toMatchObject({ status: 201, body: { id: asked.body.id } });
    expect(await openFor(batch.id)).toHaveLength(1);

    const line = (await batchOf(batch.id)).lines[0];
    expect(line.short).toBe("30"); // asked, not yet here
    expect(line.openRequests).toEqual([{ id: asked.body.id, fromKitchen: { id: co.kitchens[1]!.id, code: K(1) }, quantity: "30", requestedAt: asked.body.requestedAt }]);
    // another request for the same batch and item (a new key, another tab, another source) while it is open
    for (const over of [{}, { fromKitchen: K(2) }, { quantity: "5" }]) {
      const dup = await ask("manager", askFor(batch.id, spice.sku, over), randomUUID());
      expect(dup.status).toBe(409);
      expect(dup.body.error.code).toBe("ALREADY_REQUESTED");
      expect(dup.body.error.details.request.id).toBe(asked.body.id);
    }
    expect(await openFor(batch.id)).toHaveLength(1);
    const listed = await call(listRoute, { path: `/api/transfer-requests?kitchen=${K(0)}&status=open`, cookie: cookie.kitchen_lead });
    expect(listed.body.requests.find((r: { id: string }) => r.id === asked.body.id)).toMatchObject({ batchId: batch.id });

    // the sending kitchen sends it: the line is no longer short or asked for, and the batch can be reserved
    const sent = await send(fulfilRoute, `/api/transfer-requests/${asked.body.id}/fulfil`, {}, "lead2", { params: { id: asked.body.id } });
    expect(sent.status, JSON.stringify(sent.body)).toBe(201);
    expect((await batchOf(batch.id)).lines[0]).toMatchObject({ short: null, openRequests: [] });
    expect((await send(reserveRoute, `/api/batches/${batch.id}/reserve`, undefined, "kitchen_lead", { params: { id: batch.id } })).status).toBe(200);
    expect(await ledgerMismatches(co.company.id)).toEqual([]);
  });

  it("two requests at once for the same batch and item: one is made, the other is 409", async () => {
    const { spice, code } = await setUp();
    const batch = await plan(code);
    const both = await Promise.all([0, 1, 2].map(() => ask("kitchen_lead", askFor(batch.id, spice.sku), randomUUID())));
    expect(both.map((r) => r.status).sort()).toEqual([201, 409, 409]);
    expect(both.filter((r) => r.status === 409).every((r) => r.body.error.code === "ALREADY_REQUESTED")).toBe(true);
    expect(await openFor(batch.id)).toHaveLength(1);
    // the database itself holds the line: a second open row for the batch and item is refused
    const row = await db()("transfer_requests").where({ batch_id: batch.id, status: "open" }).first();
    const { id: _id, ...copy } = row;
    await expect(db()("transfer_requests").insert(copy)).rejects.toMatchObject({ constraint: "transfer_requests_open_per_batch_item" });
  });

  it("once declined, the batch may ask again", async () => {
    const { spice, code } = await setUp();
    const batch = await plan(code);
    const asked = await ask("kitchen_lead", askFor(batch.id, spice.sku));
    const declined = await send(declineRoute, `/api/transfer-requests/${asked.body.id}/decline`, { reason: "Needed for our own smoking day" }, "lead2", { params: { id: asked.body.id } });
    expect(declined.body.status).toBe("declined");
    expect((await batchOf(batch.id)).lines[0].openRequests).toEqual([]);
    const anew = await ask("kitchen_lead", askFor(batch.id, spice.sku, { fromKitchen: K(2) }));
    expect(anew.status).toBe(201);
  });

  it("needs transfers.request for the batch's kitchen, and a batch, kitchen and item that belong together", async () => {
    const { spice, code } = await setUp();
    const batch = await plan(code);
    // an accountant reads the plan but may not ask; the other kitchen's lead may not ask for this one
    expect((await ask("accountant", askFor(batch.id, spice.sku))).status).toBe(403);
    expect((await ask("lead2", askFor(batch.id, spice.sku))).status).toBe(403);
    // the receiving kitchen is not the batch's
    const wrongKitchen = await ask("manager", askFor(batch.id, spice.sku, { toKitchen: K(2) }));
    expect(wrongKitchen.status).toBe(422);
    expect(Object.keys(wrongKitchen.body.error.details.fields)).toEqual(["batch"]);
    // an item the batch does not use
    const stranger = await send(itemCreate, "/api/items", { sku: `SP-${tag().toUpperCase()}`, name: "Caraway", category: "spice", unit: "g" }, "admin");
    const notOnIt = await ask("kitchen_lead", askFor(batch.id, stranger.body.sku));
    expect(notOnIt.status).toBe(422);
    expect(Object.keys(notOnIt.body.error.details.fields)).toEqual(["item"]);
    // not a batch id; another company's batch; a batch no longer planned
    const badId = await ask("kitchen_lead", askFor("not-a-batch", spice.sku));
    expect(badId.status).toBe(422);
    expect(Object.keys(badId.body.error.details.fields)).toEqual(["batch"]);
    expect((await ask("kitchen_lead", askFor(randomUUID(), spice.sku))).status).toBe(404);
    const cancelled = await plan(code);
    await send(cancelRoute, `/api/batches/${cancelled.id}/cancel`, undefined, "kitchen_lead", { params: { id: cancelled.id } });
    const late = await ask("kitchen_lead", askFor(cancelled.id, spice.sku));
    expect(late.status).toBe(422);
    expect(late.body.error.details.fields.batch[0]).toMatch(/cancelled/);
    expect(await db()("transfer_requests").whereIn("batch_id", [batch.id, cancelled.id]).count<{ n: string }[]>("* as n")).toEqual([{ n: "0" }]);
  });

  it("another company's batch is 404, even with that company's own kitchens and item", async () => {
    const { code } = await setUp();
    const batch = await plan(code);
    const theirs = await createItem(other.company.id, { category: "spice" });
    const r = await ask("other", { batch: batch.id, fromKitchen: other.kitchens[1]!.code, toKitchen: other.kitchens[0]!.code, item: theirs.sku, quantity: "1", unit: "g" });
    expect(r.status).toBe(404);
    expect(r.body.error.message).toBe("Batch not found.");
  });
});
