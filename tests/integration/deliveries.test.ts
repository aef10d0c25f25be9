// Deliveries through their endpoints: a delivery note CSV (tests/fixtures/csv/deliveries, dates
// filled in for the company's today) reconciled against a sent order, each finding, corrections,
// keyed and scanned lines, the landed cost with freight, posting (receipts, order lines, order
// status) once only, and who may do it.
//
// The thresholds checked here are the company defaults of the purchasing issue (issue 5): price
// tolerance 2 %, short-dated when less than 90 days of life are left on a cure, 60 on a casing, 180
// on a spice. Hanks: one pc of a natural casing is one hank (trade-facts §4: 100 yd = 91.44 m), so a
// bundle of 5 hanks is 5 pc.
import { NextRequest } from "next/server";
import { beforeAll, describe, expect, it } from "vitest";
import { PATCH as companyPatch } from "../../app/api/company/route";
import { createHash, randomUUID } from "node:crypto";
import { GET as documentGet, POST as documentRoute } from "../../app/api/deliveries/[id]/document/route";
import { POST as addLineRoute } from "../../app/api/deliveries/[id]/lines/route";
import { PATCH as linePatchRoute } from "../../app/api/deliveries/[id]/lines/[lineId]/route";
import { POST as postRoute } from "../../app/api/deliveries/[id]/post/route";
import { GET as getRoute, PATCH as patchRoute } from "../../app/api/deliveries/[id]/route";
import { POST as keyedRoute } from "../../app/api/deliveries/keyed/route";
import { GET as listRoute, POST as uploadRoute } from "../../app/api/deliveries/route";
import { db } from "../../db/client";
import { ROLES } from "../../db/types";
import { companyDay, deliveryFixture, deliveryScenario, type DeliveryScenario } from "../support/deliveries";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { baseUrl, buildRequest, call } from "../support/http";
import { bytes, multipart, type Part } from "../support/multipart";
import { sessionCookieFor } from "../support/sessions";
import { ledgerMismatches } from "../support/stock";

let co: TestCompany;
let other: TestCompany;
const cookie: Record<string, string> = {};

beforeAll(async () => {
  [co, other] = await Promise.all([createCompany({ kitchens: 2 }), createCompany()]);
  for (const role of ROLES) cookie[role] = await sessionCookieFor(co.users[role].id);
  cookie.otherBuyer = await sessionCookieFor(other.users.buyer.id);
});

const scenario = () => deliveryScenario(co.company.id, co.kitchens[0]!.id, co.users.buyer.id);

async function sendMultipart(handler: typeof uploadRoute, url: string, parts: Part[], who: string, params: Record<string, string> = {}) {
  const body = multipart(parts);
  const headers = new Headers({ host: new URL(baseUrl()).host, "content-type": body.contentType, cookie: cookie[who]! });
  const req = new NextRequest(new URL(url, baseUrl()), { method: "POST", headers, body: body.stream(), duplex: "half" } as ConstructorParameters<typeof NextRequest>[1]);
  const res = await handler(req, { params: Promise.resolve(params) });
  return { status: res.status, body: await res.json() };
}

interface UploadOpts {
  who?: string;
  order?: string | null;
  note?: string;
  text?: string;
  mapping?: unknown;
  kitchen?: string;
}

/** Sends a fixture (placeholders filled) for the scenario's supplier to the first kitchen. */
async function upload(s: DeliveryScenario, fixture: string, o: UploadOpts = {}) {
  const note = o.note ?? `DN-${tag()}`;
  const text = o.text ?? (await deliveryFixture(fixture, co.company.id, note));
  const parts: Part[] = [
    { name: "supplier", value: s.supplierId },
    { name: "kitchen", value: o.kitchen ?? co.kitchens[0]!.code },
    ...(o.order === null ? [] : [{ name: "order", value: o.order ?? s.orderId }]),
    ...(o.mapping ? [{ name: "mapping", value: JSON.stringify(o.mapping) }] : []),
    { name: "file", filename: fixture, contentType: "text/csv", content: bytes(text) },
  ];
  return { ...(await sendMultipart(uploadRoute, "/api/deliveries", parts, o.who ?? "buyer")), text, note };
}

const get = (who: string, id: string) => call(getRoute, { path: `/api/deliveries/${id}`, params: { id }, cookie: cookie[who] });
const decide = (id: string, lineId: string, body: unknown, who = "buyer") =>
  call(linePatchRoute, { method: "PATCH", path: `/api/deliveries/${id}/lines/${lineId}`, params: { id, lineId }, cookie: cookie[who], body });
const post = (id: string, key?: string, who = "buyer") => call(postRoute, { method: "POST", path: `/api/deliveries/${id}/post`, params: { id }, cookie: cookie[who], idempotencyKey: key });
const findingsOf = (body: { lines: { findings: string[] }[] }) => body.lines.map((l) => l.findings);

describe("each finding, from a delivery note CSV", () => {
  it("a line as ordered", async () => {
    const s = await scenario();
    const r = await upload(s, "as-ordered.csv");
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body).toMatchObject({ status: "draft", noteNumber: r.note, order: { id: s.orderId, number: s.orderNumber }, supplier: { id: s.supplierId }, duplicate: false, cureCaution: null });
    expect(r.body.lines).toEqual([expect.objectContaining({
      lineNo: 1, rowNumber: 2, source: "csv", findings: ["as_ordered"], decision: "pending", quantity: "10", quantityStock: "10000", unitPrice: "12.50",
      lot: "PA-2291", dateKind: "best_before", supplierItem: expect.objectContaining({ id: s.si["PAP-1KG"] }),
      orderLine: expect.objectContaining({ id: s.lines["PAP-1KG"], orderedStock: "10000", outstandingStock: "10000" }),
    })]);
  });

  it("short and over against what is still to come", async () => {
    const s = await scenario();
    expect(findingsOf((await upload(s, "short.csv")).body)).toEqual([["short"]]);
    expect(findingsOf((await upload(s, "over.csv")).body)).toEqual([["over"]]);
  });

  it("a different item: another pack of the ordered stock item (an alternative), matched to the order line", async () => {
    const s = await scenario();
    const r = await upload(s, "different-item.csv");
    // 20 x 500 g = 10,000 g, the 10 x 1 kg ordered; 6.25 per 500 g is the ordered 12.50 per kg
    expect(r.body.lines[0]).toMatchObject({ findings: ["different_item"], quantityStock: "10000", orderLine: { id: s.lines["PAP-1KG"] }, supplierItem: { id: s.si["PAP-500"] } });
  });

  it("not on any order: a supplier item nobody ordered, and a code the supplier's list does not have", async () => {
    const s = await scenario();
    const r = await upload(s, "not-on-order.csv");
    expect(r.body.lines).toEqual([
      expect.objectContaining({ findings: ["not_on_order"], orderLine: null, supplierItem: expect.objectContaining({ id: s.si["PEP-1KG"] }) }),
      expect.objectContaining({ findings: ["not_on_order"], orderLine: null, supplierItem: null, item: null, noted: expect.objectContaining({ sku: "ZZ-404" }) }),
    ]);
  });

  it("price beyond the 2 % tolerance (per stock unit), and exactly 2 % is still as ordered", async () => {
    const s = await scenario();
    const r = await upload(s, "price-differs.csv");
    // 12.80 / 12.50 = 1.024: 2.4 % over; 193.29 / 189.50 = 1.02 exactly: within
    expect(r.body.lines[0].findings).toEqual(["price_differs"]);
    expect(r.body.lines[1].findings).toEqual(["as_ordered"]);
  });

  it("lot missing on a lot-tracked casing", async () => {
    const s = await scenario();
    expect(findingsOf((await upload(s, "lot-missing.csv")).body)).toEqual([["as_ordered", "lot_missing"]]);
  });

  it("date missing on a cure (cures always carry lot and date), with the cure caution", async () => {
    const s = await scenario();
    const r = await upload(s, "date-missing.csv");
    expect(findingsOf(r.body)).toEqual([["as_ordered", "date_missing"]]);
    expect(r.body.cureCaution).toMatch(/toxic/);
  });

  it("already expired (dated yesterday)", async () => {
    const s = await scenario();
    expect(findingsOf((await upload(s, "expired.csv")).body)).toEqual([["as_ordered", "expired"]]);
  });

  it("short-dated cure: 60 days left is under the 90-day default, 90 days is not", async () => {
    const s = await scenario();
    const r = await upload(s, "short-dated-cure.csv");
    // two tubs of one line ordered: the first is short of the second's quantity, the second completes it
    expect(findingsOf(r.body)).toEqual([["short", "short_dated"], ["as_ordered"]]);
  });

  it("the company's own short-dated days and tolerance count", async () => {
    const c = await createCompany();
    const admin = await sessionCookieFor(c.users.admin.id);
    const patched = await call(companyPatch, {
      method: "PATCH", path: "/api/company", cookie: admin,
      body: { name: "Larder", timeZone: "Europe/London", currency: "EUR", receiving: { priceTolerancePercent: "5", shortDatedDays: { cure: 30 } } },
    });
    expect(patched.status, JSON.stringify(patched.body)).toBe(200);
    expect(patched.body.receiving).toEqual({ priceTolerancePercent: "5", shortDatedDays: { cure: 30, casing: 60, spice: 180, ingredient: 0 } });
    const bad = await call(companyPatch, { method: "PATCH", path: "/api/company", cookie: admin, body: { name: "Larder", timeZone: "Europe/London", currency: "EUR", receiving: { shortDatedDays: { cure: -1 } } } });
    expect(bad.status).toBe(422);
    expect(bad.body.error.details.fields).toHaveProperty(["receiving.shortDatedDays.cure"]);
  });

  it("several findings on one line", async () => {
    const s = await scenario();
    const r = await upload(s, "several-findings.csv");
    // 1 of 2 tubs, 33.00 against 30.00 (10 %), no lot, 30 days left
    expect(findingsOf(r.body)).toEqual([["short", "price_differs", "lot_missing", "short_dated"]]);
  });

  it("matches by GTIN when the note has no SKU, and reads a semicolon file with decimal commas and dd.mm.yyyy dates", async () => {
    const s = await scenario();
    const byGtin = await upload(s, "by-gtin.csv");
    expect(byGtin.body.lines[0]).toMatchObject({ findings: ["as_ordered"], supplierItem: { id: s.si["PAP-1KG"] }, noted: { gtin: "09521234000013" } });
    const s2 = await scenario();
    const eu = await upload(s2, "semicolon-decimal-comma.csv", {
      mapping: {
        headerRow: 1, decimal: ",", thousands: "", dateFormat: "dd.MM.yyyy",
        columns: { noteNumber: { header: "Lieferschein" }, sku: { header: "Artikelnummer" }, quantity: { header: "Menge" }, unitPrice: { header: "Einzelpreis" }, lot: { header: "Charge" }, date: { header: "MHD" } },
      },
    });
    expect(eu.status, JSON.stringify(eu.body)).toBe(201);
    expect(eu.body.lines[0]).toMatchObject({ findings: ["as_ordered"], unitPrice: "12.50", date: await companyDay(co.company.id, 400), dateKind: "use_by" });
    // the mapping is remembered for the supplier's next note
    const saved = await db()("supplier_import_mappings").where({ company_id: co.company.id, supplier_id: s2.supplierId, kind: "delivery_note" }).first();
    expect(saved.mapping.columns.sku).toEqual({ header: "Artikelnummer" });
  });

  it("matches the supplier's open orders for the kitchen when no order is named", async () => {
    const s = await scenario();
    const r = await upload(s, "as-ordered.csv", { order: null });
    expect(r.body.order).toBeNull();
    expect(r.body.lines[0]).toMatchObject({ findings: ["as_ordered"], orderLine: { id: s.lines["PAP-1KG"], orderNumber: s.orderNumber } });
  });

  it("refuses rows it cannot read, naming row and column, and writes nothing", async () => {
    const s = await scenario();
    const before = await db()("deliveries").where({ supplier_id: s.supplierId }).count<{ count: string }[]>("* as count");
    const r = await upload(s, "bad-rows.csv");
    expect(r.status).toBe(422);
    expect(r.body.error.details.errors).toEqual([
      expect.objectContaining({ row: 2, column: "Qty", message: expect.stringContaining("ten") }),
      expect.objectContaining({ row: 3, message: expect.stringContaining("neither the supplier's SKU nor a GTIN") }),
      expect.objectContaining({ row: 4, column: "Date type", message: expect.stringContaining("someday") }),
    ]);
    const after = await db()("deliveries").where({ supplier_id: s.supplierId }).count<{ count: string }[]>("* as count");
    expect(after).toEqual(before);
  });
});

describe("keyed and scanned lines", () => {
  it("keys a delivery in, adds a scanned case label by GTIN, and reconciles both", async () => {
    const s = await scenario();
    const today = await companyDay(co.company.id);
    const k = await call(keyedRoute, {
      path: "/api/deliveries/keyed", cookie: cookie.buyer, idempotencyKey: randomUUID(),
      body: { supplier: s.supplierId, kitchen: co.kitchens[0]!.code, noteNumber: `DN-${tag()}`, lines: [{ sku: "hog-b5", quantity: "4", unitPrice: "189.50", lot: "HG-1", date: await companyDay(co.company.id, 200), dateKind: "use_by" }] },
    });
    expect(k.status, JSON.stringify(k.body)).toBe(201);
    expect(k.body.lines[0]).toMatchObject({ source: "keyed", rowNumber: null, findings: ["as_ordered"], supplierItem: { sku: "HOG-B5" } });
    const scanned = await call(addLineRoute, {
      path: `/api/deliveries/${k.body.id}/lines`, params: { id: k.body.id }, cookie: cookie.buyer,
      body: { source: "scan", gtin: "9521234000013", lot: "PA-77", date: await companyDay(co.company.id, 300), dateKind: "best_before", quantity: "10" },
    });
    expect(scanned.status, JSON.stringify(scanned.body)).toBe(201);
    expect(scanned.body.lines[1]).toMatchObject({ source: "scan", findings: ["as_ordered"], unitPrice: "12.50", supplierItem: { sku: "PAP-1KG" }, noted: { gtin: "09521234000013", unitPrice: null } });
    const badGtin = await call(addLineRoute, { path: `/api/deliveries/${k.body.id}/lines`, params: { id: k.body.id }, cookie: cookie.buyer, body: { source: "scan", gtin: "9521234000014", quantity: "1" } });
    expect(badGtin.status).toBe(422);
    expect(badGtin.body.error.details.fields).toHaveProperty("gtin");
    expect(today).toMatch(/^\d{4}-\d{2}-\d{2}$/);
  });
});

describe("deciding and correcting lines", () => {
  it("a correction is judged again: a lot typed in clears lot_missing; an item chosen for an unknown code matches it", async () => {
    const s = await scenario();
    const r = await upload(s, "lot-missing.csv");
    const fixed = await decide(r.body.id, r.body.lines[0].id, { decision: "accept", corrections: { lot: "HG-9" } });
    expect(fixed.status, JSON.stringify(fixed.body)).toBe(200);
    expect(fixed.body.lines[0]).toMatchObject({ findings: ["as_ordered"], lot: "HG-9", noted: { lot: null }, corrections: { lot: "HG-9" }, decision: "accept" });
    const n = await upload(s, "not-on-order.csv");
    const unknown = n.body.lines[1];
    const refused = await decide(n.body.id, unknown.id, { decision: "accept" });
    expect(refused.status).toBe(422);
    expect(refused.body.error.details.fields).toHaveProperty(["corrections.supplierItem"]);
    const chosen = await decide(n.body.id, unknown.id, { corrections: { supplierItem: s.si["SHP-B5"] } });
    expect(chosen.body.lines[1]).toMatchObject({ supplierItem: { id: s.si["SHP-B5"] }, orderLine: { id: s.lines["SHP-B5"] } });
  });

  it("an expired line cannot be accepted; it is rejected", async () => {
    const s = await scenario();
    const r = await upload(s, "expired.csv");
    const accept = await decide(r.body.id, r.body.lines[0].id, { decision: "accept" });
    expect(accept.status).toBe(422);
    expect(accept.body.error.details.fields.decision[0]).toMatch(/out of date/);
    expect((await get("buyer", r.body.id)).body.lines[0].decision).toBe("pending");
    expect((await decide(r.body.id, r.body.lines[0].id, { decision: "reject" })).status).toBe(200);
  });
});

describe("posting", () => {
  it("refuses while lines are pending, naming them", async () => {
    const s = await scenario();
    const r = await upload(s, "not-on-order.csv");
    const p = await post(r.body.id);
    expect(p.status).toBe(422);
    expect(Object.keys(p.body.error.details.fields).sort()).toEqual(["lines.0.decision", "lines.1.decision"]);
  });

  it("posts receipts with the landed cost (freight spread by value), raises the order lines and the order status", async () => {
    const s = await scenario();
    const note = `DN-${tag()}`;
    const text = [
      "Delivery note,Article no,Qty,Unit price,Lot,Best before,Date type",
      `${note},PAP-1KG,10,12.50,PA-1,${await companyDay(co.company.id, 400)},best before`,
      `${note},HOG-B5,4,189.50,HG-1,${await companyDay(co.company.id, 300)},use by`,
      `${note},CURE-5KG,1,30.00,CU-1,${await companyDay(co.company.id, 200)},use by`,
      `${note},PEP-1KG,1,9.80,PE-1,${await companyDay(co.company.id, 400)},best before`,
    ].join("\r\n");
    const r = await upload(s, "landed.csv", { text });
    expect(findingsOf(r.body)).toEqual([["as_ordered"], ["as_ordered"], ["short"], ["not_on_order"]]);
    for (const l of r.body.lines.slice(0, 3)) expect((await decide(r.body.id, l.id, { decision: "accept" })).status).toBe(200);
    await decide(r.body.id, r.body.lines[3].id, { decision: "reject" });
    const f = await call(patchRoute, { method: "PATCH", path: `/api/deliveries/${r.body.id}`, params: { id: r.body.id }, cookie: cookie.buyer, body: { freight: "18.26" } });
    expect(f.body.freight).toBe("18.26");
    const p = await post(r.body.id, randomUUID());
    expect(p.status, JSON.stringify(p.body)).toBe(200);
    expect(p.body.status).toBe("posted");
    // Values: 10 x 12.50 = 125.00; 4 x 189.50 = 758.00; 1 x 30.00 = 30.00; together 913.00.
    // Freight 18.26 spread by value: 18.26 / 913 = 0.02 per unit of value, so 2.50, 15.16 and 0.60.
    // Landed per stock unit: (125 + 2.50) / 10,000 g = 0.01275 per g; (758 + 15.16) / 20 pc = 38.658
    // per hank; (30 + 0.60) / 5,000 g = 0.00612 per g. The rejected pepper takes no freight.
    expect(p.body.lines.map((l: { landedUnitCost: string | null }) => l.landedUnitCost)).toEqual(["0.01275", "38.658", "0.00612", null]);
    const lots = await db()("lots").whereIn("id", p.body.lines.slice(0, 3).map((l: { lotId: string }) => l.lotId)).orderBy("code");
    expect(lots.map((l) => [l.code, l.unit_cost, l.supplier_id, l.date_kind])).toEqual([
      ["CU-1", "0.006120", s.supplierId, "use_by"], ["HG-1", "38.658000", s.supplierId, "use_by"], ["PA-1", "0.012750", s.supplierId, "best_before"],
    ]);
    const bal = await db()("stock_balances").where({ kitchen_id: co.kitchens[0]!.id }).whereIn("lot_id", lots.map((l) => l.id)).orderBy("on_hand");
    expect(bal.map((b) => b.on_hand)).toEqual(["20.000000000000", "5000.000000000000", "10000.000000000000"]);
    const ol = await db()("purchase_order_lines").where({ order_id: s.orderId }).orderBy("line_no");
    expect(ol.map((l) => l.received_stock)).toEqual(["10000.000000000000", "20.000000000000", "0.000000000000", "5000.000000000000"]);
    expect((await db()("purchase_orders").where({ id: s.orderId }).first()).status).toBe("partly_received");
    expect(await ledgerMismatches(co.company.id)).toEqual([]);

    // the rest arrives on a second note: the order is received
    const note2 = `DN-${tag()}`;
    const rest = await upload(s, "rest.csv", {
      text: ["Delivery note,Article no,Qty,Unit price,Lot,Best before", `${note2},SHP-B5,2,145.00,SH-1,${await companyDay(co.company.id, 300)}`, `${note2},CURE-5KG,1,30.00,CU-2,${await companyDay(co.company.id, 200)}`].join("\n"),
    });
    expect(findingsOf(rest.body)).toEqual([["as_ordered"], ["as_ordered"]]);
    for (const l of rest.body.lines) await decide(rest.body.id, l.id, { decision: "accept" });
    expect((await post(rest.body.id)).status).toBe(200);
    expect((await db()("purchase_orders").where({ id: s.orderId }).first()).status).toBe("received");
  });

  it("posts once: a replayed key, a second post and two posts at once give the same delivery and one set of receipts", async () => {
    const s = await scenario();
    const r = await upload(s, "as-ordered.csv");
    await decide(r.body.id, r.body.lines[0].id, { decision: "accept" });
    const key = randomUUID();
    const [a, b] = await Promise.all([post(r.body.id, key), post(r.body.id)]);
    expect([a.status, b.status]).toEqual([200, 200]);
    const replay = await post(r.body.id, key);
    expect(replay.body).toEqual(a.body);
    const again = await post(r.body.id, randomUUID());
    expect(again.body.postedAt).toBe(a.body.postedAt);
    const d = await db()("deliveries").where({ id: r.body.id }).first();
    expect(await db()("stock_movements").where({ posting_id: d.posting_id })).toHaveLength(1);
    const ol = await db()("purchase_order_lines").where({ id: s.lines["PAP-1KG"] }).first();
    expect(ol.received_stock).toBe("10000.000000000000");
    // a posted delivery is not changed any more
    expect((await decide(r.body.id, r.body.lines[0].id, { decision: "reject" })).status).toBe(409);
  });

  it("recognises the same file and the same note number", async () => {
    const s = await scenario();
    const first = await upload(s, "as-ordered.csv");
    const same = await upload(s, "as-ordered.csv", { text: first.text });
    expect(same.status).toBe(200);
    expect(same.body).toMatchObject({ id: first.body.id, duplicate: true });
    await decide(first.body.id, first.body.lines[0].id, { decision: "accept" });
    expect((await post(first.body.id)).status).toBe(200);
    const afterPost = await upload(s, "as-ordered.csv", { text: first.text });
    expect(afterPost.status).toBe(409);
    expect(afterPost.body.error).toMatchObject({ code: "DELIVERY_ALREADY_POSTED", details: { deliveryId: first.body.id } });
    // another file, same note number (another case)
    const renamed = await upload(s, "short.csv", { note: first.note.toLowerCase() });
    expect(renamed.status).toBe(409);
    expect(renamed.body.error.details.deliveryId).toBe(first.body.id);
  });
});

describe("the delivery note document", () => {
  it("attaches a PDF, refuses a CSV as the document", async () => {
    const s = await scenario();
    const r = await upload(s, "as-ordered.csv");
    const pdf = bytes("%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n");
    const ok = await sendMultipart(documentRoute, `/api/deliveries/${r.body.id}/document`, [{ name: "file", filename: "note.pdf", contentType: "application/pdf", content: pdf }], "buyer", { id: r.body.id });
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    expect(ok.body.document).toMatchObject({ filename: "note.pdf", mediaType: "application/pdf" });
    const csv = await sendMultipart(documentRoute, `/api/deliveries/${r.body.id}/document`, [{ name: "file", filename: "note.csv", contentType: "text/csv", content: bytes("a,b\n1,2\n") }], "buyer", { id: r.body.id });
    expect(csv.status).toBe(422);
  });

  it("downloads as uploaded: the same bytes (SHA-256), media type and file name; 404 without one or for another company", async () => {
    const s = await scenario();
    const r = await upload(s, "as-ordered.csv");
    const id = r.body.id as string;
    const download = async (who: string, deliveryId = id) => {
      const res = await documentGet(buildRequest({ path: `/api/deliveries/${deliveryId}/document`, cookie: cookie[who] }), { params: Promise.resolve({ id: deliveryId }) });
      return { status: res.status, headers: res.headers, bytes: Buffer.from(await res.arrayBuffer()) };
    };
    const sha = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");
    const none = await download("buyer");
    expect(none.status).toBe(404);
    expect(JSON.parse(none.bytes.toString("utf8")).error.code).toBe("NOT_FOUND");
    // a photo this time; a name with non-ASCII letters travels in filename*
    const png = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.from(`IHDR ${randomUUID()}`), Buffer.alloc(300, 7)]);
    const attached = await sendMultipart(documentRoute, `/api/deliveries/${id}/document`, [{ name: "file", filename: "Lieferschein März.png", contentType: "image/png", content: png }], "buyer", { id });
    expect(attached.status, JSON.stringify(attached.body)).toBe(200);
    for (const who of ["buyer", "accountant"]) {
      const got = await download(who);
      expect(got.status, who).toBe(200);
      expect(sha(got.bytes)).toBe(sha(png));
      expect(got.headers.get("content-type")).toBe("image/png");
      expect(got.headers.get("content-disposition")).toBe(`inline; filename="Lieferschein M_rz.png"; filename*=UTF-8''Lieferschein%20M%C3%A4rz.png`);
    }
    expect((await download("kitchen_lead")).status).toBe(403);
    expect((await download("otherBuyer")).status).toBe(404);
    expect((await download("buyer", randomUUID())).status).toBe(404);
  });
});

describe("who may receive", () => {
  it("buyers, managers and admins receive; kitchen leads and accountants may not", async () => {
    const s = await scenario();
    expect((await upload(s, "as-ordered.csv", { who: "manager" })).status).toBe(201);
    expect((await upload(s, "as-ordered.csv", { who: "kitchen_lead" })).status).toBe(403);
    expect((await upload(s, "as-ordered.csv", { who: "accountant" })).status).toBe(403);
    const r = await upload(s, "as-ordered.csv");
    expect((await get("kitchen_lead", r.body.id)).status).toBe(403);
    expect((await post(r.body.id, undefined, "accountant")).status).toBe(403);
  });

  it("another company's delivery is 404, its supplier 422; the list shows only one's own", async () => {
    const s = await scenario();
    const r = await upload(s, "as-ordered.csv");
    expect((await get("otherBuyer", r.body.id)).status).toBe(404);
    expect((await post(r.body.id, undefined, "otherBuyer")).status).toBe(404);
    const theirs = await upload(s, "short.csv", { who: "otherBuyer", kitchen: other.kitchens[0]!.code, order: null });
    expect(theirs.status).toBe(422);
    expect(theirs.body.error.details.fields).toHaveProperty("supplier");
    const list = await call(listRoute, { path: "/api/deliveries", cookie: cookie.otherBuyer });
    expect(list.body.deliveries.map((d: { id: string }) => d.id)).not.toContain(r.body.id);
    const mine = await call(listRoute, { path: `/api/deliveries?supplier=${s.supplierId}`, cookie: cookie.buyer });
    expect(mine.body.deliveries.map((d: { id: string }) => d.id)).toContain(r.body.id);
  });
});
