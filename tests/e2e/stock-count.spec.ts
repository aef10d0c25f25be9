// Story: a manager receives a delivery (casing, cure, pepper); the kitchen lead opens the stock
// grid, sees the cure marked and its lot in date, types two counts from the keyboard, undoes a
// slip, posts the count and sees the on-hand figures become the counted ones. The grid has no
// serious accessibility problems; a 1024 x 768 screenshot is kept for review.
import { expect, test, type Browser, type Page } from "@playwright/test";
import { readFile } from "node:fs/promises";
import { closeDb } from "../../db/client";
import { gridCell, seriousViolations, signedInPage } from "./support";
import { createCompany, type TestCompany } from "../support/factory";
import { createItem, type TestItem } from "../support/stock";

let co: TestCompany;
let casing: TestItem;
let cure: TestItem;
let pepper: TestItem;

const inDays = (n: number) => new Date(Date.now() + n * 86_400_000).toISOString().slice(0, 10);

// the company, its items and a delivery the manager receives through the API (as the app would)
test.beforeAll(async ({ browser }) => {
  co = await createCompany({ kitchens: 1 });
  casing = await createItem(co.company.id, { category: "casing" });
  cure = await createItem(co.company.id, { category: "cure" });
  pepper = await createItem(co.company.id, { category: "spice" });
  const manager = await signedInPage(browser, co.users.manager.email, co.password);
  const receipts = [
    { item: casing.sku, quantity: "3", unit: "hank", lot: { unitCost: "28.50" } },
    { item: cure.sku, quantity: "1000", unit: "g", lot: { code: "PINK-0425", date: inDays(200), dateKind: "best_before", unitCost: "0.012" } },
    { item: pepper.sku, quantity: "500", unit: "g", lot: { unitCost: "0.03" } },
  ];
  for (const r of receipts) {
    const res = await manager.request.post("/api/movements", { data: { kind: "receipt", kitchen: co.kitchens[0]!.code, supplier: "Brine & Co", ...r } });
    expect(res.status(), await res.text()).toBe(201);
  }
  await manager.context().close();
});
test.afterAll(async () => {
  await closeDb();
});



const cell = gridCell;

test("a kitchen lead counts two items in the grid, posts the count and sees on hand follow", async ({ browser }) => {
  test.setTimeout(90_000);
  const kitchen = co.kitchens[0]!;

  const lead = await signedInPage(browser, co.users.kitchen_lead.email, co.password);
  await expect(lead.getByRole("heading", { level: 1 })).toContainText(kitchen.name);
  const casingRow = `item:${casing.id}`;
  const pepperRow = `item:${pepper.id}`;
  const cureRow = `item:${cure.id}`;

  // what the books say, in the person's units: casings in hanks and metres
  await expect(cell(lead, casingRow, "item")).toContainText("32/35 mm hog, hank");
  await expect(cell(lead, casingRow, "onHand")).toContainText("3 hanks");
  await expect(cell(lead, casingRow, "onHand")).toContainText("274.32 m");
  await expect(cell(lead, pepperRow, "onHand")).toContainText("500 g");

  // the cure row carries the marker (word, not only colour) and the page the caution, once
  await expect(cell(lead, cureRow, "item").getByText("Cure", { exact: true })).toBeVisible();
  await expect(lead.getByRole("complementary", { name: "Cure caution" })).toHaveCount(1);

  // its lot opens under it, with its date, kind and days left in words
  const toggle = cell(lead, cureRow, "item").getByRole("button", { name: `Show lots of ${cure.sku}` });
  await expect(toggle).toHaveAttribute("aria-expanded", "false");
  await toggle.click();
  await expect(cell(lead, cureRow, "item").getByRole("button", { name: `Hide lots of ${cure.sku}` })).toHaveAttribute("aria-expanded", "true");
  const lotRow = lead.locator(`.ag-row[row-id^="lot:${cure.id}:"] [col-id="item"]`);
  await expect(lotRow).toContainText("Lot PINK-0425");
  await expect(lotRow).toContainText("best before");
  await expect(lotRow).toContainText("in date");

  expect(await seriousViolations(lead)).toEqual([]);

  // counts from the keyboard: a tap (or click) opens the casing's cell, Enter keeps the value and
  // moves down; arrows reach the pepper, typing starts the edit
  await cell(lead, casingRow, "counted").click();
  await expect(lead.getByRole("textbox", { name: `Counted for ${casing.sku}, in hank` })).toBeFocused();
  await lead.keyboard.type("2.5");
  await lead.keyboard.press("Enter");
  await expect(cell(lead, casingRow, "counted")).toContainText("2.5 hanks");
  await cell(lead, pepperRow, "onHand").click();
  await lead.keyboard.press("ArrowRight"); // reserved
  await lead.keyboard.press("ArrowRight"); // available
  await lead.keyboard.press("ArrowRight"); // counted
  await lead.keyboard.type("480");
  await lead.keyboard.press("Enter");
  await expect(cell(lead, pepperRow, "counted")).toContainText("480 g");
  await expect(cell(lead, pepperRow, "counted")).toContainText("−20 g");

  // a slip is undone with Ctrl+Z; a word is refused with a message and changes nothing
  const pepperEditor = lead.getByRole("textbox", { name: `Counted for ${pepper.sku}, in g` });
  await cell(lead, pepperRow, "counted").click();
  await expect(pepperEditor).toBeFocused();
  await lead.keyboard.press("Control+a");
  await lead.keyboard.type("4800");
  await lead.keyboard.press("Enter");
  await expect(cell(lead, pepperRow, "counted")).toContainText("4800 g");
  await lead.keyboard.press("Control+z");
  await expect(cell(lead, pepperRow, "counted")).toContainText("480 g");
  await expect(cell(lead, pepperRow, "counted")).not.toContainText("4800");
  await cell(lead, pepperRow, "counted").click();
  await expect(pepperEditor).toBeFocused();
  await lead.keyboard.press("Control+a");
  await lead.keyboard.type("lots");
  await lead.keyboard.press("Enter");
  // the editor stays open with the reason under it; Esc puts the count back
  await expect(lead.getByRole("alert").filter({ hasText: "Enter a plain number" })).toBeVisible();
  await expect(pepperEditor).toHaveAttribute("aria-invalid", "true");
  await expect(pepperEditor).toHaveValue("lots");
  await lead.keyboard.press("Escape");
  await expect(pepperEditor).toBeHidden();
  await expect(cell(lead, pepperRow, "counted")).toContainText("480 g");

  const sheetBar = lead.getByRole("region", { name: "Count sheet" });
  await expect(sheetBar).toContainText("2 lines counted");
  await lead.getByRole("button", { name: "Post count" }).click();
  await expect(lead.getByRole("status").filter({ hasText: "Count posted: 2 lines, 2 differences." })).toBeVisible();
  await expect(cell(lead, casingRow, "onHand")).toContainText("2.5 hanks");
  await expect(cell(lead, casingRow, "onHand")).toContainText("228.6 m");
  await expect(cell(lead, pepperRow, "onHand")).toContainText("480 g");
  await expect(cell(lead, pepperRow, "counted")).not.toContainText("480");
  await expect(sheetBar.getByRole("button", { name: "Post count" })).toBeDisabled();

  await lead.evaluate(() => window.scrollTo(0, 0));
  await lead.screenshot({ path: "tests/e2e/screenshots/stock-grid.png" });

  // par level and reorder point save at once (in view at 1024 x 768, no scrolling sideways); one the
  // server refuses is put back, with the reason
  await cell(lead, pepperRow, "parLevel").click();
  await expect(lead.getByRole("textbox", { name: `Par level for ${pepper.sku}, in g` })).toBeFocused();
  await lead.keyboard.type("2000");
  await lead.keyboard.press("Enter");
  await expect(lead.getByRole("status").filter({ hasText: `Par level of ${pepper.sku} saved: 2000 g.` })).toBeVisible();
  await expect(cell(lead, pepperRow, "parLevel")).toContainText("2 kg");
  const reorderEditor = lead.getByRole("textbox", { name: `Reorder point for ${pepper.sku}, in g` });
  await cell(lead, pepperRow, "reorderPoint").click();
  await expect(reorderEditor).toBeFocused();
  await lead.keyboard.type("600");
  await lead.keyboard.press("Enter");
  await expect(lead.getByRole("status").filter({ hasText: `Reorder point of ${pepper.sku} saved: 600 g.` })).toBeVisible();
  await expect(cell(lead, pepperRow, "reorderPoint")).toContainText("600 g");
  const status = cell(lead, pepperRow, "reorderPoint").getByText("to reorder");
  await expect(status).toBeVisible();
  // the marker is whole inside its narrow column, not cut off
  const [tag, box] = [(await status.boundingBox())!, (await cell(lead, pepperRow, "reorderPoint").boundingBox())!];
  expect(tag.x).toBeGreaterThanOrEqual(box.x);
  expect(tag.x + tag.width).toBeLessThanOrEqual(box.x + box.width);
  await cell(lead, pepperRow, "reorderPoint").click();
  await expect(reorderEditor).toBeFocused();
  await lead.keyboard.type("3000");
  await lead.keyboard.press("Enter");
  await expect(lead.getByRole("alert").filter({ hasText: "must not be above the par level" })).toContainText("It is back to 600 g.");
  await expect(cell(lead, pepperRow, "reorderPoint")).toContainText("600 g");
  await lead.evaluate(() => window.scrollTo(0, 0));
  await lead.screenshot({ path: "tests/e2e/screenshots/stock-grid-levels.png" });
  await lead.reload();
  await expect(cell(lead, pepperRow, "onHand")).toContainText("480 g");
  await expect(cell(lead, pepperRow, "parLevel")).toContainText("2 kg");
  await expect(cell(lead, pepperRow, "reorderPoint")).toContainText("600 g");

  // the count is in the pepper's history, from the row's menu
  await cell(lead, pepperRow, "actions").getByRole("button", { name: `Actions for ${pepper.sku}` }).click();
  await lead.getByRole("menu", { name: `Actions for ${pepper.sku}` }).getByRole("menuitem", { name: "History" }).click();
  const sheet = lead.getByRole("dialog", { name: `History of ${pepper.sku}` });
  await expect(sheet).toBeVisible();
  await expect(sheet.getByRole("listitem").first()).toContainText("Counted");
  await expect(sheet.getByRole("listitem").first()).toContainText("−20 g");
  await expect(sheet.getByRole("listitem").nth(1)).toContainText("Received");
  expect(await seriousViolations(lead)).toEqual([]);
  await sheet.getByRole("button", { name: "Close" }).click();
  await expect(sheet).toBeHidden();

  // CSV export names the kitchen and the day, one plain value per column
  const [download] = await Promise.all([lead.waitForEvent("download"), lead.getByRole("button", { name: "Export CSV" }).click()]);
  expect(download.suggestedFilename()).toMatch(new RegExp(`^stock-${kitchen.code}-\\d{4}-\\d{2}-\\d{2}\\.csv$`));
  const csv = await readFile((await download.path())!, "utf8");
  expect(csv).toContain('"SKU"');
  expect(csv).toMatch(new RegExp(`"${pepper.sku}".*"g","480"`));
  expect(csv).toContain('"PINK-0425"');

  // the column layout is remembered per user, and reset on request
  const key = `hank-and-lot:stock-grid:columns:v2:${co.users.kitchen_lead.id}`;
  await lead.locator('.ag-header-cell[col-id="onHand"] .ag-header-cell-label').click();
  await expect.poll(() => lead.evaluate((k) => localStorage.getItem(k) ?? "", key)).toContain('"sort":"asc"');
  await lead.reload();
  await expect(lead.locator('.ag-header-cell[col-id="onHand"]')).toHaveAttribute("aria-sort", "ascending");
  await lead.getByRole("button", { name: "Reset columns" }).click();
  await expect(lead.locator('.ag-header-cell[col-id="onHand"]')).toHaveAttribute("aria-sort", "none");
  expect(await lead.evaluate((k) => localStorage.getItem(k), key)).toBeNull();
});

test("the printable count sheet lists every item and lot with an empty box", async ({ browser }) => {
  const lead = await signedInPage(browser, co.users.kitchen_lead.email, co.password);
  await lead.getByRole("link", { name: "Count sheet" }).click();
  await expect(lead.getByRole("heading", { level: 1 })).toContainText("Count sheet");
  const table = lead.getByRole("table", { name: /Count sheet of/ });
  for (const sku of [casing.sku, cure.sku, pepper.sku]) await expect(table.getByText(sku).first()).toBeVisible();
  await expect(table.getByText("PINK-0425")).toBeVisible();
  await expect(lead.getByRole("button", { name: "Print" })).toBeVisible();
  expect(await seriousViolations(lead)).toEqual([]);
  // printed: no rail, no header, no buttons
  await lead.emulateMedia({ media: "print" });
  await expect(lead.getByRole("navigation", { name: "Main" })).toBeHidden();
  await expect(lead.getByRole("button", { name: "Print" })).toBeHidden();
  await expect(table).toBeVisible();
  await lead.screenshot({ path: "tests/e2e/screenshots/count-sheet-print.png", fullPage: true });
});
