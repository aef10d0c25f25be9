// The price variance report (GET /api/reports/price-variance) against deliveries booked through
// their own endpoints (keyed in, accepted or rejected, posted), then dated into past months by
// moving deliveries.posted_at, the booking time the report reads. Figures are worked out by hand
// below (common practice: a pack price over the pack's size is the price per stock unit; the value
// of a price difference is the difference per unit x the quantity), money half-even to 2 decimals
// (EUR, ISO 4217 exponent 2) as lib/purchasing/order-money rounds order lines.
//
// The company keeps America/New_York time, so a delivery booked at 03:30 UTC on 1 February is
// 31 January there (UTC-5 in winter: IANA tz database) and counts in January.
//
// Alder (spices, grams; order PO-A: PAP-5KG 20 x 12.00 per 5 kg bag, PEP-1KG 10 x 8.00 per 1 kg bag;
// list: PAP-5KG 12.50 from 2026-01-01, 13.00 from 2026-01-15; FEN-1KG 10.00 from 2025-12-01; PEP none)
//   A-0  2025-12-31 23:00 local (2026-01-01 04:00Z): PAP 1 @ 12.00        -> December, outside the range
//   A-1  2026-01-10: PAP 10 @ 12.60 (on PO-A)
//   A-2  2026-01-20: PAP 2 @ 12.60 (on PO-A), PEP 4 @ 8.40 (on PO-A)
//   A-3  2026-01-31 22:30 local (2026-02-01 03:30Z): FEN 3 @ 9.99 (not on any order)
//   A-4  2026-02-05: PAP 1 @ 13.00 (on PO-A)
//   A-5  2026-04-02: PAP 1 @ 12.00                                        -> April, outside the range
//   a draft (never posted) with PAP 5 @ 99.00                            -> not booked, not counted
// Birch (casings in hanks and dextrose in grams; order PO-B: HOG-B5 4 x 189.50 per bundle of 5
// hanks, DEX-1KG 10 x 1.00 per 1 kg bag; list: HOG-B5 188.00 from 2025-12-01; DEX none)
//   B-1  2026-01-12: HOG 3 @ 190.00, DEX 5 @ 1.0010 (both on PO-B)
//   B-2  2026-01-25: DEX 5 @ 1.0010 (on PO-B), HOG 1 @ 500.00 rejected   -> the rejected line is not counted
import Papa from "papaparse";
import { beforeAll, describe, expect, it } from "vitest";
import { PATCH as linePatchRoute } from "../../app/api/deliveries/[id]/lines/[lineId]/route";
import { POST as postRoute } from "../../app/api/deliveries/[id]/post/route";
import { POST as keyedRoute } from "../../app/api/deliveries/keyed/route";
import { GET as reportRoute } from "../../app/api/reports/price-variance/route";
import { db } from "../../db/client";
import { ROLES } from "../../db/types";
import { priceVarianceColumns } from "../../lib/data/price-variance";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { buildRequest, call } from "../support/http";
import { sessionCookieFor } from "../support/sessions";
import { createItem } from "../support/stock";

let co: TestCompany;
let other: TestCompany;
const cookie: Record<string, string> = {};
let alder: { id: string; name: string; si: Record<string, string>; order: string };
let birch: { id: string; name: string; si: Record<string, string>; order: string };
const delivery: Record<string, string> = {};
let fennelName: string;

async function supplierWithOrder(name: string, items: { sku: string; itemId: string; label: string; size: string; packs?: string; price?: string }[]) {
  const [s] = await db()("suppliers").insert({ company_id: co.company.id, name, lead_time_days: 2 }).returning<{ id: string }[]>("id");
  const si: Record<string, string> = {};
  for (const it of items) {
    const [row] = await db()("supplier_items")
      .insert({
        company_id: co.company.id, supplier_id: s!.id, item_id: it.itemId, sku: it.sku, description: it.label, pack_label: it.label,
        pack_quantity: "1", pack_unit: it.label, pack_size_stock: it.size,
      })
      .returning<{ id: string }[]>("id");
    si[it.sku] = row!.id;
  }
  const ordered = items.filter((it) => it.packs);
  const [o] = await db()("purchase_orders")
    .insert({
      company_id: co.company.id, number: `PO-2026-${String(Math.floor(Math.random() * 90_000_000) + 10_000_000)}`, supplier_id: s!.id, kitchen_id: co.kitchens[0]!.id, status: "sent", total: "0",
      created_by: co.users.buyer.id, approved_by: co.users.buyer.id, approved_at: new Date(), sent_by: co.users.buyer.id, sent_at: new Date(),
    })
    .returning<{ id: string }[]>("id");
  for (const [i, it] of ordered.entries()) {
    await db()("purchase_order_lines").insert({
      company_id: co.company.id, order_id: o!.id, line_no: i + 1, supplier_item_id: si[it.sku], item_id: it.itemId, supplier_sku: it.sku,
      description: it.label, pack_label: it.label, packs: it.packs, pack_size_stock: it.size,
      quantity_stock: (BigInt(it.packs!) * BigInt(it.size)).toString(), pack_price: it.price, line_total: "0",
    });
  }
  return { id: s!.id, name, si, order: o!.id };
}

const listPrice = (supplierItemId: string, packPrice: string, from: string) =>
  db()("supplier_item_prices").insert({ company_id: co.company.id, supplier_item_id: supplierItemId, pack_price: packPrice, effective_from: from });

/** Keys a delivery in, decides each line, posts it (unless draft) and moves its booking time to `at`. */
async function book(
  s: { id: string },
  note: string,
  at: string,
  lines: { sku: string; quantity: string; unitPrice: string; reject?: true }[],
  opts: { order?: string; draft?: true } = {},
) {
  const made = await call(keyedRoute, {
    path: "/api/deliveries/keyed", cookie: cookie.buyer,
    body: { supplier: s.id, kitchen: co.kitchens[0]!.code, ...(opts.order ? { order: opts.order } : {}), noteNumber: note, lines: lines.map(({ reject: _r, ...l }) => l) },
  });
  expect(made.status, JSON.stringify(made.body)).toBe(201);
  const id = made.body.id as string;
  for (const [i, l] of (made.body.lines as { id: string }[]).entries()) {
    const r = await call(linePatchRoute, {
      method: "PATCH", path: `/api/deliveries/${id}/lines/${l.id}`, params: { id, lineId: l.id }, cookie: cookie.buyer,
      body: { decision: lines[i]!.reject ? "reject" : "accept" },
    });
    expect(r.status, JSON.stringify(r.body)).toBe(200);
  }
  if (!opts.draft) {
    const posted = await call(postRoute, { method: "POST", path: `/api/deliveries/${id}/post`, params: { id }, cookie: cookie.buyer });
    expect(posted.status, JSON.stringify(posted.body)).toBe(200);
    await db()("deliveries").where({ id }).update({ posted_at: new Date(at) });
  }
  delivery[note] = id;
  return id;
}

beforeAll(async () => {
  [co, other] = await Promise.all([createCompany({ timeZone: "America/New_York" }), createCompany({ timeZone: "America/New_York" })]);
  for (const role of ROLES) cookie[role] = await sessionCookieFor(co.users[role].id);
  cookie.otherAccountant = await sessionCookieFor(other.users.accountant.id);

  const paprika = await createItem(co.company.id, { category: "spice" }); // g
  const pepper = await createItem(co.company.id, { category: "spice" });
  const fennel = await createItem(co.company.id, { category: "spice" });
  const dextrose = await createItem(co.company.id, { category: "ingredient" });
  const hog = await createItem(co.company.id, { category: "casing" }); // pc = one hank of 91.44 m
  // a name a spreadsheet would run: the CSV neutralises it
  fennelName = `=SUM(A1:A2) fennel ${tag()}`;
  await db()("items").where({ id: fennel.id }).update({ name: fennelName });

  alder = await supplierWithOrder(`Alder Spice Co ${tag()}`, [
    { sku: "PAP-5KG", itemId: paprika.id, label: "5 kg bag", size: "5000", packs: "20", price: "12.00" },
    { sku: "PEP-1KG", itemId: pepper.id, label: "1 kg bag", size: "1000", packs: "10", price: "8.00" },
    { sku: "FEN-1KG", itemId: fennel.id, label: "1 kg bag", size: "1000" },
  ]);
  birch = await supplierWithOrder(`Birch Casings ${tag()}`, [
    { sku: "HOG-B5", itemId: hog.id, label: "bundle of 5 hanks", size: "5", packs: "4", price: "189.50" },
    { sku: "DEX-1KG", itemId: dextrose.id, label: "1 kg bag", size: "1000", packs: "10", price: "1.00" },
  ]);
  await listPrice(alder.si["PAP-5KG"]!, "12.50", "2026-01-01");
  await listPrice(alder.si["PAP-5KG"]!, "13.00", "2026-01-15"); // the mid-month change
  await listPrice(alder.si["FEN-1KG"]!, "10.00", "2025-12-01");
  await listPrice(birch.si["HOG-B5"]!, "188.00", "2025-12-01");

  // New York is UTC-5 in winter and UTC-4 from 8 March 2026 (US DST, second Sunday of March)
  await book(alder, `A-0-${tag()}`, "2026-01-01T04:00:00Z", [{ sku: "PAP-5KG", quantity: "1", unitPrice: "12.00" }], { order: alder.order });
  await book(alder, "A-1", "2026-01-10T15:00:00Z", [{ sku: "PAP-5KG", quantity: "10", unitPrice: "12.60" }], { order: alder.order });
  await book(alder, "A-2", "2026-01-20T15:00:00Z", [{ sku: "PAP-5KG", quantity: "2", unitPrice: "12.60" }, { sku: "PEP-1KG", quantity: "4", unitPrice: "8.40" }]);
  await book(alder, "A-3", "2026-02-01T03:30:00Z", [{ sku: "FEN-1KG", quantity: "3", unitPrice: "9.99" }]);
  await book(alder, "A-4", "2026-02-05T15:00:00Z", [{ sku: "PAP-5KG", quantity: "1", unitPrice: "13.00" }], { order: alder.order });
  await book(alder, "A-5", "2026-04-02T14:00:00Z", [{ sku: "PAP-5KG", quantity: "1", unitPrice: "12.00" }], { order: alder.order });
  await book(alder, "A-draft", "2026-01-11T15:00:00Z", [{ sku: "PAP-5KG", quantity: "5", unitPrice: "99.00" }], { order: alder.order, draft: true });
  await book(birch, "B-1", "2026-01-12T15:00:00Z", [{ sku: "HOG-B5", quantity: "3", unitPrice: "190.00" }, { sku: "DEX-1KG", quantity: "5", unitPrice: "1.0010" }], { order: birch.order });
  await book(birch, "B-2", "2026-01-25T15:00:00Z", [{ sku: "DEX-1KG", quantity: "5", unitPrice: "1.0010" }, { sku: "HOG-B5", quantity: "1", unitPrice: "500.00", reject: true }], { order: birch.order });
}, 60_000);

const report = (who: string, query: string) => call(reportRoute, { path: `/api/reports/price-variance?${query}`, cookie: cookie[who] });

async function csv(who: string, query: string) {
  const res = await reportRoute(buildRequest({ path: `/api/reports/price-variance?${query}&format=csv`, cookie: cookie[who] }), { params: Promise.resolve({}) });
  return { status: res.status, headers: res.headers, text: await res.text() };
}

type Row = Record<string, unknown>;
const line = (rows: Row[], note: string, sku: string) => rows.find((r) => r.noteNumber === note && r.supplierSku === sku)!;

describe("price variance, worked by hand", () => {
  it("each line compared per stock unit, with the value of the differences", async () => {
    const r = await report("accountant", "from=2026-01&to=2026-03");
    expect(r.status, JSON.stringify(r.body)).toBe(200);
    expect(r.body).toMatchObject({ from: "2026-01", to: "2026-03", supplier: null, currency: "EUR", timeZone: "America/New_York", rounding: "half-even", cureCaution: null });
    const rows = r.body.rows as Row[];
    // A-0 (31 Dec local), A-5 (April), the draft and B-2's rejected line are not there
    expect(rows.map((x) => `${x.noteNumber}/${x.supplierSku}`)).toEqual([
      "A-1/PAP-5KG", "A-2/PAP-5KG", "A-2/PEP-1KG", "A-3/FEN-1KG", "A-4/PAP-5KG", "B-1/HOG-B5", "B-1/DEX-1KG", "B-2/DEX-1KG",
    ]);

    // ordered 12.00 per 5 kg bag = 12.00 / 5000 g = 0.0024 per g (2.40 per kg); delivered 12.60 / 5000 =
    // 0.00252 per g (2.52 per kg); 10 bags = 50,000 g. Over order: (0.00252 - 0.0024) x 50,000 = 0.00012 x 50,000 = 6.00.
    // List on 10 Jan: 12.50 (from 1 Jan; 13.00 only from 15 Jan) = 0.0025 per g: (0.00252 - 0.0025) x 50,000 = 1.00.
    // Delivered value 0.00252 x 50,000 = 126.00.
    expect(line(rows, "A-1", "PAP-5KG")).toMatchObject({
      deliveredOn: "2026-01-10", month: "2026-01", supplierId: alder.id, supplierName: alder.name, kitchenCode: co.kitchens[0]!.code, stockUnit: "g",
      packLabel: "5 kg bag", packs: "10", deliveredPackPrice: "12.6", quantity: "50000", substitute: false,
      orderedUnitPrice: "0.002400", deliveredUnitPrice: "0.002520", listUnitPrice: "0.002500", listEffectiveFrom: "2026-01-01",
      buyingUnit: "kg", orderedPerBuyingUnit: "2.4000", deliveredPerBuyingUnit: "2.5200", listPerBuyingUnit: "2.5000",
      deliveredValue: "126.00", orderVariance: "6.00", listVariance: "1.00",
    });
    expect((line(rows, "A-1", "PAP-5KG").orderNumber as string).startsWith("PO-2026-")).toBe(true);

    // A-2 on 20 Jan, after the list moved to 13.00 on 15 Jan (the price on the delivery's day counts):
    // 2 bags = 10,000 g; over order 0.00012 x 10,000 = 1.20; list 13.00 / 5000 = 0.0026 per g:
    // (0.00252 - 0.0026) x 10,000 = -0.00008 x 10,000 = -0.80 (under the list). Value 0.00252 x 10,000 = 25.20.
    expect(line(rows, "A-2", "PAP-5KG")).toMatchObject({
      deliveredOn: "2026-01-20", listUnitPrice: "0.002600", listEffectiveFrom: "2026-01-15", listPerBuyingUnit: "2.6000",
      deliveredValue: "25.20", orderVariance: "1.20", listVariance: "-0.80",
    });
    // PEP: 8.00 vs 8.40 per 1 kg bag: 0.008 vs 0.0084 per g, 4 bags = 4000 g: 0.0004 x 4000 = 1.60; no list price: null.
    expect(line(rows, "A-2", "PEP-1KG")).toMatchObject({
      quantity: "4000", orderedUnitPrice: "0.008000", deliveredUnitPrice: "0.008400", listUnitPrice: null, listEffectiveFrom: null, listPerBuyingUnit: null,
      deliveredValue: "33.60", orderVariance: "1.60", listVariance: null,
    });
    // A-3 booked at 03:30 UTC on 1 Feb = 22:30 on 31 Jan in New York: January. Not on any order: null, never 0.
    // List 10.00 per kg bag = 0.01 per g; delivered 9.99 = 0.00999; 3000 g: -0.00001 x 3000 = -0.03. Value 29.97.
    expect(line(rows, "A-3", "FEN-1KG")).toMatchObject({
      deliveredOn: "2026-01-31", month: "2026-01", itemName: fennelName, orderNumber: null, orderedUnitPrice: null, orderedPerBuyingUnit: null,
      deliveredValue: "29.97", orderVariance: null, listVariance: "-0.03",
    });
    // A-4 in February: 13.00 vs ordered 12.00 per 5 kg: 0.0002 per g x 5000 = 1.00 over order; the list is 13.00
    // (from 15 Jan): a real 0.00, not null.
    expect(line(rows, "A-4", "PAP-5KG")).toMatchObject({ month: "2026-02", deliveredValue: "13.00", orderVariance: "1.00", listVariance: "0.00" });

    // Birch, hanks: 189.50 per bundle of 5 hanks = 37.90 per hank (one pc); delivered 190.00 = 38.00; 3 bundles = 15
    // hanks: 0.10 x 15 = 1.50 over order; list 188.00 / 5 = 37.60: 0.40 x 15 = 6.00; value 38.00 x 15 = 570.00.
    expect(line(rows, "B-1", "HOG-B5")).toMatchObject({
      stockUnit: "pc", quantity: "15", buyingUnit: "hank", orderedUnitPrice: "37.900000", deliveredUnitPrice: "38.000000", listUnitPrice: "37.600000",
      orderedPerBuyingUnit: "37.9000", deliveredValue: "570.00", orderVariance: "1.50", listVariance: "6.00",
    });
    // Dextrose: 1.00 vs 1.0010 per 1 kg bag: 0.001 vs 0.001001 per g; 5 bags = 5000 g: 0.000001 x 5000 = 0.005,
    // half-even to 0.00 (the 0 before the 5 is even; half-up would give 0.01). Value 0.001001 x 5000 = 5.005 -> 5.00.
    for (const note of ["B-1", "B-2"]) {
      expect(line(rows, note, "DEX-1KG")).toMatchObject({ deliveredUnitPrice: "0.001001", deliveredValue: "5.00", orderVariance: "0.00", listVariance: null });
    }
  });

  it("groups per supplier and month, totals from the exact line values, missing comparisons counted not added", async () => {
    const r = await report("manager", "from=2026-01&to=2026-03");
    expect(r.status).toBe(200);
    // Alder January: A-1, A-2 (2 lines), A-3.
    //   value 126.00 + 25.20 + 33.60 + 29.97 = 214.77
    //   order 6.00 + 1.20 + 1.60 = 8.80 over 3 lines; A-3 has no order (1)
    //   list 1.00 - 0.80 - 0.03 = 0.17 over 3 lines; PEP has no list price (1)
    // Alder February: A-4 only: 13.00, order 1.00, list 0.00.
    // Birch January: HOG and two DEX lines (the rejected HOG line of B-2 is not booked).
    //   value 570.00 + 5.005 + 5.005 = 580.01 (the exact values: the rounded lines would add to 580.00)
    //   order 1.50 + 0.005 + 0.005 = 1.51 over 3 (the rounded lines would give 1.50: rounded only at the end)
    //   list 6.00 over 1; the two DEX lines have no list price (2)
    expect(r.body.groups).toEqual([
      { supplierId: alder.id, supplierName: alder.name, month: "2026-01", lines: 4, deliveredValue: "214.77", orderVariance: "8.80", orderCompared: 3, withoutOrder: 1, listVariance: "0.17", listCompared: 3, withoutListPrice: 1 },
      { supplierId: alder.id, supplierName: alder.name, month: "2026-02", lines: 1, deliveredValue: "13.00", orderVariance: "1.00", orderCompared: 1, withoutOrder: 0, listVariance: "0.00", listCompared: 1, withoutListPrice: 0 },
      { supplierId: birch.id, supplierName: birch.name, month: "2026-01", lines: 3, deliveredValue: "580.01", orderVariance: "1.51", orderCompared: 3, withoutOrder: 0, listVariance: "6.00", listCompared: 1, withoutListPrice: 2 },
    ]);
    // everything: 214.77 + 13.00 + 580.01 = 807.78; order 8.80 + 1.00 + 1.51 = 11.31 over 7, 1 without;
    // list 0.17 + 0.00 + 6.00 = 6.17 over 5, 3 without
    expect(r.body.totals).toEqual({ lines: 8, deliveredValue: "807.78", orderVariance: "11.31", orderCompared: 7, withoutOrder: 1, listVariance: "6.17", listCompared: 5, withoutListPrice: 3 });
  });

  it("one supplier, one month, and a supplier with no comparison at all has null totals", async () => {
    const r = await report("admin", `from=2026-01&to=2026-01&supplier=${birch.id}`);
    expect(r.status).toBe(200);
    expect(r.body.supplier).toEqual({ id: birch.id, name: birch.name });
    expect(r.body.rows.map((x: Row) => x.supplierId)).toEqual([birch.id, birch.id, birch.id]);
    expect(r.body.totals).toEqual({ lines: 3, deliveredValue: "580.01", orderVariance: "1.51", orderCompared: 3, withoutOrder: 0, listVariance: "6.00", listCompared: 1, withoutListPrice: 2 });

    // December holds only A-0 (31 Dec 23:00 in New York): ordered 12.00 and delivered 12.00, list none before 1 Jan
    const dec = await report("accountant", `from=2025-12&to=2025-12&supplier=${alder.id}`);
    expect(dec.body.rows).toHaveLength(1);
    expect(dec.body.rows[0]).toMatchObject({ deliveredOn: "2025-12-31", orderVariance: "0.00", listVariance: null });
    expect(dec.body.totals).toMatchObject({ lines: 1, orderVariance: "0.00", listVariance: null, listCompared: 0, withoutListPrice: 1 });

    // nothing booked: no rows, totals of nothing
    const none = await report("accountant", "from=2025-06&to=2025-07");
    expect(none.body).toMatchObject({ rows: [], groups: [], totals: { lines: 0, deliveredValue: "0.00", orderVariance: null, listVariance: null } });
  });

  it("the CSV parses back (papaparse) to the JSON rows; numbers stay plain, formula-like text is neutralised", async () => {
    const json = await report("accountant", "from=2026-01&to=2026-03");
    const file = await csv("accountant", "from=2026-01&to=2026-03");
    expect(file.status).toBe(200);
    expect(file.headers.get("content-type")).toBe("text/csv; charset=utf-8");
    expect(file.headers.get("content-disposition")).toBe('attachment; filename="price-variance-2026-01-to-2026-03.csv"');
    expect(file.text.endsWith("\r\n")).toBe(true);
    const parsed = Papa.parse<Record<string, string>>(file.text, { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    const columns = priceVarianceColumns("EUR");
    expect(parsed.meta.fields).toEqual(columns.map(([, h]) => h));
    // each cell is the JSON value as text: null empty, booleans yes/no, and the one text cell that
    // starts with "=" carries the apostrophe (RFC 4180 + OWASP CSV injection)
    const expected = (json.body.rows as Row[]).map((row) =>
      Object.fromEntries(columns.map(([k, h]) => {
        const v = row[k];
        const text = v === null ? "" : typeof v === "boolean" ? (v ? "yes" : "no") : String(v);
        return [h, text.startsWith("=") ? `'${text}` : text];
      })));
    expect(parsed.data).toEqual(expected);
    expect(parsed.data.find((r) => r["Delivery note"] === "A-3")!.Item).toBe(`'${fennelName}`);
    // a negative amount is a number, not neutralised or quoted
    expect(file.text).toContain(",-0.80,");
    expect(file.text).not.toContain("'-0.80");
  });
});

describe("who may read it", () => {
  it("admins, managers and accountants; buyers and kitchen leads are 403 (reports.read)", async () => {
    for (const who of ["admin", "manager", "accountant"]) expect((await report(who, "from=2026-01&to=2026-01")).status, who).toBe(200);
    for (const who of ["buyer", "kitchen_lead"]) {
      const r = await report(who, "from=2026-01&to=2026-01");
      expect(r.status, who).toBe(403);
      expect(r.body.error.code).toBe("FORBIDDEN");
      expect((await csv(who, "from=2026-01&to=2026-01")).status, who).toBe(403);
    }
    expect((await call(reportRoute, { path: "/api/reports/price-variance?from=2026-01&to=2026-01" })).status).toBe(401);
  });

  it("another company sees none of it, and our supplier is 404 to them", async () => {
    const r = await report("otherAccountant", "from=2025-12&to=2026-04");
    expect(r.status).toBe(200);
    expect(r.body.rows).toEqual([]);
    expect(r.body.totals.lines).toBe(0);
    const s = await report("otherAccountant", `from=2026-01&to=2026-01&supplier=${alder.id}`);
    expect(s.status).toBe(404);
    expect(s.body.error.code).toBe("NOT_FOUND");
  });
});

describe("the query", () => {
  const fieldsOf = async (query: string) => {
    const r = await report("accountant", query);
    expect(r.status, query).toBe(422);
    expect(r.body.error.code).toBe("VALIDATION");
    return r.body.error.details.fields as Record<string, string[]>;
  };

  it("names the field: a bad month, to before from, over 24 months, an unknown format or supplier id", async () => {
    expect(Object.keys(await fieldsOf("from=2026-13&to=2026-12"))).toEqual(["from"]);
    expect(Object.keys(await fieldsOf("from=2026-1&to=2026-02"))).toEqual(["from"]);
    expect(Object.keys(await fieldsOf("to=2026-02"))).toEqual(["from"]);
    expect(await fieldsOf("from=2026-03&to=2026-01")).toEqual({ to: ["to (2026-01) is before from (2026-03): give the later month as to."] });
    // 2024-01 .. 2026-01 is 25 months (24 + the first); 2024-02 .. 2026-01 is 24 and allowed
    expect(await fieldsOf("from=2024-01&to=2026-01")).toEqual({ to: ["2024-01 to 2026-01 is 25 months; one report covers at most 24."] });
    expect((await report("accountant", "from=2024-02&to=2026-01")).status).toBe(200);
    expect(Object.keys(await fieldsOf("from=2026-01&to=2026-01&format=xlsx"))).toEqual(["format"]);
    expect(Object.keys(await fieldsOf("from=2026-01&to=2026-01&supplier=ALDER"))).toEqual(["supplier"]);
  });
});
