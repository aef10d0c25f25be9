// Supplier price lists through POST /api/suppliers/{id}/price-lists (a real streamed multipart body
// into the route handler) against the real PostgreSQL: real files (tests/fixtures/csv/price-lists:
// BOM, Windows-1252, semicolons with decimal commas, quoted cells, blank trailing lines, broken
// quoting), the preview that writes nothing, row findings, all or nothing, the same file twice,
// the remembered mapping, text that looks like a formula, the history, an item's prices across
// suppliers, permissions and tenancy.
import { readFileSync } from "node:fs";
import path from "node:path";
import { NextRequest } from "next/server";
import { beforeAll, describe, expect, it } from "vitest";
import Papa from "papaparse";
import { all, create } from "mathjs";
import { GET as itemPricesGet } from "../../app/api/items/[id]/prices/route";
import { POST as supplierItemCreate } from "../../app/api/suppliers/[id]/items/route";
import { GET as priceListsGet, POST as priceListsPost } from "../../app/api/suppliers/[id]/price-lists/route";
import { POST as supplierCreate } from "../../app/api/suppliers/route";
import { db } from "../../db/client";
import { ROLES } from "../../db/types";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { baseUrl, buildRequest, call } from "../support/http";
import { bytes, multipart, type MultipartBody, type Part } from "../support/multipart";
import { sessionCookieFor } from "../support/sessions";
import { createItem } from "../support/stock";

// mathjs as an outside reference for the per-unit figures (exact fractions)
const math = create(all!, { number: "Fraction" });
const fraction = (expr: string) => math.evaluate(expr) as { valueOf(): number; toFraction(): string };

const FIXTURES = path.join(__dirname, "..", "fixtures", "csv", "price-lists");
const fixture = (name: string) => new Uint8Array(readFileSync(path.join(FIXTURES, name)));

let a: TestCompany;
let b: TestCompany;
const cookie: Record<string, string> = {};
beforeAll(async () => {
  [a, b] = await Promise.all([createCompany(), createCompany()]);
  for (const role of ROLES) cookie[role] = await sessionCookieFor(a.users[role].id);
  cookie.otherBuyer = await sessionCookieFor(b.users.buyer.id);
});

interface Setup {
  supplierId: string;
  name: string;
  si: Record<string, string>;
  items: { hog: string; pepper: string; paprika: string; collagen: string };
}

/** A supplier of company a selling five items (fresh items each time, so item prices stay this test's own). */
async function setup(companyCookie = cookie.buyer!): Promise<Setup> {
  const name = `Saltmarsh Casings ${tag()}`;
  const s = await call(supplierCreate, { path: "/api/suppliers", body: { name, leadTimeDays: 3 }, cookie: companyCookie });
  expect(s.status, JSON.stringify(s.body)).toBe(201);
  const hog = await createItem(a.company.id, { category: "casing" }); // pc, one pc = one hank of 91.44 m
  const pepper = await createItem(a.company.id, { category: "spice" }); // g
  const paprika = await createItem(a.company.id, { category: "spice" }); // g
  const [collagen] = await db()("items")
    .insert({
      company_id: a.company.id, sku: `COL-${tag().toUpperCase()}`, name: "Collagen 26 mm", category: "casing", stock_unit: "m",
      casing_kind: "collagen", calibre_min_mm: "26", calibre_max_mm: "26", storage: "dry",
    })
    .returning<{ id: string }[]>("id");
  const si: Record<string, string> = {};
  const lines = [
    { sku: "HOG-B5", item: hog.id, packLabel: "bundle of 5 hanks", packQuantity: "5", packUnit: "hank" },
    { sku: "HOG-B50", item: hog.id, packLabel: "bundle of 50 hanks", packQuantity: "50", packUnit: "hank", gtin: "4006381333931" },
    { sku: "PEP-1K", item: pepper.id, packLabel: "1 kg bag", packQuantity: "1", packUnit: "kg" },
    { sku: "COL-50", item: collagen!.id, packLabel: "roll of 50 m", packQuantity: "50", packUnit: "m" },
    { sku: "PAP-500", item: paprika.id, packLabel: "500 g bag", packQuantity: "500", packUnit: "g" },
  ];
  for (const l of lines) {
    const r = await call(supplierItemCreate, { path: `/api/suppliers/${s.body.id}/items`, params: { id: s.body.id }, body: l, cookie: companyCookie });
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    si[l.sku] = r.body.id;
  }
  return { supplierId: s.body.id, name, si, items: { hog: hog.id, pepper: pepper.id, paprika: paprika.id, collagen: collagen!.id } };
}

interface Sent {
  file?: Uint8Array | string;
  filename?: string;
  mapping?: unknown;
  effectiveFrom?: string;
  dryRun?: boolean;
}

function partsOf(o: Sent): Part[] {
  const parts: Part[] = [];
  if (o.mapping !== undefined) parts.push({ name: "mapping", value: typeof o.mapping === "string" ? o.mapping : JSON.stringify(o.mapping) });
  if (o.effectiveFrom !== undefined) parts.push({ name: "effectiveFrom", value: o.effectiveFrom });
  if (o.dryRun !== undefined) parts.push({ name: "dryRun", value: String(o.dryRun) });
  if (o.file !== undefined) {
    parts.push({ name: "file", filename: o.filename ?? "prices.csv", contentType: "text/csv", content: typeof o.file === "string" ? bytes(o.file) : o.file });
  }
  return parts;
}

async function postBody(supplierId: string, body: MultipartBody, who = "buyer", query = "") {
  const headers = new Headers({ host: new URL(baseUrl()).host, "content-type": body.contentType, cookie: cookie[who]! });
  const req = new NextRequest(new URL(`/api/suppliers/${supplierId}/price-lists${query}`, baseUrl()), {
    method: "POST", headers, body: body.stream(), duplex: "half",
  } as ConstructorParameters<typeof NextRequest>[1]);
  const res = await priceListsPost(req, { params: Promise.resolve({ id: supplierId }) });
  return { status: res.status, body: await res.json() };
}

const send = (supplierId: string, o: Sent, who = "buyer", query = "") => postBody(supplierId, multipart(partsOf(o)), who, query);
const preview = (supplierId: string, o: Sent, who = "buyer") => send(supplierId, { ...o, dryRun: true }, who);
const apply = (supplierId: string, o: Sent, who = "buyer") => send(supplierId, { ...o, dryRun: false }, who);

const pricesOf = (supplierId: string): Promise<{ sku: string; pack_price: string; effective_from: string; price_list_import_id: string | null; listed_description: string | null }[]> =>
  db()("supplier_item_prices as p")
    .join("supplier_items as si", "si.id", "p.supplier_item_id")
    .where("si.supplier_id", supplierId)
    .orderBy(["si.sku", "p.effective_from"])
    .select("si.sku", "p.pack_price", "p.effective_from", "p.price_list_import_id", "p.listed_description");
const importsOf = (supplierId: string) => db()("price_list_imports").where({ supplier_id: supplierId });
const mappingOf = (supplierId: string) => db()("supplier_import_mappings").where({ supplier_id: supplierId }).first();
const uploadsOf = (t: TestCompany) => db()("uploads").where({ company_id: t.company.id });

/** Nothing but the upload record: no price, no import, no remembered mapping. */
async function expectNothingWritten(supplierId: string) {
  expect(await pricesOf(supplierId)).toEqual([]);
  expect(await importsOf(supplierId)).toEqual([]);
  expect(await mappingOf(supplierId)).toBeUndefined();
}

const BASELINE_DATE = "2027-01-01";
async function applyBaseline(s: Setup) {
  const r = await apply(s.supplierId, { file: fixture("utf8-bom-comma.csv"), filename: "first-prices.csv", effectiveFrom: BASELINE_DATE });
  expect(r.status, JSON.stringify(r.body)).toBe(201);
  return r;
}

describe("real files", () => {
  it("UTF-8 with a BOM, comma, currency column: the preview proposes the mapping and writes nothing but the upload; applying writes the prices", async () => {
    const s = await setup();
    const uploadsBefore = (await uploadsOf(a)).length;
    const p = await preview(s.supplierId, { file: fixture("utf8-bom-comma.csv"), effectiveFrom: BASELINE_DATE });
    expect(p.status, JSON.stringify(p.body)).toBe(200);
    expect(p.body).toMatchObject({
      status: "preview", mappingSource: "proposed", effectiveFrom: BASELINE_DATE, currency: "EUR", import: null, appliedBefore: null,
      file: { encoding: "utf-8", bom: true, delimiter: ",", headers: ["SKU", "Description", "Pack price", "Currency"] },
      mapping: { headerRow: 1, decimal: ".", thousands: "", columns: { sku: { header: "SKU" }, description: { header: "Description" }, price: { header: "Pack price" }, currency: { header: "Currency" } } },
      proposal: { numberFormatAmbiguous: false, missingRequired: [] },
      summary: { rows: 3, priced: 3, firstPrices: 3, raised: 0, lowered: 0, unchanged: 0, skipped: 0, errors: 0, warnings: 0, complete: true },
      errors: [], warnings: [],
    });
    expect(p.body.changes.map((c: { sku: string; direction: string; newPrice: string; oldPrice: null; row: number }) => [c.row, c.sku, c.direction, c.newPrice, c.oldPrice])).toEqual([
      [2, "HOG-B5", "new", "189.5000", null], [3, "PEP-1K", "new", "14.2000", null], [4, "COL-50", "new", "22.0000", null],
    ]);
    expect(p.body.changes[0].listedDescription).toBe("Hog casings 32/35, bundle of 5 hanks");
    await expectNothingWritten(s.supplierId);
    expect((await uploadsOf(a)).length).toBe(uploadsBefore + 1); // the preview records the upload, nothing else

    const r = await apply(s.supplierId, { file: fixture("utf8-bom-comma.csv"), filename: "first-prices.csv", effectiveFrom: BASELINE_DATE });
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body.status).toBe("applied");
    expect(r.body.upload).toMatchObject({ duplicate: true, id: p.body.upload.id }); // the same bytes: the upload of the preview
    expect(r.body.import).toMatchObject({ supplierId: s.supplierId, effectiveFrom: BASELINE_DATE, counts: { rows: 3, priced: 3, firstPrices: 3 }, appliedBy: { id: a.users.buyer.id } });
    expect(r.body.message).toMatch(/^Applied .* from 2027-01-01: 3 first prices\.$/);
    const prices = await pricesOf(s.supplierId);
    expect(prices.map((x) => [x.sku, x.pack_price, x.effective_from])).toEqual([
      ["COL-50", "22.0000", BASELINE_DATE], ["HOG-B5", "189.5000", BASELINE_DATE], ["PEP-1K", "14.2000", BASELINE_DATE],
    ]);
    expect(new Set(prices.map((x) => x.price_list_import_id))).toEqual(new Set([r.body.import.id]));
  });

  it("Windows-1252, semicolon, decimal comma with thousands dot, a dated column: the changes up and down in percent and per unit", async () => {
    const s = await setup();
    await applyBaseline(s);
    const p = await preview(s.supplierId, { file: fixture("windows-1252-semicolon.csv") });
    expect(p.status, JSON.stringify(p.body)).toBe(200);
    // the remembered mapping (SKU, Description...) names none of these headers: a fresh proposal
    expect(p.body).toMatchObject({
      mappingSource: "proposed",
      file: { encoding: "windows-1252", bom: false, delimiter: ";", headers: ["Artikelnummer", "Bezeichnung", "Preis", "Gültig ab"] },
      mapping: { decimal: ",", thousands: ".", dateFormat: "dd.MM.yyyy", columns: { sku: { header: "Artikelnummer" }, price: { header: "Preis" }, effectiveFrom: { header: "Gültig ab" } } },
      summary: { rows: 4, priced: 4, raised: 1, lowered: 1, unchanged: 1, firstPrices: 1, errors: 0 },
    });
    const bySku = Object.fromEntries(p.body.changes.map((c: { sku: string }) => [c.sku, c]));
    expect(Object.keys(bySku).sort()).toEqual(["HOG-B5", "HOG-B50", "PEP-1K"]); // COL-50 is unchanged: counted, not listed
    // 189.50 -> 199.00: +9.50 / 189.50 = +5.013 % (shown to 1 decimal)
    expect(bySku["HOG-B5"]).toMatchObject({
      row: 2, direction: "up", oldPrice: "189.5000", oldEffectiveFrom: BASELINE_DATE, newPrice: "199.0000", changePercent: "5.0", effectiveFrom: "2027-02-01",
      listedDescription: "Schweinedärme 32/35; Bündel à 5 Hanks", perStockUnit: { before: "37.900000", after: "39.800000" },
    });
    // per hank = pack price / 5; a hank is 100 yd = 91.44 m (trade-facts §4; 1 yd = 0.9144 m, NIST HB 44 App. C)
    const perM = fraction("199 / 5 / 91.44").valueOf();
    expect(bySku["HOG-B5"].perUnit).toEqual([
      { unit: "hank", label: "hank", before: "37.9000", after: "39.8000" },
      { unit: "m", label: "m", before: "0.4145", after: perM.toFixed(4) },
      { unit: "yd", label: "yd", before: "0.3790", after: "0.3980" },
    ]);
    // 14.20 -> 13.49: -0.71 / 14.20 = -5 % exactly; per lb: 1 lb = 0.45359237 kg (NIST HB 44 App. C)
    expect(bySku["PEP-1K"]).toMatchObject({ direction: "down", changePercent: "-5.0", newPrice: "13.4900" });
    expect(bySku["PEP-1K"].perUnit).toEqual([
      { unit: "kg", label: "kg", before: "14.2000", after: "13.4900" },
      { unit: "lb", label: "lb", before: fraction("14.20 * 0.45359237").valueOf().toFixed(4), after: fraction("13.49 * 0.45359237").valueOf().toFixed(4) },
    ]);
    expect(bySku["HOG-B50"]).toMatchObject({ direction: "new", oldPrice: null, changePercent: null, newPrice: "1850.0000", perStockUnit: { before: null, after: "37.000000" } });

    const r = await apply(s.supplierId, { file: fixture("windows-1252-semicolon.csv") });
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    const prices = (await pricesOf(s.supplierId)).filter((x) => x.effective_from === "2027-02-01");
    expect(prices.map((x) => [x.sku, x.pack_price, x.listed_description])).toEqual([
      ["COL-50", "22.0000", "Kollagendarm 26 mm, Rolle 50 m"],
      ["HOG-B5", "199.0000", "Schweinedärme 32/35; Bündel à 5 Hanks"],
      ["HOG-B50", "1850.0000", "Schweinedärme 32/35, Großbündel 50 Hanks"],
      ["PEP-1K", "13.4900", "Pfeffer schwarz grob 1 kg"],
    ]);
  });

  it("semicolon with decimal comma, quoted cells, pack columns that agree, blank lines at the end", async () => {
    const s = await setup();
    const p = await preview(s.supplierId, { file: fixture("semicolon-decimal-comma.csv"), effectiveFrom: "2027-03-01" });
    expect(p.status, JSON.stringify(p.body)).toBe(200);
    expect(p.body).toMatchObject({
      file: { encoding: "utf-8", bom: false, delimiter: ";" },
      mapping: { decimal: ",", columns: { sku: { header: "Code" }, description: { header: "Name" }, price: { header: "Net price" }, packQuantity: { header: "Pack size" }, packUnit: { header: "Unit" } } },
      summary: { rows: 2, priced: 2, blankRows: 2, errors: 0, warnings: 0, complete: true },
    });
    expect(p.body.changes.map((c: { listedDescription: string; newPrice: string }) => [c.listedDescription, c.newPrice])).toEqual([
      ['Hog casings 32/35; bundle of 5 "prime" hanks', "205.0000"], ["Black pepper, coarse", "14.2000"],
    ]);
    expect((await apply(s.supplierId, { file: fixture("semicolon-decimal-comma.csv"), effectiveFrom: "2027-03-01" })).status).toBe(201);
  });

  it("a quoted description with a line break is one row, kept exactly (line break and quotes)", async () => {
    const s = await setup();
    const r = await apply(s.supplierId, { file: fixture("quoted-multiline.csv"), effectiveFrom: "2027-03-01" });
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body.changes.map((c: { row: number; sku: string }) => [c.row, c.sku])).toEqual([[2, "HOG-B5"], [3, "COL-50"]]);
    expect(r.body.summary).toMatchObject({ rows: 2, blankRows: 2 });
    const prices = await pricesOf(s.supplierId);
    expect(prices.find((x) => x.sku === "HOG-B5")!.listed_description).toBe('Hog casings 32/35\r\nbundle of 5 hanks, "select"');
  });
});

describe("bad files: clear errors, nothing written", () => {
  it("broken quoting: the row is named, reading stops, applying writes nothing", async () => {
    const s = await setup();
    const p = await preview(s.supplierId, { file: fixture("broken-quoting.csv") });
    expect(p.status).toBe(200);
    expect(p.body.summary.complete).toBe(false);
    expect(p.body.errors).toEqual([expect.objectContaining({ row: 3, column: null, message: expect.stringMatching(/^row 3: a quoted cell starts in this row and its closing quote never comes/) })]);
    const r = await apply(s.supplierId, { file: fixture("broken-quoting.csv") });
    expect(r.status).toBe(422);
    expect(r.body.error).toMatchObject({ code: "VALIDATION", message: "The price list has 1 row error; nothing was written. Correct the file (or the column mapping) and send it again." });
    expect(r.body.error.details.fields.file[0]).toMatch(/^row 3: /);
    expect(r.body.error.details.errors[0].row).toBe(3);
    await expectNothingWritten(s.supplierId);
  });

  it("no matching columns: 422 listing the headers found, for a preview too", async () => {
    const s = await setup();
    for (const dryRun of [true, false]) {
      const r = await send(s.supplierId, { file: fixture("no-matching-columns.csv"), dryRun });
      expect(r.status).toBe(422);
      expect(r.body.error.code).toBe("VALIDATION");
      expect(r.body.error.message).toMatch(/^No matching columns: none of this file's columns \("Contact", "Phone", "E-mail"\) looks like "Supplier SKU", "Pack price"/);
      expect(r.body.error.details.fields.file).toEqual([r.body.error.message]);
      expect(r.body.error.details.file).toMatchObject({ headers: ["Contact", "Phone", "E-mail"], sampleRows: [["Greta Holm", "+46 8 123 45", "greta@example.test"]] });
    }
    await expectNothingWritten(s.supplierId);
  });

  it("a workbook or other bytes named .csv: refused by the type check before anything is read as CSV", async () => {
    const s = await setup();
    const before = (await uploadsOf(a)).length;
    const xlsx = Uint8Array.from([0x50, 0x4b, 3, 4, 0x14, 0, 6, 0, ...new Array(200).fill(0)]);
    const r = await apply(s.supplierId, { file: xlsx, filename: "prices.csv" });
    expect(r.status).toBe(422);
    expect(r.body.error.details.fields.file[0]).toMatch(/is a spreadsheet workbook or ZIP archive \(\.xlsx, \.zip\) \(save the sheet as CSV first\)/);
    const binary = Uint8Array.from([0x00, 0x01, 0x02, 0xff, 0xfe, 0x00, 0x9c, 0x00, ...new Array(300).fill(0)]);
    const r2 = await apply(s.supplierId, { file: binary, filename: "prices.csv" });
    expect(r2.status).toBe(422);
    expect(Object.keys(r2.body.error.details.fields)).toEqual(["file"]);
    expect((await uploadsOf(a)).length).toBe(before);
    await expectNothingWritten(s.supplierId);
  });

  it("a 30 MB file: 413, reading stops at 25 MB, nothing stored or written", async () => {
    const s = await setup();
    const before = (await uploadsOf(a)).length;
    const body = multipart([
      { name: "dryRun", value: "false" },
      { name: "file", filename: "huge.csv", contentType: "text/csv", content: { head: bytes("SKU,Price\n"), fill: bytes("PEP-1K,14.20\n"), size: 30 * 1024 * 1024 } },
    ]);
    const r = await postBody(s.supplierId, body);
    expect(r.status).toBe(413);
    expect(r.body.error.message).toBe('The file "huge.csv" is larger than 25 MB. Nothing was stored; send a smaller file.');
    expect(body.pulled()).toBeLessThan(26 * 1024 * 1024);
    expect((await uploadsOf(a)).length).toBe(before);
    await expectNothingWritten(s.supplierId);
  });

  it("row findings: unknown SKU (warning, skipped), zero and negative price, SKU twice, a unit that does not convert (errors), a differing pack (warning)", async () => {
    const s = await setup();
    const p = await preview(s.supplierId, { file: fixture("problems.csv") });
    expect(p.status, JSON.stringify(p.body)).toBe(200);
    const errors = p.body.errors.map((e: { row: number; column: string; field: string; message: string }) => [e.row, e.column, e.field, e.message]);
    expect(errors).toEqual([
      [4, "Price", "price", "row 4, column 'Price': the price is 0; a pack price must be more than 0 (leave an item without a price out of the list)"],
      [5, "Price", "price", "row 5, column 'Price': the price is negative (-22.00); a pack price must be more than 0"],
      [6, "SKU", "sku", "row 6, column 'SKU': the SKU \"hog-b5\" is listed twice: it is first on row 2; keep one price per SKU"],
      [7, "Unit", "packUnit", expect.stringMatching(/^row 7, column 'Unit': the pack unit "pc" does not convert to g, the stock unit of SKU-.*: "pc" is a count unit and this item is stocked in g \(mass\)\.$/)],
    ]);
    const warnings = p.body.warnings.map((w: { row: number; field: string; message: string }) => [w.row, w.field, w.message]);
    expect(warnings).toEqual([
      [3, "sku", "row 3, column 'SKU': unknown SKU \"NOPE-1\": no item of this supplier has it, so the row is skipped (add the item on the supplier's page to price it)"],
      [8, "packQuantity", expect.stringMatching(/^row 8, column 'Pack size': the list's pack is 10 hank \(10 pc\), but HOG-B50 is on record as "bundle of 50 hanks" \(50 pc\); the price is recorded per the pack on record/)],
    ]);
    expect(p.body.summary).toMatchObject({ rows: 7, priced: 2, skipped: 1, rejected: 4, errors: 4, warnings: 2 });

    const r = await apply(s.supplierId, { file: fixture("problems.csv") });
    expect(r.status).toBe(422);
    expect(r.body.error.message).toBe("The price list has 4 row errors; nothing was written. Correct the file (or the column mapping) and send it again.");
    expect(r.body.error.details.errors).toHaveLength(4);
    expect(r.body.error.details.fields.file).toHaveLength(4);
    await expectNothingWritten(s.supplierId); // HOG-B5 (row 2) and HOG-B50 (row 8) were fine: all or nothing
  });

  it("another currency and a GTIN with a wrong check digit are row errors; a valid GTIN that differs is a warning", async () => {
    const s = await setup();
    const csv = "SKU,Price,Currency,EAN\nPEP-1K,14.20,USD,\nPAP-500,7.80,EUR,4006381333932\nHOG-B50,1850.00,eur,0012345678905\nHOG-B5,189.50,,\n";
    const p = await preview(s.supplierId, { file: csv });
    expect(p.status, JSON.stringify(p.body)).toBe(200);
    expect(p.body.errors.map((e: { row: number; field: string; message: string }) => [e.row, e.field, e.message])).toEqual([
      [2, "currency", "row 2, column 'Currency': the price is in \"USD\", but your company trades in EUR; send the list in EUR or leave this row out"],
      [3, "gtin", "row 3, column 'EAN': '4006381333932' is not a valid GTIN (8, 12, 13 or 14 digits with a correct check digit)"],
    ]);
    expect(p.body.warnings.map((w: { row: number; field: string; message: string }) => [w.row, w.field, w.message])).toEqual([
      [4, "gtin", "row 4, column 'EAN': the GTIN 00012345678905 differs from the one on record for HOG-B50 (04006381333931); the price is taken by SKU"],
    ]);
    expect((await apply(s.supplierId, { file: csv })).status).toBe(422);
    await expectNothingWritten(s.supplierId);
  });

  it("bad text fields: mapping that is not JSON or breaks the mapping's rules, a date that does not exist", async () => {
    const s = await setup();
    const csv = fixture("utf8-bom-comma.csv");
    const notJson = await preview(s.supplierId, { file: csv, mapping: "{sku:" });
    expect(notJson.status).toBe(422);
    expect(notJson.body.error.details.fields.mapping[0]).toMatch(/^Send the mapping as JSON/);
    const sameSeparators = await preview(s.supplierId, { file: csv, mapping: { columns: { sku: { header: "SKU" }, price: { header: "Pack price" } }, decimal: ",", thousands: "," } });
    expect(sameSeparators.status).toBe(422);
    expect(sameSeparators.body.error.details.fields).toEqual({ "mapping.thousands": ["The thousands separator must differ from the decimal separator."] });
    const badDate = await preview(s.supplierId, { file: csv, effectiveFrom: "2027-02-30" });
    expect(badDate.status).toBe(422);
    expect(badDate.body.error.details.fields).toEqual({ effectiveFrom: ["No such date."] });
    await expectNothingWritten(s.supplierId);
  });
});

describe("applying", () => {
  it("warnings do not stop it: known rows priced, unknown skipped, warnings kept on the import", async () => {
    const s = await setup();
    const r = await apply(s.supplierId, { file: fixture("warnings-only.csv"), effectiveFrom: "2027-04-01" });
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body.import.counts).toMatchObject({ rows: 3, priced: 2, skipped: 1, firstPrices: 2, warnings: 2 });
    expect(r.body.import.warnings.map((w: { row: number }) => w.row)).toEqual([3, 4]);
    expect((await pricesOf(s.supplierId)).map((x) => [x.sku, x.pack_price])).toEqual([["HOG-B5", "194.2500"], ["HOG-B50", "1850.0000"]]);
  });

  it("the same file applied twice posts once and answers the earlier import as already applied", async () => {
    const s = await setup();
    const first = await applyBaseline(s);
    const prices = await pricesOf(s.supplierId);
    const again = await apply(s.supplierId, { file: fixture("utf8-bom-comma.csv"), filename: "renamed.csv", effectiveFrom: "2027-06-01" });
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ status: "already_applied", import: { id: first.body.import.id, effectiveFrom: BASELINE_DATE }, changes: [] });
    expect(again.body.message).toMatch(/^Already applied: this file was applied for .* on \d{4}-\d{2}-\d{2} by .*\(3 first prices\)\. Nothing was posted again\.$/);
    expect(await pricesOf(s.supplierId)).toEqual(prices);
    expect(await importsOf(s.supplierId)).toHaveLength(1);
    // a preview of it says so
    const p = await preview(s.supplierId, { file: fixture("utf8-bom-comma.csv") });
    expect(p.body.appliedBefore.id).toBe(first.body.import.id);
    expect(p.body.message).toMatch(/already applied for .* applying it again posts nothing\.$/);
    // the same file for another supplier is another import
    const other = await setup();
    expect((await apply(other.supplierId, { file: fixture("utf8-bom-comma.csv"), effectiveFrom: BASELINE_DATE })).status).toBe(201);
  });

  it("two copies of the same file applied at once: one import, one set of prices", async () => {
    const s = await setup();
    const file = fixture("utf8-bom-comma.csv");
    const [x, y] = await Promise.all([apply(s.supplierId, { file, effectiveFrom: BASELINE_DATE }), apply(s.supplierId, { file, effectiveFrom: BASELINE_DATE })]);
    expect([x.status, y.status].sort()).toEqual([200, 201]);
    expect(await importsOf(s.supplierId)).toHaveLength(1);
    expect(await pricesOf(s.supplierId)).toHaveLength(3);
  });

  it("a later list for the same date replaces the price (one per supplier item and date)", async () => {
    const s = await setup();
    await applyBaseline(s);
    const r = await apply(s.supplierId, { file: "SKU,Price\nPEP-1K,15.00\n", effectiveFrom: BASELINE_DATE });
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body.mappingSource).toBe("proposed"); // the remembered mapping names "Pack price", which this file lacks
    expect(r.body.changes).toEqual([expect.objectContaining({ sku: "PEP-1K", oldPrice: "14.2000", newPrice: "15.0000", direction: "up", changePercent: "5.6" })]);
    const pep = (await pricesOf(s.supplierId)).filter((x) => x.sku === "PEP-1K");
    expect(pep.map((x) => [x.pack_price, x.effective_from, x.price_list_import_id])).toEqual([["15.0000", BASELINE_DATE, r.body.import.id]]);
  });

  it("the mapping a person sets is remembered for the supplier's next list; ?dryRun=true works like the field", async () => {
    const s = await setup();
    const p = await preview(s.supplierId, { file: fixture("order-code-header.csv") });
    expect(p.status).toBe(200);
    expect(p.body.proposal.missingRequired).toEqual(["sku"]);
    expect(p.body.errors).toEqual([expect.objectContaining({ row: 1, message: "row 1: no column is chosen for Supplier SKU" })]);
    const mapping = { ...p.body.mapping, columns: { ...p.body.mapping.columns, sku: { header: "Bestell-Nr." } } };
    const r = await apply(s.supplierId, { file: fixture("order-code-header.csv"), mapping, effectiveFrom: "2027-05-01" });
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body.warnings.map((w: { message: string }) => w.message)).toEqual([expect.stringMatching(/^row 4, column 'Bestell-Nr\.': unknown SKU "ANIS-9"/)]);
    expect((await mappingOf(s.supplierId)).mapping).toEqual(mapping);

    const next = "Bestell-Nr.;Bezeichnung;Preis;Einheit\r\nPEP-1K;Pfeffer;13,80;\r\n";
    const q = await send(s.supplierId, { file: next, effectiveFrom: "2027-06-01" }, "buyer", "?dryRun=true");
    expect(q.status, JSON.stringify(q.body)).toBe(200);
    expect(q.body).toMatchObject({ status: "preview", mappingSource: "remembered", mapping, summary: { priced: 1, raised: 1 } });
    expect(q.body.changes[0]).toMatchObject({ sku: "PEP-1K", oldPrice: "13.1000", newPrice: "13.8000", changePercent: "5.3" });
  });
});

describe("a list longer than one batch (10,000 rows)", () => {
  it("every row is counted, 1,000 changes are listed and the rest counted; an error on the last row writes nothing from the earlier batches", async () => {
    const s = await setup();
    const spice = await createItem(a.company.id, { category: "spice" });
    const n = 12_000;
    const rows = Array.from({ length: n }, (_, i) => ({
      company_id: a.company.id, supplier_id: s.supplierId, item_id: spice.id, sku: `BULK-${i}`, pack_label: "1 kg bag", pack_quantity: "1000", pack_unit: "g", pack_size_stock: "1000",
    }));
    for (let i = 0; i < n; i += 2000) await db()("supplier_items").insert(rows.slice(i, i + 2000));
    const list = (price: (i: number) => string, last = "") =>
      `SKU,Price\n${Array.from({ length: n }, (_, i) => `BULK-${i},${price(i)}\n`).join("")}${last}`;
    const first = await apply(s.supplierId, { file: list(() => "10.00"), effectiveFrom: "2027-01-01" });
    expect(first.status, JSON.stringify(first.body.error ?? first.body.summary)).toBe(201);
    expect(first.body.summary).toMatchObject({ rows: n, priced: n, firstPrices: n, moreChanges: n - 1000 });
    expect(first.body.changes).toHaveLength(1000);
    expect(first.body.changes.at(-1).row).toBe(1001); // file order: rows 2 to 1001

    // every third price up, every third down, the rest the same; the last row has a zero price
    const next = (i: number) => ["10.50", "9.50", "10.00"][i % 3]!;
    const broken = await apply(s.supplierId, { file: list(next, "PEP-1K,0\n"), effectiveFrom: "2027-02-01" });
    expect(broken.status).toBe(422);
    expect(broken.body.error.details.errors).toEqual([expect.objectContaining({ row: n + 2, field: "price" })]);
    expect(await db()("supplier_item_prices as p").join("supplier_items as si", "si.id", "p.supplier_item_id").where({ "si.supplier_id": s.supplierId, "p.effective_from": "2027-02-01" }).count("* as n").first())
      .toEqual({ n: "0" });

    const ok = await apply(s.supplierId, { file: list(next), effectiveFrom: "2027-02-01" });
    expect(ok.status).toBe(201);
    expect(ok.body.summary).toMatchObject({ priced: n, raised: n / 3, lowered: n / 3, unchanged: n / 3, firstPrices: 0 });
    expect(ok.body.changes[0]).toMatchObject({ row: 2, sku: "BULK-0", direction: "up", changePercent: "5.0" });
    expect(ok.body.changes[1]).toMatchObject({ row: 3, sku: "BULK-1", direction: "down", changePercent: "-5.0" });
    expect(await db()("supplier_item_prices").where({ price_list_import_id: ok.body.import.id }).count("* as n").first()).toEqual({ n: String(n) });
  }, 90_000); // 12,000 rows twice over the real routes: seconds on an idle machine, more on a busy CI one
});

describe("text cells are data", () => {
  it("formula-like descriptions are stored as sent and neutralised in the CSV export", async () => {
    const s = await setup();
    const r = await apply(s.supplierId, { file: fixture("formula-text.csv"), effectiveFrom: "2027-03-01" });
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    const sent = ['=HYPERLINK("http://example.test/x","Click")', "+SUM(A1:A9)", "@cmd", "-2+3+cmd|' /C calc'!A0"];
    expect(r.body.changes.map((c: { listedDescription: string }) => c.listedDescription)).toEqual(sent);
    const stored = await pricesOf(s.supplierId);
    expect(stored.map((x) => x.listed_description).sort()).toEqual([...sent].sort());

    for (const [itemId, text] of [[s.items.hog, sent[0]], [s.items.pepper, sent[1]], [s.items.collagen, sent[2]], [s.items.paprika, sent[3]]] as const) {
      const json = await call(itemPricesGet, { path: `/api/items/${itemId}/prices`, params: { id: itemId }, cookie: cookie.buyer });
      expect(json.body.history[0].listedDescription).toBe(text);
      const csv = await itemPricesGet(buildRequest({ path: `/api/items/${itemId}/prices?format=csv`, cookie: cookie.buyer }), { params: Promise.resolve({ id: itemId }) });
      expect(csv.headers.get("content-type")).toBe("text/csv; charset=utf-8");
      const parsed = Papa.parse<string[]>(await csv.text(), { skipEmptyLines: true });
      const cell = parsed.data[1]!.at(-1);
      expect(cell).toBe(`'${text}`);
    }
  });
});

describe("history and comparison", () => {
  it("the supplier's import history, newest first", async () => {
    const s = await setup();
    const first = await applyBaseline(s);
    const second = await apply(s.supplierId, { file: fixture("windows-1252-semicolon.csv") });
    const r = await call(priceListsGet, { path: `/api/suppliers/${s.supplierId}/price-lists`, params: { id: s.supplierId }, cookie: cookie.accountant });
    expect(r.status).toBe(200);
    expect(r.body.imports.map((i: { id: string; counts: object }) => [i.id, i.counts])).toEqual([
      [second.body.import.id, { rows: 4, priced: 4, raised: 1, lowered: 1, unchanged: 1, firstPrices: 1, skipped: 0, warnings: 0 }],
      [first.body.import.id, { rows: 3, priced: 3, raised: 0, lowered: 0, unchanged: 0, firstPrices: 3, skipped: 0, warnings: 0 }],
    ]);
    // the upload is the company's record of the bytes: the name it was first sent under, its digest and size
    expect(r.body.imports[1].upload).toMatchObject({ id: first.body.upload.id, sha256: first.body.upload.sha256, size: fixture("utf8-bom-comma.csv").length });
  });

  it("an item's prices: history per supplier item and the per-unit comparison across suppliers, cheapest first", async () => {
    const s = await setup();
    await applyBaseline(s); // HOG-B5 189.50 on 2027-01-01
    await apply(s.supplierId, { file: fixture("windows-1252-semicolon.csv") }); // HOG-B5 199.00, HOG-B50 1850.00 on 2027-02-01
    // a second supplier sells the same casing in bundles of 10 hanks
    const other = await call(supplierCreate, { path: "/api/suppliers", body: { name: `Fenwick Natural ${tag()}`, leadTimeDays: 5 }, cookie: cookie.buyer });
    const si = await call(supplierItemCreate, {
      path: `/api/suppliers/${other.body.id}/items`, params: { id: other.body.id }, cookie: cookie.buyer,
      body: { sku: "FN-H10", item: s.items.hog, packLabel: "bundle of 10 hanks", packQuantity: "10", packUnit: "hank" },
    });
    expect(si.status).toBe(201);
    expect((await apply(other.body.id, { file: "Code,Price\nFN-H10,380.00\n", effectiveFrom: "2027-01-15" })).status).toBe(201);

    const r = await call(itemPricesGet, { path: `/api/items/${s.items.hog}/prices?on=2027-02-01`, params: { id: s.items.hog }, cookie: cookie.buyer });
    expect(r.status, JSON.stringify(r.body)).toBe(200);
    expect(r.body.units).toEqual([{ unit: "hank", label: "hank" }, { unit: "m", label: "m" }, { unit: "yd", label: "yd" }]);
    // per hank: 1850 / 50 = 37, 380 / 10 = 38, 199 / 5 = 39.80; per yd = per hank / 100 (a hank is 100 yd, trade-facts §4)
    expect(r.body.offers.map((o: { supplierItem: { sku: string }; current: { packPrice: string; perUnit: { price: string }[] }; cheapest: boolean }) =>
      [o.supplierItem.sku, o.current.packPrice, o.current.perUnit.map((u) => u.price), o.cheapest])).toEqual([
      ["HOG-B50", "1850.0000", ["37.0000", fraction("37 / 91.44").valueOf().toFixed(4), "0.3700"], true],
      ["FN-H10", "380.0000", ["38.0000", fraction("38 / 91.44").valueOf().toFixed(4), "0.3800"], false],
      ["HOG-B5", "199.0000", ["39.8000", fraction("39.8 / 91.44").valueOf().toFixed(4), "0.3980"], false],
    ]);
    expect(r.body.history.map((h: { sku: string; packPrice: string; effectiveFrom: string; direction: string; changePercent: string | null; source: string }) =>
      [h.sku, h.packPrice, h.effectiveFrom, h.direction, h.changePercent, h.source])).toEqual([
      ["HOG-B5", "199.0000", "2027-02-01", "up", "5.0", "price_list"],
      ["HOG-B50", "1850.0000", "2027-02-01", "new", null, "price_list"],
      ["FN-H10", "380.0000", "2027-01-15", "new", null, "price_list"],
      ["HOG-B5", "189.5000", "2027-01-01", "new", null, "price_list"],
    ]);
    // on an earlier day the earlier prices are current
    const before = await call(itemPricesGet, { path: `/api/items/${s.items.hog}/prices?on=2027-01-10`, params: { id: s.items.hog }, cookie: cookie.buyer });
    expect(before.body.offers.map((o: { supplierItem: { sku: string }; current: { packPrice: string } | null; cheapest: boolean }) => [o.supplierItem.sku, o.current?.packPrice ?? null, o.cheapest])).toEqual([
      ["HOG-B5", "189.5000", true], ["FN-H10", null, false], ["HOG-B50", null, false],
    ]);
  });
});

describe("permissions and tenancy", () => {
  it("a buyer, manager and admin may send a price list; a kitchen lead or accountant gets 403 before a byte is read", async () => {
    const s = await setup();
    for (const who of ["kitchen_lead", "accountant"]) {
      const body = multipart(partsOf({ file: fixture("utf8-bom-comma.csv"), dryRun: true }));
      const r = await postBody(s.supplierId, body, who);
      expect(r.status, who).toBe(403);
      expect(body.pulled()).toBe(0);
    }
    for (const who of ["manager", "admin"]) expect((await preview(s.supplierId, { file: fixture("utf8-bom-comma.csv") }, who)).status, who).toBe(200);
    // reading: accountants read the history and prices; kitchen leads do not see buying
    expect((await call(priceListsGet, { path: `/api/suppliers/${s.supplierId}/price-lists`, params: { id: s.supplierId }, cookie: cookie.kitchen_lead })).status).toBe(403);
    expect((await call(itemPricesGet, { path: `/api/items/${s.items.hog}/prices`, params: { id: s.items.hog }, cookie: cookie.kitchen_lead })).status).toBe(403);
    expect((await call(itemPricesGet, { path: `/api/items/${s.items.hog}/prices`, params: { id: s.items.hog }, cookie: cookie.accountant })).status).toBe(200);
  });

  it("another company's supplier and item are 404, and nothing of theirs is read or written", async () => {
    const s = await setup();
    const body = multipart(partsOf({ file: fixture("utf8-bom-comma.csv"), dryRun: false }));
    const r = await postBody(s.supplierId, body, "otherBuyer");
    expect(r.status).toBe(404);
    expect(body.pulled()).toBe(0);
    await expectNothingWritten(s.supplierId);
    expect((await call(priceListsGet, { path: `/api/suppliers/${s.supplierId}/price-lists`, params: { id: s.supplierId }, cookie: cookie.otherBuyer })).status).toBe(404);
    expect((await call(itemPricesGet, { path: `/api/items/${s.items.hog}/prices`, params: { id: s.items.hog }, cookie: cookie.otherBuyer })).status).toBe(404);
    // company b's own supplier with the same SKUs sees none of company a's prices
    await applyBaseline(s);
    const theirs = await call(supplierCreate, { path: "/api/suppliers", body: { name: `B Supplier ${tag()}`, leadTimeDays: 1 }, cookie: cookie.otherBuyer });
    const p = await send(theirs.body.id, { file: fixture("utf8-bom-comma.csv"), dryRun: true }, "otherBuyer");
    expect(p.status).toBe(200);
    expect(p.body.summary).toMatchObject({ priced: 0, skipped: 3 }); // no supplier items of theirs: every SKU unknown
  });
});
