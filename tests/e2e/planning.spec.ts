// Stories of Planning (issue 4: batch plans, the week planner, reservations), in one company with
// two kitchens; the kitchen lead works in the first:
// - the lead plans next week's batches from the planner (one by meat block in kg, one in lb), sees
//   the bill of materials after each, sees the second short of stock ("2 lines short" in words,
//   with a transfer and a buy suggestion), reserves the week (the summary says what was reserved now
//   and what is short; a second click says the first is already reserved), and the stock grid shows
//   reserved and available changing for the spice of the reserved batch;
// - on the batch pages: Reserve of the short batch is refused all or nothing, Release (confirmed)
//   gives the lots back, Reserve holds them again, Cancel (confirmed) ends a plan;
// - the lead writes a recipe: the meat block must add up to 100 %, a cure over the maximum is
//   refused next to the line's rate, then it saves with its cure check; a new version follows;
// - the casing calculator: 45 kg of filling in a 32/35 mm hog casing is one hank;
// - an admin makes the company's weeks start on Sunday: the planner then shows Sunday to Saturday,
//   and a ?week= day in the middle of a week snaps to its Sunday.
// Check values (sources in trade-facts): 2.5 g/kg of a 6.25 % cure = 156.25 ppm, the 9 CFR
// 424.21(c) comminuted maximum (§1, §2 [calc]); 3 g/kg = 187.5 ppm, over it; cure rounded to the
// 0.1 g scale toward compliance, down under a maximum (§2); 1 lb = 453.59237 g exactly (§7);
// a 32/35 mm hog hank holds 45 kg of filling over 91.44 m (§4 [practice]).
// No serious or critical axe findings on each planning page; 1024 x 768 screenshots are kept.
import { expect, test, type Page } from "@playwright/test";
import { closeDb } from "../../db/client";
import { gridCell, seriousViolations, signedInPage } from "./support";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { createItem, type TestItem } from "../support/stock";

test.describe.configure({ mode: "serial" });

let co: TestCompany;
let salt: TestItem;
let cure: TestItem;
let pepper: TestItem;
let hog: TestItem;
let recipeCode: string;
const lotCode = `PC-${tag().slice(0, 6).toUpperCase()}`;

// the company's day (the factory's companies are in Europe/London); plans are for days after it
const londonToday = () => new Intl.DateTimeFormat("en-CA", { timeZone: "Europe/London", year: "numeric", month: "2-digit", day: "2-digit" }).format(new Date());
const shift = (day: string, n: number) => {
  const d = new Date(`${day}T12:00:00Z`);
  d.setUTCDate(d.getUTCDate() + n);
  return d.toISOString().slice(0, 10);
};
const today = londonToday();
const weekday = (new Date(`${today}T12:00:00Z`).getUTCDay() + 6) % 7; // Monday 0
const nextMonday = shift(today, 7 - weekday);
const tuesday = shift(nextMonday, 1);
const thursday = shift(nextMonday, 3);
const dayShort = (d: string) => new Intl.DateTimeFormat("en-GB", { timeZone: "UTC", weekday: "short", day: "numeric", month: "short" }).format(new Date(`${d}T12:00:00Z`));

test.beforeAll(async ({ browser }) => {
  co = await createCompany({ kitchens: 2 });
  const [k1, k2] = [co.kitchens[0]!, co.kitchens[1]!];
  salt = await createItem(co.company.id, { category: "ingredient" });
  cure = await createItem(co.company.id, { category: "cure" }); // 6.25 % sodium nitrite
  pepper = await createItem(co.company.id, { category: "spice" });
  hog = await createItem(co.company.id, { category: "casing" }); // 32/35 mm hog, hank of 91.44 m, 45 kg
  const admin = await signedInPage(browser, co.users.admin.email, co.password);
  const receipts = [
    { kitchen: k1.code, item: salt.sku, quantity: "5", unit: "kg", lot: { unitCost: "0.001" } },
    { kitchen: k1.code, item: cure.sku, quantity: "150", unit: "g", lot: { code: lotCode, date: shift(today, 200), dateKind: "use_by", unitCost: "0.004" } },
    { kitchen: k1.code, item: pepper.sku, quantity: "120", unit: "g", lot: { unitCost: "0.03" } },
    { kitchen: k1.code, item: hog.sku, quantity: "3", unit: "pc", lot: { unitCost: "12" } },
    { kitchen: k2.code, item: pepper.sku, quantity: "1", unit: "kg", lot: { unitCost: "0.03" } },
  ];
  for (const r of receipts) {
    const res = await admin.request.post("/api/movements", { data: { kind: "receipt", supplier: "Brine & Co", ...r } });
    expect(res.status(), await res.text()).toBe(201);
  }
  recipeCode = `SMK${tag().slice(0, 6).toUpperCase()}`;
  const res = await admin.request.post("/api/recipes", {
    data: {
      code: recipeCode, name: "Yardside smoked link", productClass: "comminuted", storage: "keep_refrigerated",
      meatBlock: [{ name: "Pork shoulder", percent: "70" }, { name: "Back fat", percent: "30" }],
      lines: [
        { item: salt.sku, rate: "18", unit: "g/kg" },
        { item: cure.sku, rate: "2.5", unit: "g/kg" },
        { item: pepper.sku, rate: "2.5", unit: "g/kg" },
      ],
      casing: { item: hog.sku, calibreMinMm: "32", calibreMaxMm: "36" },
    },
  });
  expect(res.status(), await res.text()).toBe(201);
  await admin.context().close();
});
test.afterAll(async () => {
  await closeDb();
});

const leadPage = (browser: Parameters<typeof signedInPage>[0]) => signedInPage(browser, co.users.kitchen_lead.email, co.password, co.kitchens[0]!.id);

/** The pepper row's Reserved and Available cells on the stock grid. */
async function pepperCells(page: Page) {
  await page.goto("/stock");
  const row = `item:${pepper.id}`;
  await expect(gridCell(page, row, "onHand")).toContainText("120 g");
  return { reserved: gridCell(page, row, "reserved"), available: gridCell(page, row, "available") };
}

test("a kitchen lead plans next week, sees a shortage, reserves all, and the grid shows reserved and available change", async ({ browser }) => {
  test.setTimeout(150_000);
  const k2 = co.kitchens[1]!;
  const page = await leadPage(browser);

  // before: nothing of the pepper is reserved
  const before = await pepperCells(page);
  await expect(before.reserved).toHaveText("0 g");
  await expect(before.available).toHaveText("120 g");

  // the planner opens on this week Monday to Wednesday, on next week from Thursday
  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Planning" }).click();
  await expect(page).toHaveURL(/\/planning$/);
  const weekHeading = page.getByRole("navigation", { name: "Weeks" }).getByRole("heading");
  if (weekday <= 2) {
    await expect(weekHeading).toContainText("This week");
    await page.getByRole("link", { name: "Next week" }).click();
  }
  await expect(weekHeading).toContainText("Next week");
  await expect(page.getByText("Nothing planned this week.")).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);

  // batch 1: 20 kg of meat block on Tuesday; the sheet shows its bill of materials
  await page.getByRole("button", { name: "Plan a batch", exact: true }).click();
  const sheet = page.getByRole("dialog", { name: "Plan a batch" });
  await expect(sheet).toBeVisible();
  await sheet.getByLabel("Recipe").selectOption({ label: `${recipeCode} · Yardside smoked link (cure)` });
  await expect(sheet.getByLabel("Recipe")).toHaveAccessibleDescription(new RegExp(`Version 1 · Comminuted.* · casing ${hog.sku}`));
  await expect(sheet.getByRole("complementary", { name: "Cure caution" })).toBeVisible();
  await sheet.getByLabel("Production day").fill(tuesday);
  await sheet.getByLabel("Meat block (green weight)", { exact: true }).fill("20");
  await sheet.getByRole("button", { name: "Plan batch" }).click();
  await expect(sheet.getByText(`Planned ${recipeCode} for`)).toContainText("20 kg of meat block");
  const bom1 = sheet.getByRole("table", { name: /Bill of materials/ });
  // 20 kg x 18 g/kg = 360 g; x 2.5 g/kg = 50 g (cure exact on the 0.1 g scale)
  await expect(bom1.getByRole("row", { name: new RegExp(salt.sku) })).toContainText("360 g");
  await expect(bom1.getByRole("row", { name: new RegExp(cure.sku) })).toContainText("50 g");
  await expect(bom1.getByRole("row", { name: new RegExp(pepper.sku) })).toContainText("Enough");
  // filling 20,460 g / 45 kg per hank: open 1 hank
  await expect(sheet.getByText(/open 1 hank\b/)).toBeVisible();
  await expect(sheet.getByText("Nothing short")).toBeVisible();
  await expect(sheet.getByText("Cure: 156.2500 ppm ingoing nitrite on the rounded amount.")).toBeVisible();

  // batch 2: 150 lb on Thursday is more pepper and cure than the kitchen has
  await sheet.getByRole("button", { name: "Plan another" }).click();
  await sheet.getByLabel("Production day").fill(thursday);
  await sheet.getByLabel("Meat block (green weight): unit").selectOption("lb");
  await sheet.getByLabel("Meat block (green weight)", { exact: true }).fill("150");
  await sheet.getByRole("button", { name: "Plan batch" }).click();
  await expect(sheet.getByText(`Planned ${recipeCode} for`)).toBeVisible();
  await expect(sheet.getByText("2 lines short", { exact: true })).toBeVisible();
  const bom2 = sheet.getByRole("table", { name: /Bill of materials/ });
  // 150 lb = 68,038.8555 g; cure 170.097... g rounded DOWN to 170 g on the 0.1 g scale
  const cureRow = bom2.getByRole("row", { name: new RegExp(cure.sku) });
  await expect(cureRow).toContainText("170 g");
  await expect(cureRow).toContainText("rounded down to the 0.1 g scale");
  // Tuesday's batch, planned ahead in the same kitchen, is counted first: 150 g - 50 g leaves 100 g of cure
  await expect(cureRow).toContainText("Short 70 g");
  await expect(cureRow).toContainText("Buy 70 g");
  await expect(cureRow).toContainText("after 50 g planned ahead");
  const pepperRow = bom2.getByRole("row", { name: new RegExp(pepper.sku) });
  // 120 g - Tuesday's 50 g leaves 70 g for 170.1 g; the other kitchen has 1 kg and no par level
  await expect(pepperRow).toContainText("Short 100.1 g");
  await expect(pepperRow).toContainText(`Transfer 100.1 g from ${k2.name} (${k2.code})`);
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/planning-plan-sheet.png" });
  await sheet.getByRole("button", { name: "Close" }).last().click();
  await expect(sheet).toBeHidden();

  // the week: each day's batches with status and the shortage in words
  const tue = page.getByRole("listitem", { name: new RegExp(`^Tuesday`) });
  const thu = page.getByRole("listitem", { name: new RegExp(`^Thursday`) });
  await expect(tue.getByRole("link", { name: new RegExp(recipeCode) })).toBeVisible();
  await expect(tue).toContainText("20 kg");
  await expect(tue).toContainText("Planned");
  await expect(tue).toContainText("Nothing short");
  await expect(thu).toContainText("68.039 kg");
  await expect(thu).toContainText("2 lines short");
  await expect(page.getByText("2 batches · 0 reserved · 2 to reserve · 1 short of stock")).toBeVisible();
  await page.screenshot({ path: "tests/e2e/screenshots/planning-week.png" });

  // reserve all: the batch with stock is reserved, the short one is reported and left as it is
  await page.getByRole("button", { name: "Reserve all" }).click();
  const report = page.getByRole("region", { name: "Reserve all: result" });
  await expect(report.getByRole("heading")).toContainText("1 reserved now, 1 short of stock");
  await expect(report.getByRole("listitem").filter({ hasText: dayShort(tuesday) })).toContainText("reserved now.");
  const shortItem = report.getByRole("listitem").filter({ hasText: dayShort(thursday) });
  await expect(shortItem).toContainText("not reserved, 2 lines short");
  await expect(shortItem).toContainText(`${pepper.sku} needs 170.1 g, 70 g available`); // after Tuesday took 50 g
  await expect(tue).toContainText("Reserved");
  await expect(thu).toContainText("Planned");
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/planning-reserve-all.png" });
  // again: nothing new to hold, Tuesday's is already reserved, Thursday's still short
  await page.getByRole("button", { name: "Reserve all" }).click();
  await expect(report.getByRole("heading")).toContainText("nothing new to hold: 1 already reserved, 1 short of stock");
  await expect(report.getByRole("listitem").filter({ hasText: dayShort(tuesday) })).toContainText("already reserved, nothing to do.");
  await expect(report.getByRole("listitem").filter({ hasText: dayShort(thursday) })).toContainText("not reserved, 2 lines short");

  // the stock grid: 50 g of pepper reserved for Tuesday, 70 g still available
  const after = await pepperCells(page);
  await expect(after.reserved).toHaveText("50 g");
  await expect(after.available).toHaveText("70 g");
  await page.context().close();
});

test("on the batch pages: a short batch is refused whole, a reservation is released and taken again, a plan is cancelled", async ({ browser }) => {
  test.setTimeout(120_000);
  const page = await leadPage(browser);
  await page.goto(`/planning?week=${nextMonday}`);

  // the short batch: 150 lb; after Tuesday's reservation 70 g of pepper is left
  await page.getByRole("listitem", { name: /^Thursday/ }).getByRole("link", { name: new RegExp(recipeCode) }).click();
  await expect(page.getByRole("heading", { level: 1 })).toContainText(`Batch ${recipeCode}`);
  await expect(page.getByText("2 lines short", { exact: true })).toBeVisible();
  const bom = page.getByRole("table", { name: /Bill of materials/ });
  const pepperRow = bom.getByRole("row", { name: new RegExp(pepper.sku) });
  await expect(pepperRow).toContainText("70 g"); // available
  await expect(pepperRow).toContainText("Short 100.1 g");
  // the cure: its rounding, the caution, and the verdict per check on the rounded amount
  const shortCure = bom.getByRole("row", { name: new RegExp(cure.sku) });
  await expect(shortCure).toContainText("Cure");
  await expect(shortCure).toContainText("170 g");
  await expect(shortCure).toContainText("rounded down to the 0.1 g scale (exact 170.097139 g)");
  await expect(page.getByRole("complementary", { name: "Cure caution" })).toContainText("toxic");
  const checks = page.getByRole("table", { name: /Cure check: each check/ });
  const max = checks.getByRole("row", { name: /nitrite: 1\/4 oz to 100 lb chopped meat/ });
  await expect(max).toContainText("156.25 ppm");
  await expect(max).toContainText("Maximum (blocks)");
  await expect(max).toContainText("156.1608"); // 170 g x 0.0625 x 1e6 / 68,038.8555 g
  await expect(max).toContainText("Within");
  await expect(page.getByText("Open 2 hanks")).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/planning-batch-short.png", fullPage: true });

  await page.getByRole("button", { name: "Reserve", exact: true }).click();
  await expect(page.getByRole("alert").filter({ hasText: "Nothing was reserved" })).toContainText(`${pepper.sku} needs 170.1 g, only 70 g can be reserved`);
  await expect(page.getByText("Planned", { exact: true })).toBeVisible();

  // the reserved batch shows its lots; Release asks first
  await page.getByRole("link", { name: /^Week of/ }).click();
  await page.getByRole("listitem", { name: /^Tuesday/ }).getByRole("link", { name: new RegExp(recipeCode) }).click();
  await expect(page.getByText("Reserved", { exact: true }).first()).toBeVisible();
  const cureRow = page.getByRole("table", { name: /Bill of materials/ }).getByRole("row", { name: new RegExp(cure.sku) });
  await expect(cureRow).toContainText(lotCode);
  await expect(cureRow).toContainText("50 g");
  await page.screenshot({ path: "tests/e2e/screenshots/planning-batch.png", fullPage: true });
  // printed for the kitchen wall: no navigation or buttons, a line for who weighed and checked
  await page.emulateMedia({ media: "print" });
  await expect(page.getByRole("button", { name: "Release" })).toBeHidden();
  await expect(page.getByRole("navigation", { name: "Main" })).toBeHidden();
  await expect(page.getByText(/Printed .* Weighed by:/)).toBeVisible();
  await page.screenshot({ path: "tests/e2e/screenshots/planning-batch-print.png", fullPage: true });
  await page.emulateMedia({ media: "screen" });
  await page.getByRole("button", { name: "Release" }).click();
  const confirm = page.getByRole("alertdialog", { name: "Release the reserved lots?" });
  await expect(confirm).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);
  await confirm.getByRole("button", { name: "Keep it" }).click();
  await expect(confirm).toBeHidden();
  await expect(cureRow).toContainText(lotCode); // still held
  await page.getByRole("button", { name: "Release" }).click();
  await confirm.getByRole("button", { name: "Release" }).click();
  await expect(page.getByRole("status").filter({ hasText: "Released" })).toBeVisible();
  await expect(cureRow).not.toContainText(lotCode);
  await expect(cureRow).toContainText("Enough");

  // reserve it again from its own page
  await page.getByRole("button", { name: "Reserve", exact: true }).click();
  await expect(page.getByRole("status").filter({ hasText: "Reserved: every line" })).toBeVisible();
  await expect(cureRow).toContainText(lotCode);

  // cancel the short batch: confirmed, then it shows as cancelled in the week
  await page.goto(`/planning?week=${nextMonday}`);
  await page.getByRole("listitem", { name: /^Thursday/ }).getByRole("link", { name: new RegExp(recipeCode) }).click();
  await page.getByRole("button", { name: "Cancel batch" }).click();
  const cancel = page.getByRole("alertdialog", { name: "Cancel this batch?" });
  await cancel.getByRole("button", { name: "Cancel batch" }).click();
  await expect(page.getByRole("status").filter({ hasText: "Cancelled" })).toBeVisible();
  await expect(page.getByRole("button", { name: "Reserve", exact: true })).toHaveCount(0);
  await page.goto(`/planning?week=${nextMonday}`);
  await expect(page.getByRole("listitem", { name: /^Thursday/ })).toContainText("Cancelled");
  await expect(page.getByRole("listitem", { name: /^Thursday/ })).not.toContainText("lines short");
  await page.context().close();
});

test("a kitchen lead writes a recipe: shares must make 100 %, an overdose of cure is refused at its line, then a new version", async ({ browser }) => {
  test.setTimeout(120_000);
  const page = await leadPage(browser);
  await page.goto("/planning/recipes");
  await expect(page.getByRole("row", { name: new RegExp(recipeCode) })).toContainText("Cure");
  expect(await seriousViolations(page)).toEqual([]);
  await page.getByRole("link", { name: "New recipe" }).click();
  await expect(page.getByRole("heading", { level: 1 })).toContainText("New recipe");
  const code = `SAL${tag().slice(0, 5).toUpperCase()}`;
  await page.getByLabel("Code", { exact: true }).fill(code);
  await page.getByLabel("Name", { exact: true }).fill("Hillside fennel salami");
  await expect(page.getByText("Dry and fermented sausages (salami, pepperoni) are comminuted")).toBeVisible();
  await page.getByRole("radio", { name: "Shelf stable" }).check();
  await page.getByLabel("Meat 1: name").fill("Pork leg");
  await page.getByLabel("Meat 2: name").fill("Hard back fat");
  await page.getByLabel("Meat 2: share (%)").fill("25");
  await expect(page.getByText("Adds up to 95 %: it must be 100 %.")).toBeVisible();
  await page.getByLabel("Line 1: item").selectOption(salt.id);
  await page.getByLabel("Line 1: rate").fill("26");
  await page.getByLabel("Line 2: item").selectOption(cure.id);
  await page.getByLabel("Line 2: rate").fill("3");
  await page.getByLabel("Line 3: item").selectOption(pepper.id);
  await page.getByLabel("Line 3: rate").fill("0.2");
  await page.getByLabel("Line 3: unit").selectOption("%");
  await expect(page.getByLabel("Line 4: rate")).toHaveCount(0); // three lines to start with
  await page.getByLabel("Casing item").selectOption(hog.id);
  await expect(page.getByRole("complementary", { name: "Cure caution" })).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);

  // the server's answers land beside the fields: first the shares, then the cure's rate
  await page.getByRole("button", { name: "Save recipe" }).click();
  await expect(page.getByRole("alert").filter({ hasText: "add up to 95 %, not 100 %" })).toBeVisible();
  await page.getByLabel("Meat 2: share (%)").fill("30");
  await expect(page.getByText("Adds up to 100 %.")).toBeVisible();
  await page.getByRole("button", { name: "Save recipe" }).click();
  const rate = page.getByLabel("Line 2: rate");
  await expect(rate).toHaveAttribute("aria-invalid", "true");
  // 3 g/kg x 0.0625 = 187.5 ppm, over the 156.25 ppm comminuted maximum
  await expect(rate).toHaveAccessibleDescription(/187\.5000 ppm is over the 156\.25 ppm maximum/);
  await expect(page.getByLabel("Line 1: rate")).not.toHaveAttribute("aria-invalid", "true");
  await expect(page.getByText("The cure is over a statutory maximum")).toBeVisible();
  await rate.scrollIntoViewIfNeeded();
  await page.screenshot({ path: "tests/e2e/screenshots/planning-recipe-form.png" });
  await page.screenshot({ path: "tests/e2e/screenshots/planning-recipe-form-full.png", fullPage: true });

  await rate.fill("2.5");
  await page.getByRole("button", { name: "Save recipe" }).click();
  await expect(page.getByRole("heading", { level: 1 })).toContainText(`${code} · Hillside fennel salami`);
  await expect(page.getByText("Version 1 saved.")).toBeVisible();
  await expect(page.getByText("Within every check.")).toBeVisible();
  await expect(page.getByText("156.2500 ppm")).toBeVisible();
  const lines = page.getByRole("table", { name: "Lines of the recipe" });
  await expect(lines.getByRole("row", { name: new RegExp(pepper.sku) })).toContainText("2 g"); // 0.2 % of 1 kg
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/planning-recipe.png", fullPage: true });

  // "Plan a batch" from the recipe opens the planner's sheet on it
  await page.getByRole("link", { name: "Plan a batch" }).click();
  const sheet = page.getByRole("dialog", { name: "Plan a batch" });
  await expect(sheet.getByLabel("Recipe").locator("option:checked")).toHaveText(`${code} · Hillside fennel salami (cure)`);
  await sheet.getByRole("button", { name: "Cancel" }).click();
  await expect(sheet).toBeHidden();
  await page.goBack();

  // a new version starts from this one; the first stays in the list
  await page.getByRole("link", { name: "New version" }).click();
  await expect(page.getByLabel("Line 2: rate")).toHaveValue("2.5");
  await page.getByLabel("Line 3: rate").fill("0.25");
  await page.getByLabel("What changed in this version").fill("More pepper");
  await page.getByRole("button", { name: "Save version 2" }).click();
  await expect(page.getByText("Version 2 saved and now current.")).toBeVisible();
  const versions = page.getByRole("navigation", { name: "Versions" });
  await expect(versions.getByRole("listitem")).toHaveCount(2);
  await expect(versions.getByRole("link", { name: /Version 2 · current/ })).toContainText("More pepper");
  await versions.getByRole("link", { name: /Version 1/ }).click();
  await expect(page.getByText("An earlier version: new batches use version 2.")).toBeVisible();
  await page.context().close();
});

test("the casing calculator: 45 kg of filling in a 32/35 mm hog casing is one hank, 609 links of 15 cm", async ({ browser }) => {
  const page = await leadPage(browser);
  await page.goto("/planning/casing");
  await expect(page.getByRole("heading", { level: 1 })).toContainText("Casing calculator");
  await page.getByLabel("Filling mass", { exact: true }).fill("45");
  await expect(page.getByRole("radio", { name: "A casing item" })).toBeChecked();
  await page.getByLabel("Casing item", { exact: true }).selectOption(hog.id);
  await page.getByRole("radio", { name: "By length" }).check();
  await page.getByLabel("Link length", { exact: true }).fill("15");
  await page.getByRole("button", { name: "Calculate" }).click();
  const result = page.getByRole("region", { name: "Result" });
  const figures = result.getByRole("definition");
  await expect(figures.nth(0)).toContainText("91.44 m");
  await expect(figures.nth(1)).toContainText("1 hank");
  await expect(figures.nth(1)).not.toContainText("hanks");
  await expect(figures.nth(2)).toContainText(/^609 links/); // 45 kg / (45 kg per 91.44 m x 0.15 m) = 609.6: whole links only
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/planning-casing.png", fullPage: true });

  // a filling of nothing is refused beside the field
  await page.getByLabel("Filling mass", { exact: true }).fill("0");
  await page.getByRole("button", { name: "Calculate" }).click();
  await expect(page.getByLabel("Filling mass", { exact: true })).toHaveAccessibleDescription(/more than zero/);
  await page.context().close();
});

test("an admin makes weeks start on Sunday, and the planner's week runs Sunday to Saturday", async ({ browser }) => {
  test.setTimeout(90_000);
  const admin = await signedInPage(browser, co.users.admin.email, co.password);
  await admin.goto("/settings");
  const weekStart = admin.getByLabel("Planning weeks begin on");
  await expect(weekStart).toHaveValue("monday");
  await weekStart.selectOption("sunday");
  await admin.getByRole("button", { name: "Save", exact: true }).click();
  await expect(admin.getByText("Company details saved.")).toBeVisible();
  await admin.context().close();

  const page = await leadPage(browser);
  // the Wednesday after next Monday: its week (from Sunday) is the one from the day before that Monday
  const wednesday = shift(nextMonday, 2);
  const sunday = shift(nextMonday, -1);
  await page.goto(`/planning?week=${wednesday}`);
  const days = page.getByRole("list", { name: /^Batches in / }).getByRole("listitem", { name: /^\w+day \d+ \w+$/ });
  await expect(days).toHaveCount(7);
  await expect(days.first()).toHaveAccessibleName(new RegExp(`^Sunday ${Number(sunday.slice(8))} `));
  await expect(days.last()).toHaveAccessibleName(new RegExp(`^Saturday ${Number(shift(sunday, 6).slice(8))} `));
  await page.getByRole("link", { name: "Next week" }).click();
  await expect(page).toHaveURL(new RegExp(`week=${shift(sunday, 7)}$`));
  await expect(days.first()).toHaveAccessibleName(new RegExp(`^Sunday ${Number(shift(sunday, 7).slice(8))} `));
  await page.context().close();
});
