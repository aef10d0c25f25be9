// Stories of production and traceability (issue 4, sections 7 and 8), in one company with two
// kitchens; the kitchen lead works in the first:
// - the lead records production of a reserved batch: the meat came in heavier (20.4 kg for 20 kg)
//   and a little more cure was weighed (50.5 g for 50 g), split across two lots chosen by hand;
//   a cure weight the kitchen does not have is refused next to the cure field first. The sheet
//   shows the batch code big, the variance per line (signed) and the cure check on the actual
//   weights; an expired lot cannot be chosen;
// - the lot trace of the first cure lot lists the batch (with its 40 g), the transfer to the
//   second kitchen and what is left where; the batch trace lists every lot with its supplier;
//   both print without the navigation and link their CSV; the trace search finds both by code;
// - a second batch weighed with too much cure (30 g on 10 kg) goes on hold with the caution and
//   the HACCP advice; the lead cannot release it (no form, and the API says 403); a manager
//   releases it with the corrective action, and the sheet shows who and why.
// Check values (trade-facts §1-§2, 9 CFR 424.21(c)): comminuted maximum 156.25 ppm ingoing nitrite;
// 50.5 g x 0.0625 x 1e6 / 20,400 g = 154.7181 ppm (within); 30 g x 0.0625 x 1e6 / 10,000 g =
// 187.5 ppm (over). No serious or critical axe findings on each page; 1024 x 768 screenshots kept.
import { expect, test, type Browser, type Page } from "@playwright/test";
import { closeDb } from "../../db/client";
import { seriousViolations, signedInPage } from "./support";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { createItem, type TestItem } from "../support/stock";

test.describe.configure({ mode: "serial" });

let co: TestCompany;
let salt: TestItem;
let cure: TestItem;
let pepper: TestItem;
let hog: TestItem;
let recipeCode: string;
let firstBatch: string; // 20 kg, reserved
let secondBatch: string; // 10 kg, planned
let lotA: string; // the cure lot reserved first (earlier date)
let lotB: string; // a later cure lot
let batchCode: string;
const t = tag().slice(0, 6).toUpperCase();
const lotACode = `CA-${t}`;
const lotBCode = `CB-${t}`;
const expiredCode = `CX-${t}`;

const londonToday = () => new Intl.DateTimeFormat("en-CA", { timeZone: "Europe/London", year: "numeric", month: "2-digit", day: "2-digit" }).format(new Date());
const shift = (day: string, n: number) => {
  const d = new Date(`${day}T12:00:00Z`);
  d.setUTCDate(d.getUTCDate() + n);
  return d.toISOString().slice(0, 10);
};
const today = londonToday();
const tomorrow = shift(today, 1);

test.beforeAll(async ({ browser }) => {
  co = await createCompany({ kitchens: 2 });
  const [k1, k2] = [co.kitchens[0]!, co.kitchens[1]!];
  salt = await createItem(co.company.id, { category: "ingredient" });
  cure = await createItem(co.company.id, { category: "cure" }); // 6.25 % sodium nitrite, tracked by lot and date
  pepper = await createItem(co.company.id, { category: "spice" });
  hog = await createItem(co.company.id, { category: "casing" });
  const admin = await signedInPage(browser, co.users.admin.email, co.password);
  const receive = async (body: Record<string, unknown>) => {
    const res = await admin.request.post("/api/movements", { data: { kind: "receipt", supplier: "Brine & Co", ...body } });
    expect(res.status(), await res.text()).toBe(201);
    return ((await res.json()) as { movements: { lot: { id: string } }[] }).movements[0]!.lot.id;
  };
  await receive({ kitchen: k1.code, item: salt.sku, quantity: "5", unit: "kg", lot: { unitCost: "0.001" } });
  lotA = await receive({ kitchen: k1.code, item: cure.sku, quantity: "200", unit: "g", lot: { code: lotACode, date: shift(today, 200), dateKind: "use_by", unitCost: "0.004" } });
  lotB = await receive({ kitchen: k1.code, item: cure.sku, quantity: "100", unit: "g", lot: { code: lotBCode, date: shift(today, 300), dateKind: "use_by", unitCost: "0.004" } });
  // a lot past its use-by date is still on the shelf: it must not be offered for production
  await receive({ kitchen: k1.code, item: cure.sku, quantity: "20", unit: "g", lot: { code: expiredCode, date: shift(today, -2), dateKind: "use_by", unitCost: "0.004" } });
  await receive({ kitchen: k1.code, item: pepper.sku, quantity: "200", unit: "g", lot: { unitCost: "0.03" } });
  await receive({ kitchen: k1.code, item: hog.sku, quantity: "3", unit: "pc", lot: { unitCost: "12" } });
  // 30 g of the first cure lot goes to the second kitchen
  const moved = await admin.request.post("/api/movements", { data: { kind: "transfer", kitchen: k1.code, toKitchen: k2.code, item: cure.sku, quantity: "30", unit: "g", lot: lotA } });
  expect(moved.status(), await moved.text()).toBe(201);

  recipeCode = `FRK${t}`;
  const recipe = await admin.request.post("/api/recipes", {
    data: {
      code: recipeCode, name: "Yardside frankfurter", productClass: "comminuted", storage: "keep_refrigerated",
      meatBlock: [{ name: "Pork shoulder", percent: "70" }, { name: "Back fat", percent: "30" }],
      lines: [
        { item: salt.sku, rate: "18", unit: "g/kg" },
        { item: cure.sku, rate: "2.5", unit: "g/kg" },
        { item: pepper.sku, rate: "2.5", unit: "g/kg" },
      ],
      casing: { item: hog.sku, calibreMinMm: "32", calibreMaxMm: "36" },
    },
  });
  expect(recipe.status(), await recipe.text()).toBe(201);
  const plan = async (kg: string) => {
    const res = await admin.request.post("/api/batches", { data: { kitchen: k1.code, recipe: recipeCode, plannedFor: tomorrow, meatBlock: { quantity: kg, unit: "kg" } } });
    expect(res.status(), await res.text()).toBe(201);
    return ((await res.json()) as { id: string }).id;
  };
  firstBatch = await plan("20");
  secondBatch = await plan("10");
  const reserved = await admin.request.post(`/api/batches/${firstBatch}/reserve`, { data: {} });
  expect(reserved.status(), await reserved.text()).toBe(200);
  await admin.context().close();
});
test.afterAll(async () => {
  await closeDb();
});

const leadPage = (browser: Browser) => signedInPage(browser, co.users.kitchen_lead.email, co.password, co.kitchens[0]!.id);
const madeOn = () => today.slice(2).replace(/-/g, "");

async function openProduction(page: Page) {
  await page.getByRole("button", { name: "Record production" }).click();
  const sheet = page.getByRole("dialog", { name: "Record production" });
  await expect(sheet).toBeVisible();
  // the sheet fills the window's height from the top (no margin from the page's spacing pushes it down)
  await expect.poll(async () => (await sheet.boundingBox())?.y).toBe(0);
  await expect.poll(async () => { const b = await sheet.boundingBox(); return b ? b.y + b.height : null; }).toBe(768);
  return sheet;
}

test("a kitchen lead records a reserved batch as made: batch code, signed variance, the cure check on the actual weights", async ({ browser }) => {
  test.setTimeout(150_000);
  const page = await leadPage(browser);
  await page.goto(`/planning/batches/${firstBatch}`);
  await expect(page.getByText("Reserved", { exact: true }).first()).toBeVisible();
  const bom = page.getByRole("table", { name: /Bill of materials/ });
  // the reserved cure lot links to its trace
  await expect(bom.getByRole("link", { name: lotACode })).toHaveAttribute("href", `/planning/trace/lots/${lotA}`);

  const sheet = await openProduction(page);
  await expect(sheet.getByRole("complementary", { name: "Cure caution" })).toBeVisible();
  const meat = sheet.getByLabel("Actual meat block (green weight)", { exact: true });
  await expect(meat).toHaveValue("20"); // prefilled with the plan, in kg for a metric user
  await expect(meat).toBeFocused();
  const cureQty = sheet.getByLabel(`Actual ${cure.sku}`, { exact: true });
  await expect(cureQty).toHaveValue("50"); // 20 kg x 2.5 g/kg, in grams as planned
  await expect(sheet.getByLabel(`Actual ${salt.sku}`, { exact: true })).toHaveValue("360");
  await expect(sheet.getByLabel(`Actual ${salt.sku}: unit`, { exact: true })).toHaveValue("g");
  const cureLots = sheet.getByRole("group", { name: `Lots of ${cure.sku}` });
  await expect(cureLots).toContainText(`As reserved: ${lotACode} 50 g`);
  expect(await seriousViolations(page)).toEqual([]);

  // first, more cure than the kitchen has: refused by the server, beside the cure field, nothing posted
  await cureQty.fill("500");
  await sheet.getByRole("button", { name: "Record production" }).click();
  await expect(cureQty).toHaveAttribute("aria-invalid", "true");
  await expect(cureQty).toHaveAccessibleDescription(/available/);
  await expect(sheet.getByRole("alert").filter({ hasText: "Nothing was recorded" })).toContainText("Line 2");
  await expect(meat).not.toHaveAttribute("aria-invalid", "true");
  await cureQty.evaluate((el) => { el.scrollIntoView({ block: "center" }); el.closest("dialog")!.scrollTop = 0; });
  await page.screenshot({ path: "tests/e2e/screenshots/production-form-refused.png" });

  // then what happened: 20.4 kg of meat, 50.5 g of cure, 40 g from the reserved lot and 10.5 g from the later one
  await meat.fill("20.4");
  await expect(sheet.getByText("Planned 20 kg: +400 g")).toBeVisible();
  await cureQty.fill("50.5");
  await cureLots.getByRole("radio", { name: "Choose lots" }).check();
  const lot1 = sheet.getByLabel(`Lot 1 of ${cure.sku}`, { exact: true });
  const lot1Qty = sheet.getByLabel(`Lot 1 of ${cure.sku}: quantity in g`, { exact: true });
  await expect(lot1).toHaveValue(lotA);
  await expect(lot1Qty).toHaveValue("50.5");
  // the expired lot is listed but cannot be chosen; the later lot can
  await expect(lot1.locator("option", { hasText: expiredCode })).toBeDisabled();
  await expect(lot1.locator("option", { hasText: expiredCode })).toContainText("expired");
  await expect(lot1.locator("option", { hasText: lotBCode })).toBeEnabled();
  await lot1Qty.fill("40");
  await cureLots.getByRole("button", { name: "Add a lot" }).click();
  await sheet.getByLabel(`Lot 2 of ${cure.sku}`, { exact: true }).selectOption(lotB);
  await sheet.getByLabel(`Lot 2 of ${cure.sku}: quantity in g`, { exact: true }).fill("10.5");
  await expect(sheet.getByText(/from the lots below: 50\.5 g/)).toContainText("+0.5 g");
  // under each row, the chosen lot's date and what this batch may take of it (120 g free + the 50 g it holds)
  await expect(cureLots).toContainText(`Use by ${new Intl.DateTimeFormat("en-GB", { timeZone: "UTC", day: "numeric", month: "short", year: "numeric" }).format(new Date(`${shift(today, 200)}T12:00:00Z`))} · 170 g free for this batch`);
  await cureLots.evaluate((el) => { el.scrollIntoView({ block: "center" }); el.closest("dialog")!.scrollTop = 0; });
  await page.screenshot({ path: "tests/e2e/screenshots/production-form-lots.png" });
  await sheet.getByLabel("Note (optional)").fill("Shoulder delivery ran heavy.");
  await page.screenshot({ path: "tests/e2e/screenshots/production-form.png" });
  expect(await seriousViolations(page)).toEqual([]);
  await sheet.getByRole("button", { name: "Record production" }).click();
  await expect(sheet).toBeHidden();

  // the batch code, big; the variance per line, signed; the cure check again on what was weighed
  batchCode = `${recipeCode}-${madeOn()}-1`;
  await expect(page.getByRole("status").filter({ hasText: `Recorded: batch ${batchCode}` })).toBeVisible();
  await expect(page.getByTestId("batch-code")).toHaveText(batchCode);
  const size = await page.getByTestId("batch-code").evaluate((el) => parseFloat(getComputedStyle(el).fontSize));
  expect(size).toBeGreaterThanOrEqual(36);
  await expect(page.getByRole("heading", { name: "Production", exact: true })).toBeFocused();
  await expect(page.getByText("Produced", { exact: true }).first()).toBeVisible();
  await expect(page.getByText(/20\.4 kg · planned 20 kg · \+400 g/)).toBeVisible();
  const actual = page.getByRole("table", { name: /Planned and actual/ });
  const cureRow = actual.getByRole("row", { name: new RegExp(cure.sku) });
  await expect(cureRow).toContainText("50 g");
  await expect(cureRow).toContainText("50.5 g");
  await expect(cureRow).toContainText("+0.5 g");
  await expect(cureRow).toContainText("more than planned");
  await expect(cureRow.getByRole("link", { name: lotACode })).toBeVisible();
  await expect(cureRow).toContainText(`${lotACode} · 40 g`);
  await expect(cureRow).toContainText(`${lotBCode} · 10.5 g`);
  await expect(actual.getByRole("row", { name: new RegExp(salt.sku) })).toContainText("as planned");
  const checks = page.getByRole("table", { name: /Cure check on the actual weights: each check/ });
  const max = checks.getByRole("row", { name: /nitrite: 1\/4 oz to 100 lb chopped meat/ });
  await expect(max).toContainText("154.7181"); // 50.5 g x 0.0625 x 1e6 / 20,400 g
  await expect(max).toContainText("Within");
  await expect(page.getByRole("button", { name: "Record production" })).toHaveCount(0);
  await expect(page.getByText("On hold: do not release")).toHaveCount(0);
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/production-recorded.png" });
  await page.screenshot({ path: "tests/e2e/screenshots/production-recorded-full.png", fullPage: true });

  // forward from the cure lot: the batch, the transfer to the other kitchen, what is left where
  await cureRow.getByRole("link", { name: lotACode }).click();
  await expect(page).toHaveURL(new RegExp(`/planning/trace/lots/${lotA}$`));
  await expect(page.getByRole("heading", { level: 1 })).toContainText(`Lot ${lotACode}`);
  await expect(page.getByText("Brine & Co").first()).toBeVisible();
  const used = page.getByRole("table", { name: `Batches that used lot ${lotACode}` });
  const usedRow = used.getByRole("row", { name: new RegExp(batchCode) });
  await expect(usedRow).toContainText("40 g");
  await expect(usedRow).toContainText("Yardside frankfurter");
  await expect(usedRow).toContainText("Produced");
  const moves = page.getByRole("table", { name: `Movements of lot ${lotACode}` });
  await expect(moves.getByRole("row", { name: /Transferred to Kitchen 2/ })).toContainText("\u221230 g");
  await expect(moves.getByRole("row", { name: new RegExp(`Used in batch ${batchCode}`) })).toContainText("\u221240 g");
  // 200 g received, 30 g moved, 40 g used: 130 g left here and 30 g in the other kitchen
  const left = page.getByRole("definition").filter({ hasText: "130 g" });
  await expect(left).toContainText(`in Kitchen 1`);
  await expect(page.getByRole("definition").filter({ hasText: "130 g" })).toContainText(/30 g in Kitchen 2/);
  await expect(page.getByRole("complementary", { name: "Shipments" })).toContainText("Shipments to customers are not recorded in Hank & Lot");
  await expect(page.getByRole("complementary", { name: "Cure caution" })).toBeVisible();
  const csv = page.getByRole("link", { name: "Download CSV" });
  await expect(csv).toHaveAttribute("href", `/api/trace/lots/${lotA}?format=csv`);
  const csvRes = await page.request.get(`/api/trace/lots/${lotA}?format=csv`);
  expect(csvRes.headers()["content-type"]).toMatch(/text\/csv/);
  expect(await csvRes.text()).toContain(batchCode);
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/production-lot-trace.png", fullPage: true });
  await page.emulateMedia({ media: "print" });
  await expect(page.getByRole("link", { name: "Download CSV" })).toBeHidden();
  await expect(page.getByRole("navigation", { name: "Main" })).toBeHidden();
  await expect(page.getByText(/Printed .* from Hank & Lot/)).toBeVisible();
  await page.screenshot({ path: "tests/e2e/screenshots/production-lot-trace-print.png", fullPage: true });
  await page.emulateMedia({ media: "screen" });

  // back from the batch: every lot with its supplier and quantity
  await usedRow.getByRole("link", { name: batchCode }).click();
  await expect(page).toHaveURL(new RegExp(`/planning/trace/batches/${firstBatch}$`));
  await expect(page.getByRole("heading", { level: 1 })).toContainText(`Batch ${batchCode}`);
  const lots = page.getByRole("table", { name: `Lots used by batch ${batchCode}` });
  await expect(lots.getByRole("row")).toHaveCount(1 + 5); // header; salt, the two cure lots, pepper, casing
  const rowA = lots.getByRole("row", { name: new RegExp(lotACode) });
  await expect(rowA).toContainText("Brine & Co");
  await expect(rowA).toContainText("40 g");
  await expect(rowA).toContainText("use by");
  await expect(lots.getByRole("row", { name: new RegExp(lotBCode) })).toContainText("10.5 g");
  await expect(lots.getByRole("row", { name: new RegExp(salt.sku) })).toContainText("360 g");
  await expect(page.getByRole("link", { name: "Download CSV" })).toHaveAttribute("href", `/api/trace/batches/${firstBatch}?format=csv`);
  await expect(page.getByRole("complementary", { name: "Shipments" })).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/production-batch-trace.png", fullPage: true });
  await page.getByRole("link", { name: "Batch sheet" }).click();
  await expect(page.getByTestId("batch-code")).toHaveText(batchCode);

  // the trace search finds the lot by part of its code, and the batch by its code
  await page.goto("/planning/trace");
  await expect(page.getByRole("table", { name: "Batches made lately" }).getByRole("link", { name: batchCode })).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/production-trace-search.png", fullPage: true });
  await page.getByLabel("Lot code or batch code").fill(lotBCode.toLowerCase());
  await page.getByRole("button", { name: "Find" }).click();
  const foundLots = page.getByRole("table", { name: /Lots whose code contains/ });
  await expect(foundLots.getByRole("row")).toHaveCount(2);
  await foundLots.getByRole("link", { name: lotBCode }).click();
  await expect(page.getByRole("table", { name: `Batches that used lot ${lotBCode}` })).toContainText(batchCode);
  await page.goto(`/planning/trace?q=${encodeURIComponent(batchCode)}`);
  await expect(page.getByRole("table", { name: /Batches whose code contains/ }).getByRole("row")).toHaveCount(2);
  await page.goto("/planning/trace?q=NO-SUCH-CODE-ZZ");
  await expect(page.getByRole("heading", { name: /No lot or batch code contains/ })).toBeVisible();
  await page.context().close();
});

test("a batch weighed with too much cure goes on hold; the lead cannot release it, a manager does with the corrective action", async ({ browser }) => {
  test.setTimeout(150_000);
  const page = await leadPage(browser);
  await page.goto(`/planning/batches/${secondBatch}`);
  const sheet = await openProduction(page);
  // 10 kg planned, 25 g of cure; 30 g went in
  const cureQty = sheet.getByLabel(`Actual ${cure.sku}`, { exact: true });
  await expect(cureQty).toHaveValue("25");
  await expect(sheet.getByRole("group", { name: `Lots of ${cure.sku}` })).toContainText("First expired first out");
  await cureQty.fill("30");
  await expect(sheet.getByText("Planned 25 g: +5 g")).toBeVisible();
  await sheet.getByRole("button", { name: "Record production" }).click();
  await expect(sheet).toBeHidden();

  const code = `${recipeCode}-${madeOn()}-2`;
  await expect(page.getByTestId("batch-code")).toHaveText(code);
  await expect(page.getByRole("status").filter({ hasText: "ON HOLD" })).toContainText(code);
  const hold = page.getByRole("region", { name: /On hold: do not release this batch for sale/ });
  await expect(hold).toBeVisible();
  // 30 g x 0.0625 x 1e6 / 10,000 g = 187.5 ppm, over the 156.25 ppm comminuted maximum
  await expect(hold).toContainText(/Nitrite 187\.5000 ppm is over the 156\.25 ppm maximum/);
  await expect(hold).toContainText("Follow the HACCP plan's corrective action");
  await expect(hold.getByRole("complementary", { name: "Cure caution" })).toBeVisible();
  await expect(hold).toContainText("Only a manager can release the hold");
  await expect(hold.getByRole("button", { name: "Release the hold" })).toHaveCount(0);
  await expect(page.getByText("On hold", { exact: true }).first()).toBeVisible();
  const checks = page.getByRole("table", { name: /Cure check on the actual weights: each check/ });
  await expect(checks.getByRole("row", { name: /nitrite: 1\/4 oz to 100 lb chopped meat/ })).toContainText("Over: blocked");
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/production-hold.png" });
  await page.screenshot({ path: "tests/e2e/screenshots/production-hold-full.png", fullPage: true });
  // nor can the lead release it through the API
  const byLead = await page.request.post(`/api/batches/${secondBatch}/release-hold`, { data: { reason: "Looks fine to me" } });
  expect(byLead.status()).toBe(403);
  await page.context().close();

  const manager = await signedInPage(browser, co.users.manager.email, co.password, co.kitchens[0]!.id);
  await manager.goto(`/planning/batches/${secondBatch}`);
  const held = manager.getByRole("region", { name: /On hold: do not release/ });
  const reason = held.getByLabel("Corrective action taken (reason for release)");
  // a release needs the reason
  await held.getByRole("button", { name: "Release the hold" }).click();
  await expect(reason).toHaveAttribute("aria-invalid", "true");
  await expect(reason).toHaveAccessibleDescription(/corrective action/);
  await expect(held).toBeVisible();
  expect(await seriousViolations(manager)).toEqual([]);
  await reason.scrollIntoViewIfNeeded();
  await manager.screenshot({ path: "tests/e2e/screenshots/production-hold-release-form.png" });
  await reason.fill("Reworked into a 12 kg batch under HACCP CA-3; cure now within the limit.");
  await held.getByRole("button", { name: "Release the hold" }).click();
  const released = manager.getByRole("region", { name: /Hold released/ });
  await expect(released).toBeVisible();
  await expect(released).toContainText(`Hold released by ${co.users.manager.name}`);
  await expect(released).toContainText("Corrective action: Reworked into a 12 kg batch under HACCP CA-3");
  await expect(released).toContainText("It was held because the cure weighed was over a statutory maximum: nitrite 187.5000 ppm against 156.25 ppm");
  await expect(manager.getByRole("region", { name: /On hold: do not release/ })).toHaveCount(0);
  await expect(manager.getByText("Produced", { exact: true }).first()).toBeVisible();
  expect(await seriousViolations(manager)).toEqual([]);
  await manager.screenshot({ path: "tests/e2e/screenshots/production-released.png" });
  await manager.context().close();
});
