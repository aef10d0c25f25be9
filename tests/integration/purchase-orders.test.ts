// Purchase orders through their endpoints: a buyer drafts an order for a supplier and a delivery
// kitchen, changes it, approves it up to the company's threshold (a manager above it), sends it
// (one e-mail to the supplier's order address with the PDF and CSV, through the real outbox,
// worker and SMTP catcher), cancels or closes it short. Money is exact: line total = packs x pack
// price rounded half-even once to the currency's decimals (DEVELOPERS.md "Money on documents";
// lib/purchasing/order-money.ts), order total = the sum of the line totals.
import { createHash, randomUUID } from "node:crypto";
import { readFile } from "node:fs/promises";
import { join } from "node:path";
import Papa from "papaparse";
import { beforeAll, describe, expect, it } from "vitest";
import { PATCH as companyPatch } from "../../app/api/company/route";
import { POST as approveRoute } from "../../app/api/purchase-orders/[id]/approve/route";
import { POST as cancelRoute } from "../../app/api/purchase-orders/[id]/cancel/route";
import { POST as closeRoute } from "../../app/api/purchase-orders/[id]/close/route";
import { GET as csvRoute } from "../../app/api/purchase-orders/[id]/csv/route";
import { GET as pdfRoute } from "../../app/api/purchase-orders/[id]/pdf/route";
import { GET as getRoute, PATCH as patchRoute } from "../../app/api/purchase-orders/[id]/route";
import { POST as sendRoute } from "../../app/api/purchase-orders/[id]/send/route";
import { GET as listRoute, POST as createRoute } from "../../app/api/purchase-orders/route";
import { db } from "../../db/client";
import type { Role } from "../../db/types";
import { createCompany, tag, uniqueEmail, type TestCompany } from "../support/factory";
import { buildRequest, call } from "../support/http";
import { listMail, waitForMail } from "../support/mail";
import { sessionCookieFor } from "../support/sessions";
import { createItem, type TestItem } from "../support/stock";

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const daysFromToday = (n: number) => new Date(Date.now() + n * 86_400_000).toISOString().slice(0, 10);
const sha = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");

interface TestSupplier {
  id: string;
  name: string;
  orderEmail: string | null;
}

/** A supplier straight into the table (this suite tests orders, not the supplier endpoints). */
async function supplier(companyId: string, opts: { orderEmail?: string | null; active?: boolean } = {}): Promise<TestSupplier> {
  const name = `Supplier ${tag()}`;
  const orderEmail = opts.orderEmail === undefined ? uniqueEmail("orders") : opts.orderEmail;
  const [row] = await db()("suppliers")
    .insert({ company_id: companyId, name, contact_name: "Rowan Vale", order_email: orderEmail, lead_time_days: 3, active: opts.active ?? true })
    .returning<{ id: string }[]>("id");
  return { id: row!.id, name, orderEmail };
}

/** A supplier item with its price history: [pack price, effective from] pairs. */
async function supplierItem(
  companyId: string, supplierId: string, item: TestItem,
  opts: { packLabel: string; packSizeStock: string; prices?: [string, string][]; active?: boolean; description?: string },
): Promise<string> {
  const [row] = await db()("supplier_items")
    .insert({
      company_id: companyId, supplier_id: supplierId, item_id: item.id, sku: `SI-${tag()}`.toUpperCase(), description: opts.description ?? "",
      pack_label: opts.packLabel, pack_quantity: "1", pack_unit: opts.packLabel, pack_size_stock: opts.packSizeStock, active: opts.active ?? true,
    })
    .returning<{ id: string }[]>("id");
  for (const [price, from] of opts.prices ?? []) {
    await db()("supplier_item_prices").insert({ company_id: companyId, supplier_item_id: row!.id, pack_price: price, effective_from: from });
  }
  return row!.id;
}

let co: TestCompany;
let other: TestCompany;
const cookie = {} as Record<Role, string>;
let otherBuyer: string;
let spice: TestItem;
let casing: TestItem;
let alder: TestSupplier; // the main supplier
let bram: TestSupplier; // a second supplier
let silent: TestSupplier; // no order e-mail
let bag: string; // alder: 1 kg bag of the spice, current price 12.50
let bundle: string; // alder: bundle of 5 hanks, current price 189.50
let unpriced: string; // alder: no price known
let switchedOff: string; // alder: inactive
let bramBag: string; // bram's item
let silentBag: string;

beforeAll(async () => {
  [co, other] = await Promise.all([createCompany({ kitchens: 2 }), createCompany({ kitchens: 1 })]);
  for (const role of ["admin", "manager", "buyer", "kitchen_lead", "accountant"] as Role[]) cookie[role] = await sessionCookieFor(co.users[role].id);
  otherBuyer = await sessionCookieFor(other.users.buyer.id);
  spice = await createItem(co.company.id, { category: "spice" });
  casing = await createItem(co.company.id, { category: "casing" });
  alder = await supplier(co.company.id);
  bram = await supplier(co.company.id);
  silent = await supplier(co.company.id, { orderEmail: null });
  // price history: the current price is the latest effective on or before today; a future one is not yet
  bag = await supplierItem(co.company.id, alder.id, spice, {
    packLabel: "1 kg bag", packSizeStock: "1000", description: "Smoked paprika, hot",
    prices: [["10.00", daysFromToday(-40)], ["12.50", daysFromToday(-2)], ["99.00", daysFromToday(20)]],
  });
  bundle = await supplierItem(co.company.id, alder.id, casing, { packLabel: "bundle of 5 hanks", packSizeStock: "5", prices: [["189.50", daysFromToday(-10)]] });
  unpriced = await supplierItem(co.company.id, alder.id, casing, { packLabel: "hank", packSizeStock: "1" });
  switchedOff = await supplierItem(co.company.id, alder.id, spice, { packLabel: "500 g tub", packSizeStock: "500", prices: [["7.00", daysFromToday(-5)]], active: false });
  bramBag = await supplierItem(co.company.id, bram.id, spice, { packLabel: "1 kg bag", packSizeStock: "1000", prices: [["11.00", daysFromToday(-5)]] });
  silentBag = await supplierItem(co.company.id, silent.id, spice, { packLabel: "1 kg bag", packSizeStock: "1000", prices: [["11.00", daysFromToday(-5)]] });
});

const create = (who: string, body: unknown, idempotencyKey?: string) => call(createRoute, { path: "/api/purchase-orders", cookie: who, body, idempotencyKey });
const get = (who: string, id: string) => call(getRoute, { path: `/api/purchase-orders/${id}`, params: { id }, cookie: who });
const patch = (who: string, id: string, body: unknown) => call(patchRoute, { method: "PATCH", path: `/api/purchase-orders/${id}`, params: { id }, cookie: who, body });
const step = (route: typeof approveRoute, name: string) => (who: string, id: string, body?: unknown, idempotencyKey?: string) =>
  call(route, { method: "POST", path: `/api/purchase-orders/${id}/${name}`, params: { id }, cookie: who, body, idempotencyKey });
const approve = step(approveRoute, "approve");
const send = step(sendRoute, "send");
const close = step(closeRoute, "close");
const cancel = step(cancelRoute, "cancel");
const list = (who: string, query = "") => call(listRoute, { path: `/api/purchase-orders${query}`, cookie: who });

/** A file download through the route wrapper: status, headers and the bytes. */
async function download(route: typeof pdfRoute, who: string, id: string, kind: "pdf" | "csv") {
  const res = await route(buildRequest({ path: `/api/purchase-orders/${id}/${kind}`, cookie: who }), { params: Promise.resolve({ id }) });
  return { status: res.status, headers: res.headers, bytes: new Uint8Array(await res.arrayBuffer()) };
}

/** A draft for alder at the first kitchen, by the buyer unless said otherwise. */
async function draft(lines: unknown[], extra: Record<string, unknown> = {}, who = cookie.buyer) {
  const r = await create(who, { supplier: alder.id, kitchen: co.kitchens[0]!.code, lines, ...extra });
  expect(r.status, JSON.stringify(r.body)).toBe(201);
  return r.body as { id: string; number: string; total: string; status: string; lines: Record<string, unknown>[] };
}

describe("drafting an order", () => {
  it("takes the current price unless one is sent, and works out the totals exactly", async () => {
    const r = await create(cookie.buyer, {
      supplier: alder.id, kitchen: co.kitchens[0]!.id, deliverBy: daysFromToday(5), notes: "Deliver before 10:00.",
      lines: [{ supplierItem: bag, packs: "3" }, { supplierItem: bundle, packs: "2", packPrice: "189.5" }],
    }, randomUUID());
    expect(r.status).toBe(201);
    expect(r.body).toMatchObject({
      status: "draft", statusLabel: "Draft", currency: "EUR", deliverBy: daysFromToday(5), notes: "Deliver before 10:00.",
      supplier: { id: alder.id, name: alder.name, orderEmail: alder.orderEmail }, kitchen: { id: co.kitchens[0]!.id, code: co.kitchens[0]!.code },
      // 3 x 12.50 = 37.50 and 2 x 189.50 = 379.00 -> 416.50
      total: "416.50", approvalThreshold: "500.00", needsManager: false,
      allowed: { edit: true, approve: true, send: false, closeShort: false, cancel: true },
    });
    expect(r.body.number).toMatch(/^PO-\d{4}-\d{4}$/);
    expect(r.body.lines).toEqual([
      expect.objectContaining({ lineNo: 1, supplierItemId: bag, description: "Smoked paprika, hot", packLabel: "1 kg bag", packs: "3", packSizeStock: "1000", orderedStock: "3000", receivedStock: "0", outstandingStock: "3000", packPrice: "12.50", lineTotal: "37.50", item: expect.objectContaining({ sku: spice.sku, stockUnit: "g", putUp: null }) }),
      // a hank is one pc of a casing stocked in put-ups: 2 bundles of 5 hanks are 10 pc (trade-facts §4: a hank is 100 yd = 91.44 m)
      expect.objectContaining({ lineNo: 2, packs: "2", orderedStock: "10", packPrice: "189.50", lineTotal: "379.00", item: expect.objectContaining({ putUp: { name: "hank", metres: "91.44" } }) }),
    ]);
    expect(r.body.history).toEqual([expect.objectContaining({ step: "created", by: co.users.buyer.name, note: null })]);
  });

  it("rounds each line once, half-even, to the currency's cents", async () => {
    // 1 x 2.345 = 2.345 -> 2.34 (half-even keeps the even digit); 3 x 0.0050 = 0.015 -> 0.02; 7 x 1.2345 = 8.6415 -> 8.64
    const o = await draft([{ supplierItem: bag, packs: "1", packPrice: "2.345" }, { supplierItem: bundle, packs: "3", packPrice: "0.0050" }, { supplierItem: unpriced, packs: "7", packPrice: "1.2345" }]);
    expect(o.lines.map((l) => [l.packPrice, l.lineTotal])).toEqual([["2.345", "2.34"], ["0.005", "0.02"], ["1.2345", "8.64"]]);
    expect(o.total).toBe("11.00");
    expect(await db()("purchase_orders").where({ id: o.id }).first("total")).toEqual({ total: "11.0000" });
  });

  it("numbers orders per company and year without gaps or repeats, also when drafted at once", async () => {
    const made = await Promise.all(Array.from({ length: 6 }, () => create(cookie.buyer, { supplier: alder.id, kitchen: co.kitchens[1]!.code, lines: [{ supplierItem: bag, packs: "1" }] })));
    expect(made.map((r) => r.status)).toEqual([201, 201, 201, 201, 201, 201]);
    const numbers = made.map((r) => r.body.number as string).sort();
    expect(new Set(numbers).size).toBe(6);
    const seq = numbers.map((n) => Number(n.split("-")[2]));
    expect(seq.at(-1)! - seq[0]!).toBe(5);
    // another company starts at 1
    const theirs = await db()("purchase_order_numbers").where({ company_id: other.company.id }).first();
    expect(theirs).toBeUndefined();
  });

  it("refuses what cannot be ordered, naming each field and line", async () => {
    const bad = await create(cookie.buyer, {
      supplier: alder.id, kitchen: co.kitchens[0]!.code,
      lines: [{ supplierItem: bag, packs: "2.5" }, { supplierItem: bundle, packs: "0" }, { supplierItem: bag, packs: 3 }],
    });
    expect(bad.status).toBe(422);
    expect(bad.body.error.details.fields["lines.0.packs"]).toEqual(["Order whole packs, e.g. \"3\": suppliers sell these items by the pack."]);
    expect(bad.body.error.details.fields["lines.1.packs"]).toEqual(["Order at least one pack."]);
    expect(bad.body.error.details.fields).toHaveProperty(["lines.2.packs"]); // a JSON number is refused

    const wrong = await create(cookie.buyer, {
      supplier: alder.id, kitchen: co.kitchens[0]!.code,
      lines: [{ supplierItem: bramBag, packs: "1" }, { supplierItem: switchedOff, packs: "1" }, { supplierItem: unpriced, packs: "1" }, { supplierItem: bag, packs: "1" }, { supplierItem: bag, packs: "2" }],
    });
    expect(wrong.status).toBe(422);
    expect(wrong.body.error.details.fields).toEqual({
      "lines.0.supplierItem": [`Not an item of ${alder.name}: choose from its items.`],
      "lines.1.supplierItem": [expect.stringContaining("is switched off")],
      "lines.2.packPrice": [expect.stringContaining("has no current price: enter the pack price.")],
      "lines.4.supplierItem": ["Already on line 4: change its packs instead."],
    });

    const past = await create(cookie.buyer, { supplier: alder.id, kitchen: co.kitchens[0]!.code, deliverBy: daysFromToday(-3), lines: [{ supplierItem: bag, packs: "1" }] });
    expect(past.status).toBe(422);
    expect(past.body.error.details.fields).toHaveProperty("deliverBy");
    const theirSupplier = await supplier(other.company.id);
    const foreign = await create(cookie.buyer, { supplier: theirSupplier.id, kitchen: co.kitchens[0]!.code, lines: [{ supplierItem: bag, packs: "1" }] });
    expect(foreign.status).toBe(422);
    expect(foreign.body.error.details.fields).toHaveProperty("supplier");
    const theirKitchen = await create(cookie.buyer, { supplier: alder.id, kitchen: other.kitchens[0]!.id, lines: [{ supplierItem: bag, packs: "1" }] });
    expect(theirKitchen.status).toBe(422);
    expect(theirKitchen.body.error.details.fields).toHaveProperty("kitchen");
    expect((await create(cookie.buyer, { supplier: alder.id, kitchen: co.kitchens[0]!.code, lines: [] })).body.error.details.fields).toHaveProperty("lines");
  });

  it("replays a retried create with the same Idempotency-Key instead of drafting twice", async () => {
    const key = randomUUID();
    const body = { supplier: bram.id, kitchen: co.kitchens[0]!.code, lines: [{ supplierItem: bramBag, packs: "4" }] };
    const first = await create(cookie.buyer, body, key);
    const again = await create(cookie.buyer, body, key);
    expect(again).toMatchObject({ status: 201, body: { id: first.body.id, number: first.body.number } });
  });
});

describe("changing a draft", () => {
  it("replaces the lines and works the total out again; only while it is a draft", async () => {
    const o = await draft([{ supplierItem: bag, packs: "1" }]);
    const changed = await patch(cookie.buyer, o.id, { lines: [{ supplierItem: bundle, packs: "1" }, { supplierItem: bag, packs: "4", packPrice: "11.75" }], notes: "Ring at the yard gate.", kitchen: co.kitchens[1]!.code, deliverBy: null });
    expect(changed.status).toBe(200);
    expect(changed.body).toMatchObject({ total: "236.50", notes: "Ring at the yard gate.", kitchen: { code: co.kitchens[1]!.code }, deliverBy: null });
    expect(changed.body.lines.map((l: { lineNo: number; packs: string; lineTotal: string }) => [l.lineNo, l.packs, l.lineTotal])).toEqual([[1, "1", "189.50"], [2, "4", "47.00"]]);
    expect(await db()("purchase_order_lines").where({ order_id: o.id }).count<{ n: string }[]>("* as n")).toEqual([{ n: "2" }]);

    expect((await approve(cookie.buyer, o.id)).status).toBe(200);
    const late = await patch(cookie.buyer, o.id, { notes: "Too late" });
    expect(late.status).toBe(409);
    expect(late.body.error).toMatchObject({ code: "ORDER_STATUS", message: "An order that is approved cannot be changed.", details: { status: "approved" } });
  });
});

describe("listing orders", () => {
  it("filters by status, supplier and delivery kitchen, a page at a time, newest first", async () => {
    const k2 = co.kitchens[1]!.code;
    const mine = await create(cookie.buyer, { supplier: bram.id, kitchen: k2, lines: [{ supplierItem: bramBag, packs: "1" }] });
    const all = await list(cookie.accountant, `?supplier=${bram.id}&kitchen=${k2}`);
    expect(all.status).toBe(200);
    expect(all.body.orders[0]).toMatchObject({ id: mine.body.id, status: "draft", supplier: { id: bram.id, name: bram.name }, kitchen: { code: k2 }, total: "11.00", lineCount: 1, createdBy: co.users.buyer.name, sentAt: null });
    expect(all.body.orders.every((o: { supplier: { id: string } }) => o.supplier.id === bram.id)).toBe(true);

    const page1 = await list(cookie.buyer, "?perPage=2&page=1");
    const page2 = await list(cookie.buyer, "?perPage=2&page=2");
    expect(page1.body).toMatchObject({ page: 1, perPage: 2 });
    expect(page1.body.total).toBeGreaterThan(4);
    expect(page1.body.orders).toHaveLength(2);
    expect(page2.body.orders.map((o: { id: string }) => o.id)).not.toContain(page1.body.orders[0].id);
    expect(page1.body.orders[0].createdAt >= page2.body.orders[0].createdAt).toBe(true);

    const approved = await list(cookie.buyer, "?status=approved&perPage=100");
    expect(approved.body.orders.length).toBeGreaterThan(0);
    expect(approved.body.orders.every((o: { status: string }) => o.status === "approved")).toBe(true);
    expect((await list(cookie.buyer, "?status=shipped")).status).toBe(422);
    expect((await list(cookie.buyer, "?perPage=1000")).status).toBe(422);
  });
});

describe("who may do what", () => {
  it("kitchen leads and accountants cannot draft; accountants read, kitchen leads do not", async () => {
    const body = { supplier: alder.id, kitchen: co.kitchens[0]!.code, lines: [{ supplierItem: bag, packs: "1" }] };
    for (const role of ["kitchen_lead", "accountant"] as Role[]) {
      const r = await create(cookie[role], body);
      expect(r.status, role).toBe(403);
      expect(r.body.error.code).toBe("FORBIDDEN");
    }
    for (const role of ["admin", "manager", "buyer"] as Role[]) expect((await create(cookie[role], body)).status, role).toBe(201);
    const o = await draft([{ supplierItem: bag, packs: "1" }]);
    expect((await get(cookie.accountant, o.id)).body).toMatchObject({ id: o.id, allowed: { edit: false, approve: false, send: false, closeShort: false, cancel: false } });
    expect((await list(cookie.accountant)).status).toBe(200);
    expect((await get(cookie.kitchen_lead, o.id)).status).toBe(403);
    expect((await list(cookie.kitchen_lead)).status).toBe(403);
    expect((await approve(cookie.accountant, o.id)).status).toBe(403);
    expect((await approve(cookie.kitchen_lead, o.id)).status).toBe(403);
    expect((await cancel(cookie.accountant, o.id, { reason: "No" })).status).toBe(403);
    expect((await patch(cookie.kitchen_lead, o.id, { notes: "x" })).status).toBe(403);
  });
});

describe("approving", () => {
  it("a buyer approves up to the threshold; above it the buyer is refused, naming it, and a manager approves", async () => {
    const small = await draft([{ supplierItem: bundle, packs: "2" }, { supplierItem: bag, packs: "9" }]); // 379.00 + 112.50 = 491.50
    expect((await approve(cookie.buyer, small.id)).body).toMatchObject({ status: "approved", total: "491.50" });
    // exactly the threshold is still the buyer's
    const edge = await draft([{ supplierItem: bundle, packs: "2" }, { supplierItem: bag, packs: "11", packPrice: "11.00" }]); // 379.00 + 121.00 = 500.00
    expect(edge.total).toBe("500.00");
    expect((await approve(cookie.buyer, edge.id)).status).toBe(200);

    const big = await draft([{ supplierItem: bundle, packs: "2" }, { supplierItem: bag, packs: "11", packPrice: "11.01" }]); // 379.00 + 121.11 = 500.11
    const refused = await approve(cookie.buyer, big.id);
    expect(refused.status).toBe(403);
    expect(refused.body.error.message).toBe("This order comes to 500.11 EUR, above the approval threshold of 500.00 EUR: a manager must approve it.");
    expect((await get(cookie.buyer, big.id)).body).toMatchObject({ status: "draft", needsManager: true, allowed: { approve: false } });
    expect((await get(cookie.manager, big.id)).body.allowed.approve).toBe(true);
    const byManager = await approve(cookie.manager, big.id);
    expect(byManager.body).toMatchObject({ status: "approved" });
    expect(byManager.body.history.map((h: { step: string; by: string }) => [h.step, h.by])).toEqual([["created", co.users.buyer.name], ["approved", co.users.manager.name]]);
  });

  it("follows the threshold an admin sets for the company (PATCH /api/company)", async () => {
    const big = await draft([{ supplierItem: bundle, packs: "4" }]); // 758.00
    expect((await approve(cookie.buyer, big.id)).status).toBe(403);
    const company = { name: co.company.name, timeZone: "Europe/London", currency: "EUR" };
    const tooFine = await call(companyPatch, { method: "PATCH", path: "/api/company", cookie: cookie.admin, body: { ...company, approvalThreshold: "800.005" } });
    expect(tooFine.status).toBe(422);
    expect(tooFine.body.error.details.fields.approvalThreshold).toEqual(["EUR has 2 decimals: enter at most 2."]);
    expect((await call(companyPatch, { method: "PATCH", path: "/api/company", cookie: cookie.manager, body: { ...company, approvalThreshold: "800" } })).status).toBe(403);
    const set = await call(companyPatch, { method: "PATCH", path: "/api/company", cookie: cookie.admin, body: { ...company, approvalThreshold: "800" } });
    expect(set.body).toMatchObject({ approvalThreshold: "800.00" });
    try {
      expect((await approve(cookie.buyer, big.id)).body.status).toBe("approved");
    } finally {
      await db()("companies").where({ id: co.company.id }).update({ approval_threshold: "500" });
    }
  });

  it("two approvals at once: one succeeds, the other finds it approved", async () => {
    const o = await draft([{ supplierItem: bag, packs: "2" }]);
    const results = await Promise.all([approve(cookie.manager, o.id, undefined, randomUUID()), approve(cookie.admin, o.id, undefined, randomUUID())]);
    expect(results.map((r) => r.status).sort()).toEqual([200, 409]);
    expect(results.find((r) => r.status === 409)!.body.error.code).toBe("ORDER_STATUS");
    const after = await get(cookie.buyer, o.id);
    expect(after.body.history.filter((h: { step: string }) => h.step === "approved")).toHaveLength(1);
  });
});

describe("sending to the supplier", () => {
  it("e-mails the supplier's order address once, with the order as PDF and CSV; sending again is refused", async () => {
    const o = await draft([{ supplierItem: bag, packs: "3" }, { supplierItem: bundle, packs: "2" }], { deliverBy: daysFromToday(6), notes: "Keep cure apart from salt." });
    expect((await send(cookie.buyer, o.id)).status).toBe(409); // a draft is approved first
    await approve(cookie.buyer, o.id);
    const key = randomUUID();
    const sent = await send(cookie.buyer, o.id, undefined, key);
    expect(sent.status).toBe(200);
    expect(sent.body).toMatchObject({ status: "sent", statusLabel: "Sent to supplier", allowed: { send: false, cancel: true, closeShort: true, approve: false, edit: false } });
    expect(sent.body.history.at(-1)).toMatchObject({ step: "sent", by: co.users.buyer.name, note: `To ${alder.orderEmail}` });

    const mail = await waitForMail({ to: alder.orderEmail!, subjectIncludes: o.number, timeoutMs: 15_000 });
    expect(mail.subject).toBe(`Purchase order ${o.number} from ${co.company.name}`);
    expect(mail.companyId).toBe(co.company.id);
    expect(mail.text).toContain("Hello Rowan Vale,");
    expect(mail.text).toContain("2 lines, 416.50 EUR in total");
    expect(mail.text).toContain(`Needed by ${daysFromToday(6)}.`);
    expect(mail.attachments.map((a) => [a.filename, a.contentType])).toEqual([[`${o.number}.pdf`, "application/pdf"], [`${o.number}.csv`, "text/csv"]]);

    // the PDF is the one the order page downloads, byte for byte
    const pdf = await download(pdfRoute, cookie.accountant, o.id, "pdf");
    expect(pdf.status).toBe(200);
    expect(pdf.headers.get("content-type")).toBe("application/pdf");
    expect(pdf.headers.get("content-disposition")).toBe(`attachment; filename="${o.number}.pdf"`);
    expect(Buffer.from(pdf.bytes.subarray(0, 5)).toString()).toBe("%PDF-");
    expect(mail.attachments[0]!.sha256).toBe(sha(pdf.bytes));
    // the CSV parses back (papaparse) with the order's lines
    const csvText = await readFile(join(process.env.MAIL_DIR!, mail.attachments[1]!.file), "utf8");
    const rows = Papa.parse<Record<string, string>>(csvText, { header: true, skipEmptyLines: true });
    expect(rows.errors).toEqual([]);
    expect(rows.data.map((r) => [r.order_number, r.line, r.pack, r.packs, r.pack_price, r.line_total, r.currency, r.deliver_by])).toEqual([
      [o.number, "1", "1 kg bag", "3", "12.50", "37.50", "EUR", daysFromToday(6)],
      [o.number, "2", "bundle of 5 hanks", "2", "189.50", "379.00", "EUR", daysFromToday(6)],
    ]);
    const csv = await download(csvRoute, cookie.buyer, o.id, "csv");
    expect(Buffer.from(csv.bytes).toString("utf8")).toBe(csvText);

    // again: refused, nothing more sent; the same key replays the first answer
    const again = await send(cookie.buyer, o.id, undefined, randomUUID());
    expect(again.status).toBe(409);
    expect(again.body.error).toMatchObject({ code: "ORDER_STATUS", message: "An order that is sent to supplier cannot be sent." });
    const replay = await send(cookie.buyer, o.id, undefined, key);
    expect(replay).toMatchObject({ status: 200, body: { id: o.id, status: "sent" } });
    await sleep(2500); // longer than a sweep of the worker (1 s under db/test.sh)
    expect(await listMail({ to: alder.orderEmail!, subjectIncludes: `Purchase order ${o.number}` })).toHaveLength(1);
    expect(await db()("outbox_emails").whereRaw("? = any(to_addresses)", [alder.orderEmail]).where("subject", "like", `%${o.number}%`).count<{ n: string }[]>("* as n")).toEqual([{ n: "1" }]);
  });

  it("two sends at once: one e-mail", async () => {
    const o = await draft([{ supplierItem: bag, packs: "1" }]);
    await approve(cookie.buyer, o.id);
    const results = await Promise.all([send(cookie.buyer, o.id, undefined, randomUUID()), send(cookie.manager, o.id, undefined, randomUUID())]);
    expect(results.map((r) => r.status).sort()).toEqual([200, 409]);
    await waitForMail({ to: alder.orderEmail!, subjectIncludes: o.number, timeoutMs: 15_000 });
    await sleep(1500);
    expect(await listMail({ to: alder.orderEmail!, subjectIncludes: o.number })).toHaveLength(1);
  });

  it("needs the supplier's order e-mail address", async () => {
    const r = await create(cookie.buyer, { supplier: silent.id, kitchen: co.kitchens[0]!.code, lines: [{ supplierItem: silentBag, packs: "1" }] });
    await approve(cookie.buyer, r.body.id);
    const refused = await send(cookie.buyer, r.body.id);
    expect(refused.status).toBe(422);
    expect(refused.body.error.details.fields["supplier.orderEmail"]).toEqual([`${silent.name} has no order e-mail address: add one to the supplier, then send.`]);
    expect((await get(cookie.buyer, r.body.id)).body.status).toBe("approved");
  });
});

describe("cancelling and closing short", () => {
  it("cancelling a sent order e-mails the supplier the cancellation, with the reason", async () => {
    const o = await draft([{ supplierItem: bundle, packs: "1" }]);
    await approve(cookie.buyer, o.id);
    await send(cookie.buyer, o.id);
    await waitForMail({ to: alder.orderEmail!, subjectIncludes: `Purchase order ${o.number}`, timeoutMs: 15_000 });
    expect((await cancel(cookie.buyer, o.id, {})).status).toBe(422);
    const r = await cancel(cookie.buyer, o.id, { reason: "Ordered twice by mistake" }, randomUUID());
    expect(r.body).toMatchObject({ status: "cancelled", allowed: { cancel: false, closeShort: false } });
    expect(r.body.history.at(-1)).toMatchObject({ step: "cancelled", by: co.users.buyer.name, note: "Ordered twice by mistake" });
    const mail = await waitForMail({ to: alder.orderEmail!, subjectIncludes: `Cancelled: purchase order ${o.number}`, timeoutMs: 15_000 });
    expect(mail.text).toContain("Reason: Ordered twice by mistake");
    expect(mail.attachments).toEqual([]);
    expect((await cancel(cookie.buyer, o.id, { reason: "Again" })).status).toBe(409);
  });

  it("cancelling a draft tells nobody", async () => {
    const o = await draft([{ supplierItem: bag, packs: "1" }]);
    const r = await cancel(cookie.manager, o.id, { reason: "Not needed after all" });
    expect(r.body).toMatchObject({ status: "cancelled" });
    expect(await db()("purchase_orders").where({ id: o.id }).first("cancel_outbox_email_id")).toEqual({ cancel_outbox_email_id: null });
  });

  it("an order with goods received is closed short, not cancelled", async () => {
    const o = await draft([{ supplierItem: bag, packs: "3" }, { supplierItem: bundle, packs: "1" }]);
    expect((await close(cookie.buyer, o.id, { reason: "x" })).status).toBe(409); // a draft has nothing to close
    await approve(cookie.buyer, o.id);
    await send(cookie.buyer, o.id);
    // a delivery (a later task's endpoint) receives 2 of the 3 bags
    await db()("purchase_order_lines").where({ order_id: o.id, line_no: 1 }).update({ received_stock: "2000" });
    await db()("purchase_orders").where({ id: o.id }).update({ status: "partly_received" });
    const view = await get(cookie.buyer, o.id);
    expect(view.body.lines[0]).toMatchObject({ orderedStock: "3000", receivedStock: "2000", outstandingStock: "1000" });
    expect(view.body.allowed).toMatchObject({ cancel: false, closeShort: true });
    const refused = await cancel(cookie.buyer, o.id, { reason: "Too slow" });
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/close it short instead/);
    const closed = await close(cookie.buyer, o.id, { reason: "The last bag is discontinued" }, randomUUID());
    expect(closed.body).toMatchObject({ status: "closed_short", statusLabel: "Closed short" });
    expect(closed.body.history.at(-1)).toMatchObject({ step: "closed_short", note: "The last bag is discontinued" });
    expect((await close(cookie.buyer, o.id, { reason: "again" })).status).toBe(409);
  });
});

describe("tenancy", () => {
  it("another company's order is 404 everywhere, and never listed", async () => {
    const o = await draft([{ supplierItem: bag, packs: "1" }]);
    expect((await get(otherBuyer, o.id)).status).toBe(404);
    expect((await patch(otherBuyer, o.id, { notes: "x" })).status).toBe(404);
    for (const fn of [approve, send]) expect((await fn(otherBuyer, o.id)).status).toBe(404);
    expect((await cancel(otherBuyer, o.id, { reason: "x" })).status).toBe(404);
    expect((await close(otherBuyer, o.id, { reason: "x" })).status).toBe(404);
    expect((await download(pdfRoute, otherBuyer, o.id, "pdf")).status).toBe(404);
    expect((await download(csvRoute, otherBuyer, o.id, "csv")).status).toBe(404);
    expect((await list(otherBuyer, "?perPage=100")).body.orders.map((x: { id: string }) => x.id)).not.toContain(o.id);
    expect((await get(cookie.buyer, "not-a-uuid")).status).toBe(404);
    expect((await get(cookie.buyer, o.id)).body.status).toBe("draft");
  });
});
