// The usage and valuation reports as spreadsheet files: read back with exceljs, every figure equals
// the JSON report's decimal string (a spreadsheet number is a double; figures of at most 15
// significant digits come back as the same decimal), money cells carry the currency's decimals.
import ExcelJS from "exceljs";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as usageRoute } from "../../app/api/reports/usage/route";
import { GET as valuationRoute } from "../../app/api/reports/valuation/route";
import { postMovement } from "../../lib/data/ledger";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { buildRequest, call } from "../support/http";
import { currentUser, sessionCookieFor } from "../support/sessions";
import { createItem } from "../support/stock";

let co: TestCompany;
let cookie: string;

beforeAll(async () => {
  co = await createCompany({ kitchens: 1 });
  const m = await currentUser(co.users.manager.id);
  const K = co.kitchens[0]!.code;
  for (const [category, cost, used] of [["cure", "0.012345", "333.3"], ["casing", "1.25", "7"], ["spice", "0.02", "12.5"]] as const) {
    const item = await createItem(co.company.id, { category, trackLots: true, trackDates: true });
    const unit = category === "casing" ? "pc" : "g";
    await postMovement(m, { kind: "receipt", kitchen: K, item: item.sku, quantity: "1000", unit, occurredAt: "2026-10-02T09:00:00Z", lot: { code: `X-${tag()}`, date: "2027-09-01", dateKind: "best_before", unitCost: cost } } as never);
    await postMovement(m, { kind: "use", kitchen: K, item: item.sku, quantity: used, unit, occurredAt: "2026-10-12T09:00:00Z" } as never);
  }
  cookie = await sessionCookieFor(co.users.accountant.id);
});

async function sheetOf(handler: typeof usageRoute, path: string): Promise<ExcelJS.Worksheet> {
  const res = await handler(buildRequest({ path, cookie }), { params: Promise.resolve({}) });
  expect(res.status).toBe(200);
  expect(res.headers.get("content-type")).toBe("application/vnd.openxmlformats-officedocument.spreadsheetml.sheet");
  expect(res.headers.get("content-disposition")).toMatch(/attachment; filename=".+\.xlsx"/);
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.load(await res.arrayBuffer());
  return wb.worksheets[0]!;
}

/** The table under the preamble: header row, then data rows, as arrays of cell values. */
function table(ws: ExcelJS.Worksheet): unknown[][] {
  const rows: unknown[][] = [];
  ws.eachRow((row) => rows.push((row.values as unknown[]).slice(1)));
  const header = rows.findIndex((r) => r[0] === "Month" || r[0] === "Kitchen");
  return rows.slice(header);
}

describe("spreadsheet files", () => {
  it("usage: the rows and the totals line equal the JSON report, figures as numbers", async () => {
    const json = (await call(usageRoute, { path: "/api/reports/usage?from=2026-10&to=2026-10", cookie })).body;
    const ws = await sheetOf(usageRoute, "/api/reports/usage?from=2026-10&to=2026-10&format=xlsx");
    const [header, ...body] = table(ws);
    expect(header).toEqual(["Month", "SKU", "Item", "Category", "Unit", "Used", "Wasted", "Used cost (EUR)", "Wasted cost (EUR)", "Cost (EUR)", "Count difference", "Count difference (EUR)"]);
    const rows = body.slice(0, -1);
    const totals = body.at(-1)!;
    expect(rows).toHaveLength(json.rows.length);
    json.rows.forEach((r: Record<string, string> & { item: { sku: string } }, i: number) => {
      const cells = rows[i]!;
      expect(cells[0]).toBe(r.month);
      expect(cells[1]).toBe(r.item.sku);
      // each figure cell reads back as the very decimal of the report
      expect([cells[5], cells[6], cells[7], cells[8], cells[9], cells[10], cells[11]].map((c) => String(c))).toEqual(
        [r.usedQuantity, r.wastedQuantity, r.usedCost, r.wastedCost, r.cost, r.countDifferenceQuantity, r.countDifferenceCost].map((v) => String(Number(v))),
      );
      expect(typeof cells[9]).toBe("number");
    });
    // cure 333.3 g x 0.012345 = 4.1145885 -> 4.11; casing 7 x 1.25 = 8.75; spice 12.5 x 0.02 = 0.25: 13.11
    expect(totals[0]).toBe("Total");
    expect(totals[9]).toBe(13.11);
    expect(String(totals[9])).toBe(String(Number(json.totals.cost)));
    expect(ws.getRow(ws.rowCount).getCell(10).numFmt).toBe("#,##0.00");
  });

  it("valuation: one line per item with its value, the total line equal to the JSON total", async () => {
    const json = (await call(valuationRoute, { path: "/api/reports/valuation?asOf=2026-10-31", cookie })).body;
    const ws = await sheetOf(valuationRoute, "/api/reports/valuation?asOf=2026-10-31&format=xlsx");
    const [header, ...body] = table(ws);
    expect(header).toEqual(["Kitchen", "SKU", "Item", "Category", "On hand", "Unit", "Value (EUR)"]);
    expect(body.slice(0, -1).map((c) => [c[1], String(c[4]), String(c[6])])).toEqual(
      json.rows.map((r: { item: { sku: string }; quantity: string; value: string }) => [r.item.sku, String(Number(r.quantity)), String(Number(r.value))]),
    );
    // left: cure 666.7 x 0.012345 = 8.2304115 -> 8.23; casing 993 x 1.25 = 1241.25; spice 987.5 x 0.02 = 19.75: 1269.23
    expect(body.at(-1)![6]).toBe(1269.23);
    expect(json.totals.value).toBe("1269.23");
  });
});
