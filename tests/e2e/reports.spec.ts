// Story: the accountant closes the books for last month. She opens Reports, then Usage, picks last
// month and one kitchen, reads the totals, downloads the CSV and the spreadsheet and finds in both
// the rows and the same total as the page (and as worked by hand below); she opens an item's
// movements of the month; then the valuation at the end of last month shows the stock's value per
// kitchen and category, and the price variance shows what a supplier's delivery cost over the order
// and the price list. A test company (the suites never use the demo data); no serious or critical
// axe findings; screenshots at 1024 and 1280 px.
//
// The ledger (Europe/London, the company's cost formula FIFO: IAS 2 para. 25, costs per gram), every
// movement backdated into LAST month M (relative to the real today, so the pages' defaults apply),
// in two kitchens A and B:
//   M-01  A receipt spice lot S1 1000 g @ 0.010 = 10.00      M-05  A receipt spice lot S2 1000 g @ 0.016 = 16.00
//   M-02  A receipt cure lot C1 5000 g @ 0.004 = 20.00
//   M-10  A use spice 1500 g   FIFO 1000 x 0.010 + 500 x 0.016 = 18.00
//   M-11  A use cure 250 g     FIFO 250 x 0.004 = 1.00
//   M-12  A waste spice 100 g  FIFO 100 x 0.016 = 1.60
//   M-14  A -> B spice 200 g   FIFO 200 x 0.016 = 3.20 (a transfer: not usage)
//   M-16  A count spice 150 g (200 on hand): -50 g, FIFO -50 x 0.016 = -0.80 (a count difference, apart)
//   M-18  B use spice 100 g    FIFO 100 x 0.016 = 1.60
// Usage in M, kitchen A: cure used 1.00; spice used 18.00 + wasted 1.60 = 19.60; cost in all 20.60;
//   count differences -0.80. (All kitchens: 20.60 + B's 1.60 = 22.20.)
// Valuation at the end of M: A spice 150 g x 0.016 = 2.40, A cure 4750 g x 0.004 = 19.00,
//   B spice 100 g x 0.016 = 1.60; A 21.40, B 1.60, cures 19.00, spices 4.00; total 23.00.
//
// Price variance (common practice: a pack price over the pack's size is the price per stock unit,
// the value of a difference is the difference per unit x the quantity): the supplier's sent order
// (tests/support/deliveries.ts) has PAP-1KG 10 x 12.50 a 1 kg bag and CURE-5KG 2 x 30.00 a 5 kg
// tub; its price list has PAP-1KG at 12.80 from M-01 and nothing for the cure. Delivered in M:
// PAP-1KG 10 x 13.00 -> over order (0.0130 - 0.0125) x 10000 g = 5.00, over list (0.0130 - 0.0128)
// x 10000 g = 2.00; CURE-5KG 2 x 30.00 -> over order 0.00, no list price ("—", left out).
// Totals: over order 5.00, over list 2.00 (1 line without a list price).
import { readFile } from "node:fs/promises";
import ExcelJS from "exceljs";
import Papa from "papaparse";
import { expect, test, type Page } from "@playwright/test";
import { closeDb, db } from "../../db/client";
import { companyDay, deliveryScenario } from "../support/deliveries";
import { createCompany, tag, type TestCompany, type TestKitchen } from "../support/factory";
import { createItem } from "../support/stock";
import { seriousViolations, signedInPage } from "./support";

let co: TestCompany;
let M: string; // last month, yyyy-mm
let A: TestKitchen;
let B: TestKitchen;
let spice: { id: string; sku: string };
let cure: { id: string; sku: string };
let supplierName: string;

const prev = (month: string) => {
  const [y, m] = month.split("-").map(Number) as [number, number];
  return m === 1 ? `${y - 1}-12` : `${y}-${String(m - 1).padStart(2, "0")}`;
};
const lastDay = (month: string) => {
  const [y, m] = month.split("-").map(Number) as [number, number];
  return `${month}-${String(new Date(Date.UTC(y, m, 0)).getUTCDate()).padStart(2, "0")}`;
};
const at = (day: number) => `${M}-${String(day).padStart(2, "0")}T10:00:00Z`;
/** "€20.60" -> cents, exactly (the page's figures are decimal strings with a symbol) */
const cents = (shown: string) => {
  const m = /^(−|-)?€([\d,]+)\.(\d{2})$/.exec(shown.trim());
  if (!m) throw new Error(`Not an amount: ${shown}`);
  return (m[1] ? -1 : 1) * (Number(m[2]!.replace(/,/g, "")) * 100 + Number(m[3]));
};
const noSidewaysScroll = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth <= document.documentElement.clientWidth);

test.beforeAll(async ({ browser }) => {
  co = await createCompany({ kitchens: 2 });
  await db()("companies").where({ id: co.company.id }).update({ cost_formula: "fifo" });
  M = prev((await companyDay(co.company.id)).slice(0, 7));
  [A, B] = [co.kitchens[0]!, co.kitchens[1]!];
  spice = await createItem(co.company.id, { category: "spice", trackLots: true, trackDates: true });
  cure = await createItem(co.company.id, { category: "cure" });
  const later = await companyDay(co.company.id, 400);

  const admin = await signedInPage(browser, co.users.admin.email, co.password);
  const post = async (data: Record<string, unknown>) => {
    const r = await admin.request.post("/api/movements", { data });
    expect(r.status(), await r.text()).toBe(201);
    return (await r.json()).movements as { lot: { id: string } }[];
  };
  await post({ kind: "receipt", kitchen: A.code, item: spice.sku, quantity: "1000", unit: "g", occurredAt: at(1), lot: { code: `S1-${tag()}`, date: later, dateKind: "best_before", unitCost: "0.010" } });
  await post({ kind: "receipt", kitchen: A.code, item: cure.sku, quantity: "5000", unit: "g", occurredAt: at(2), lot: { code: `C1-${tag()}`, date: later, dateKind: "use_by", unitCost: "0.004" } });
  const [s2] = await post({ kind: "receipt", kitchen: A.code, item: spice.sku, quantity: "1000", unit: "g", occurredAt: at(5), lot: { code: `S2-${tag()}`, date: later, dateKind: "best_before", unitCost: "0.016" } });
  await post({ kind: "use", kitchen: A.code, item: spice.sku, quantity: "1500", unit: "g", occurredAt: at(10) });
  await post({ kind: "use", kitchen: A.code, item: cure.sku, quantity: "250", unit: "g", occurredAt: at(11) });
  await post({ kind: "waste", kitchen: A.code, item: spice.sku, quantity: "100", unit: "g", reason: "spilt on the floor", occurredAt: at(12) });
  await post({ kind: "transfer", kitchen: A.code, toKitchen: B.code, item: spice.sku, quantity: "200", unit: "g", occurredAt: at(14) });
  await post({ kind: "count", kitchen: A.code, item: spice.sku, lot: s2!.lot.id, quantity: "150", unit: "g", occurredAt: at(16) });
  await post({ kind: "use", kitchen: B.code, item: spice.sku, quantity: "100", unit: "g", occurredAt: at(18) });
  await admin.context().close();

  // the delivery for the price variance: keyed in by the buyer against the sent order, booked, and
  // its booking time moved into M (the report reads deliveries.posted_at)
  const s = await deliveryScenario(co.company.id, A.id, co.users.buyer.id);
  supplierName = s.supplierName;
  await db()("supplier_item_prices").insert({ company_id: co.company.id, supplier_item_id: s.si["PAP-1KG"], pack_price: "12.80", effective_from: `${M}-01` });
  const buyer = await signedInPage(browser, co.users.buyer.email, co.password);
  const keyed = await buyer.request.post("/api/deliveries/keyed", {
    data: {
      supplier: s.supplierId, kitchen: A.code, order: s.orderId, noteNumber: `DN-${tag()}`,
      lines: [
        { sku: "PAP-1KG", quantity: "10", unitPrice: "13.00" },
        { sku: "CURE-5KG", quantity: "2", unitPrice: "30.00", lot: `CU-${tag()}`, date: later, dateKind: "use_by" },
      ],
    },
  });
  expect(keyed.status(), await keyed.text()).toBe(201);
  const delivery = await keyed.json();
  for (const line of delivery.lines as { id: string }[]) {
    const r = await buyer.request.patch(`/api/deliveries/${delivery.id}/lines/${line.id}`, { data: { decision: "accept" } });
    expect(r.status(), await r.text()).toBe(200);
  }
  const posted = await buyer.request.post(`/api/deliveries/${delivery.id}/post`);
  expect(posted.status(), await posted.text()).toBe(200);
  await db()("deliveries").where({ id: delivery.id }).update({ posted_at: new Date(at(20)) });
  await buyer.context().close();
});
test.afterAll(async () => {
  await closeDb();
});

test("the accountant reads last month's usage for one kitchen and downloads it as CSV and as a spreadsheet", async ({ browser }) => {
  test.setTimeout(120_000);
  const page = await signedInPage(browser, co.users.accountant.email, co.password);
  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Reports" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Reports" })).toBeVisible();
  await page.getByRole("link", { name: /^Usage/ }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Usage" })).toBeVisible();
  // by default: last month, every kitchen
  await expect(page.getByLabel("From month")).toHaveValue(M);
  await expect(page.getByLabel("To month")).toHaveValue(M);

  await page.getByLabel("From month").fill(M);
  await page.getByLabel("To month").fill(M);
  await page.getByLabel("Kitchens", { exact: true }).selectOption(A.code);
  await page.getByRole("button", { name: "Show" }).click();
  await expect(page).toHaveURL(new RegExp(`from=${M}&to=${M}.*kitchen=${A.code}`));
  await expect(page.getByRole("heading", { level: 1 })).toContainText(A.name);
  await expect(page.getByText("Costed by FIFO")).toBeVisible();

  const table = page.getByRole("table", { name: /Usage and cost by month and item/ });
  const spiceRow = table.getByRole("row").filter({ hasText: spice.sku });
  await expect(spiceRow.getByRole("cell")).toHaveText(["1,500 g", "€18.00", "100 g", "€1.60", "€19.60", "−50 g", "−€0.80"]);
  await expect(table.getByRole("row").filter({ hasText: "Cure" }).getByRole("cell").nth(4)).toHaveText("€1.00");
  const totalShown = (await page.getByTestId("usage-total-cost").textContent())!;
  expect(totalShown).toBe("€20.60"); // hand-worked above
  await expect(page.getByTestId("usage-total-count")).toHaveText("−€0.80");
  // cure is on the page: its caution, once
  await expect(page.getByRole("complementary", { name: "Cure caution" })).toHaveCount(1);
  // the chart's figures, in the table beside it (the category run of the same report)
  const chartTable = page.getByRole("table", { name: "Cost per month by category" });
  await expect(chartTable.getByRole("row").nth(1).getByRole("cell")).toHaveText(["€1.00", "€0.00", "€19.60", "€0.00", "€20.60"]);
  await expect(page.locator("section[aria-labelledby='usage-chart'] .recharts-bar-rectangle").first()).toBeVisible();

  expect(await seriousViolations(page)).toEqual([]);
  expect(await noSidewaysScroll(page)).toBe(true);
  await page.screenshot({ path: "tests/e2e/screenshots/reports-usage-1024.png", fullPage: true });

  // the CSV: the rows and a total equal to the page's
  const [csvDownload] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: "CSV", exact: true }).click()]);
  expect(csvDownload.suggestedFilename()).toBe(`usage-${M}-to-${M}-by-item-${A.code}.csv`);
  const csv = Papa.parse<Record<string, string>>(await readFile((await csvDownload.path())!, "utf8"), { header: true, skipEmptyLines: true });
  expect(csv.errors).toEqual([]);
  expect(csv.data.map((r) => [r.month, r.category, r.used_quantity, r.wasted_quantity, r.cost, r.count_difference_quantity, r.count_difference_cost])).toEqual([
    [M, "cure", "250", "0", "1.00", "0", "0.00"],
    [M, "spice", "1500", "100", "19.60", "-50", "-0.80"],
  ]);
  expect(csv.data.reduce((sum, r) => sum + cents(`€${r.cost}`), 0)).toBe(cents(totalShown));

  // the CSV for spreadsheet programs: the same, led by a byte order mark
  const [bomDownload] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: "CSV for spreadsheet programs" }).click()]);
  const bytes = await readFile((await bomDownload.path())!);
  expect([...bytes.subarray(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);

  // the spreadsheet: the same rows, and its totals line says the page's total
  const [xlsxDownload] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: "Spreadsheet (.xlsx)" }).click()]);
  expect(xlsxDownload.suggestedFilename()).toBe(`usage-${M}-to-${M}-by-item-${A.code}.xlsx`);
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.load(new Uint8Array(await readFile((await xlsxDownload.path())!)).buffer); // a copy of exactly the file's bytes
  const rows: unknown[][] = [];
  wb.worksheets[0]!.eachRow((row) => rows.push((row.values as unknown[]).slice(1)));
  const header = rows.findIndex((r) => r[0] === "Month");
  const costAt = rows[header]!.indexOf("Cost (EUR)");
  const body = rows.slice(header + 1);
  expect(body.map((r) => [r[0], r[costAt]])).toEqual([[M, 1], [M, 19.6], ["Total", 20.6]]);
  expect(body.slice(0, -1).map((r) => r[1])).toEqual([cure.sku, spice.sku]);
  expect(Math.round((body.at(-1)![costAt] as number) * 100)).toBe(cents(totalShown));

  // an item's movements of the month: the same engine run, its totals the row's
  await spiceRow.getByRole("link").click();
  await expect(page.getByRole("heading", { level: 1 })).toContainText(`, ${new Intl.DateTimeFormat("en-GB", { timeZone: "UTC", month: "long", year: "numeric" }).format(new Date(`${M}-01T00:00:00Z`))}`);
  await expect(page.getByTestId("drill-total-cost")).toHaveText("€19.60");
  const moves = page.getByRole("table", { name: /Movements of/ });
  await expect(moves.getByRole("row").filter({ hasText: "Wasted" })).toContainText("spilt on the floor");
  await expect(moves.getByRole("row").filter({ hasText: "Counted" })).toContainText("−€0.80");
  await expect(moves.getByRole("row").filter({ hasText: `Transfer out to ${B.code}` })).toContainText("Not usage");
  expect(await seriousViolations(page)).toEqual([]);
  expect(await noSidewaysScroll(page)).toBe(true);
  await page.screenshot({ path: "tests/e2e/screenshots/reports-usage-movements-1024.png", fullPage: true });
  await page.getByRole("navigation", { name: "Breadcrumb" }).getByRole("link", { name: "Usage" }).click();
  await expect(page.getByTestId("usage-total-cost")).toHaveText("€20.60");

  // every kitchen, by category: B's use adds 1.60
  await page.getByLabel("Kitchens", { exact: true }).selectOption("");
  await page.getByRole("button", { name: "Show" }).click();
  await page.getByRole("navigation", { name: "Group by" }).getByRole("link", { name: "Category" }).click();
  await expect(page).toHaveURL(/groupBy=category/);
  await expect(page.getByTestId("usage-total-cost")).toHaveText("€22.20");
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/reports-usage-category-1024.png", fullPage: true });
  // two months by kitchen: a block per month with its total (the month before M had nothing)
  await page.getByLabel("From month").fill(prev(M));
  await page.getByRole("button", { name: "Show" }).click();
  await page.getByRole("navigation", { name: "Group by" }).getByRole("link", { name: "Kitchen" }).click();
  await expect(page).toHaveURL(new RegExp(`from=${prev(M)}&to=${M}&groupBy=kitchen`));
  const byKitchen = page.getByRole("table", { name: /Usage and cost by month and kitchen/ });
  await expect(byKitchen.getByRole("row").filter({ hasText: B.code }).getByRole("cell").nth(2)).toHaveText("€1.60");
  await expect(page.getByTestId("usage-total-cost")).toHaveText("€22.20");
  expect(await seriousViolations(page)).toEqual([]);
  expect(await noSidewaysScroll(page)).toBe(true);
  await page.screenshot({ path: "tests/e2e/screenshots/reports-usage-kitchen-1024.png", fullPage: true });
  await page.setViewportSize({ width: 1280, height: 800 });
  await page.goto(`/reports/usage?from=${M}&to=${M}&kitchen=${A.code}`);
  await expect(page.getByTestId("usage-total-cost")).toHaveText("€20.60");
  await page.screenshot({ path: "tests/e2e/screenshots/reports-usage-1280.png", fullPage: true });
});

test("the valuation at the end of last month, per kitchen and category", async ({ browser }) => {
  const page = await signedInPage(browser, co.users.accountant.email, co.password);
  await page.goto("/reports/valuation");
  await expect(page.getByRole("heading", { level: 1, name: "Valuation" })).toBeVisible();
  await expect(page.getByLabel("At the end of")).toHaveValue(lastDay(M));
  await expect(page.getByTestId("valuation-total")).toHaveText("€23.00"); // hand-worked above
  const byKitchen = page.getByRole("table", { name: "Value by kitchen" });
  await expect(byKitchen.getByRole("row").filter({ hasText: A.code }).getByRole("cell")).toHaveText("€21.40");
  await expect(byKitchen.getByRole("row").filter({ hasText: B.code }).getByRole("cell")).toHaveText("€1.60");
  const byCategory = page.getByRole("table", { name: "Value by category" });
  await expect(byCategory.getByRole("row").filter({ hasText: "Cures" }).getByRole("cell")).toHaveText("€19.00");
  await expect(byCategory.getByRole("row").filter({ hasText: "Spices" }).getByRole("cell")).toHaveText("€4.00");
  const table = page.getByRole("table", { name: /Stock value at the end of/ });
  await expect(table.getByRole("row").filter({ hasText: spice.sku }).first().getByRole("cell")).toHaveText(["Spice", "150", "g", "€2.40"]);
  await expect(page.getByRole("complementary", { name: "Cure caution" })).toHaveCount(1);
  expect(await seriousViolations(page)).toEqual([]);
  expect(await noSidewaysScroll(page)).toBe(true);
  await page.screenshot({ path: "tests/e2e/screenshots/reports-valuation-1024.png", fullPage: true });

  const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: "CSV", exact: true }).click()]);
  const csv = Papa.parse<Record<string, string>>(await readFile((await download.path())!, "utf8"), { header: true, skipEmptyLines: true });
  expect(csv.data.map((r) => [r.kitchen_code, r.category, r.quantity, r.value])).toEqual([
    [A.code, "cure", "4750", "19.00"],
    [A.code, "spice", "150", "2.40"],
    [B.code, "spice", "100", "1.60"],
  ]);
  expect(csv.data.reduce((sum, r) => sum + cents(`€${r.value}`), 0)).toBe(cents("€23.00"));

  // one kitchen
  await page.getByLabel("Kitchens", { exact: true }).selectOption(B.code);
  await page.getByRole("button", { name: "Show" }).click();
  await expect(page.getByTestId("valuation-total")).toHaveText("€1.60");
  await expect(page.getByRole("complementary", { name: "Cure caution" })).toHaveCount(0);
  await page.setViewportSize({ width: 1280, height: 800 });
  await page.goto("/reports/valuation");
  await page.screenshot({ path: "tests/e2e/screenshots/reports-valuation-1280.png", fullPage: true });
});

test("the price variance of last month: over the order and over the price list, a dash where there is no list price", async ({ browser }) => {
  const page = await signedInPage(browser, co.users.accountant.email, co.password);
  await page.goto("/reports/price-variance");
  await expect(page.getByRole("heading", { level: 1, name: "Price variance" })).toBeVisible();
  await expect(page.getByLabel("From month")).toHaveValue(M);
  const table = page.getByRole("table", { name: /Price variance by supplier and month/ });
  await expect(table.getByRole("row").filter({ hasText: supplierName }).first()).toBeVisible();
  const paprika = table.getByRole("row").filter({ hasText: "1 kg bag" });
  await expect(paprika.getByRole("cell").nth(1)).toHaveText("€12.50 /kg");
  await expect(paprika.getByRole("cell").nth(2)).toHaveText("€13.00 /kg");
  await expect(paprika.getByRole("cell").nth(3)).toHaveText("€12.80 /kg");
  await expect(paprika.getByRole("cell").nth(4)).toHaveText("+€5.00");
  await expect(paprika.getByRole("cell").nth(5)).toHaveText("+€2.00");
  const cure = table.getByRole("row").filter({ hasText: "5 kg tub" });
  await expect(cure.getByRole("cell").nth(3)).toHaveText("—no list price");
  await expect(cure.getByRole("cell").nth(4)).toHaveText("€0.00");
  await expect(page.getByTestId("pv-total-order")).toHaveText("+€5.00");
  await expect(page.getByTestId("pv-total-list")).toHaveText("+€2.00");
  await expect(table.locator("tfoot")).toContainText("1 without a list price");
  await expect(page.getByRole("complementary", { name: "Cure caution" })).toHaveCount(1);
  expect(await seriousViolations(page)).toEqual([]);
  expect(await noSidewaysScroll(page)).toBe(true);
  await page.screenshot({ path: "tests/e2e/screenshots/reports-price-variance-1024.png", fullPage: true });

  const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: "CSV", exact: true }).click()]);
  const csv = Papa.parse<Record<string, string>>(await readFile((await download.path())!, "utf8"), { header: true, skipEmptyLines: true });
  expect(csv.data.map((r) => [r["Supplier"], r["Over order (EUR)"], r["Over list (EUR)"]])).toEqual([
    [supplierName, "5.00", "2.00"],
    [supplierName, "0.00", ""],
  ]);
  await page.setViewportSize({ width: 1280, height: 800 });
  await page.screenshot({ path: "tests/e2e/screenshots/reports-price-variance-1280.png", fullPage: true });
});
