// Stories of the stock grid's row menu at 1024 x 768 (the smallest screen in the kitchens, rail
// shown): every key column and the row's actions button fit without scrolling sideways; the menu
// works from the keyboard; a manager records a signed adjustment, a transfer out to another
// kitchen, waste on a cure lot, and handles an expired lot (wasting it works; using it by name is
// refused with LOT_EXPIRED). The items table fits too. Screenshots are kept for review.
import { expect, test, type Page } from "@playwright/test";
import { closeDb } from "../../db/client";
import { gridCell, seriousViolations, signedInPage } from "./support";
import { createCompany, type TestCompany } from "../support/factory";
import { createItem, type TestItem } from "../support/stock";

let co: TestCompany;
let pepper: TestItem;
let mace: TestItem;
let cure: TestItem;
let casing: TestItem;
let freshLot: string;
let oldLot: string;

const inDays = (n: number) => new Date(Date.now() + n * 86_400_000).toISOString().slice(0, 10);
const asPeopleRead = (iso: string) => new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", year: "numeric", timeZone: "UTC" }).format(new Date(`${iso}T00:00:00Z`));
const cell = gridCell;

test.beforeAll(async ({ browser }) => {
  co = await createCompany({ kitchens: 2 });
  const k1 = co.kitchens[0]!;
  pepper = await createItem(co.company.id, { category: "spice" });
  mace = await createItem(co.company.id, { category: "spice" });
  cure = await createItem(co.company.id, { category: "cure" });
  casing = await createItem(co.company.id, { category: "casing" });
  const manager = await signedInPage(browser, co.users.manager.email, co.password);
  const receive = async (r: Record<string, unknown>) => {
    const res = await manager.request.post("/api/movements", { data: { kind: "receipt", kitchen: k1.code, supplier: "Brine & Co", ...r } });
    expect(res.status(), await res.text()).toBe(201);
    return ((await res.json()) as { movements: { lot: { id: string } }[] }).movements[0]!.lot.id;
  };
  await receive({ item: pepper.sku, quantity: "500", unit: "g", lot: { unitCost: "0.03" } });
  await receive({ item: mace.sku, quantity: "400", unit: "g", lot: { unitCost: "0.05" } });
  await receive({ item: casing.sku, quantity: "3", unit: "hank", lot: { unitCost: "28.50" } });
  freshLot = await receive({ item: cure.sku, quantity: "1000", unit: "g", lot: { code: "PINK-NEW", date: inDays(200), dateKind: "use_by", unitCost: "0.012" } });
  oldLot = await receive({ item: cure.sku, quantity: "200", unit: "g", lot: { code: "PINK-OLD", date: inDays(-10), dateKind: "use_by", unitCost: "0.012" } });
  await manager.context().close();
});
test.afterAll(async () => {
  await closeDb();
});

const actionsButton = (page: Page, rowId: string) => cell(page, rowId, "actions").getByRole("button");
const focusedColumn = (page: Page) => page.evaluate(() => document.activeElement?.closest("[col-id]")?.getAttribute("col-id") ?? null);
const focusedRow = (page: Page) => page.evaluate(() => document.activeElement?.closest(".ag-row")?.getAttribute("row-id") ?? null);

async function openMenu(page: Page, rowId: string, name: string) {
  await actionsButton(page, rowId).click();
  const menu = page.getByRole("menu", { name });
  await expect(menu).toBeVisible();
  return menu;
}

test("at 1024 x 768 every key column and the row's actions button fit without scrolling sideways", async ({ browser }) => {
  const page = await signedInPage(browser, co.users.manager.email, co.password, co.kitchens[0]!.id);
  expect(page.viewportSize()).toEqual({ width: 1024, height: 768 });
  const row = `item:${pepper.id}`;
  await expect(cell(page, row, "onHand")).toContainText("500 g");

  const grid = page.locator(".ag-root-wrapper");
  const box = (await grid.boundingBox())!;
  expect(box.x + box.width).toBeLessThanOrEqual(1024);
  for (const col of ["item", "onHand", "reserved", "available", "counted", "parLevel", "reorderPoint", "actions"]) {
    const header = page.locator(`.ag-header-cell[col-id="${col}"]`);
    await expect(header, col).toBeVisible();
    const h = (await header.boundingBox())!;
    expect(h.x, `${col} starts inside the grid`).toBeGreaterThanOrEqual(box.x - 1);
    expect(h.x + h.width, `${col} ends inside the grid`).toBeLessThanOrEqual(box.x + box.width + 1);
  }
  // nothing to scroll sideways, and the centre columns are not hidden under the pinned ones
  const scroll = await page.locator(".ag-body-horizontal-scroll-viewport").evaluate((el) => ({ width: el.scrollWidth, visible: el.clientWidth }));
  expect(scroll.width).toBeLessThanOrEqual(scroll.visible + 1);
  const reorder = (await page.locator('.ag-header-cell[col-id="reorderPoint"]').boundingBox())!;
  const actions = (await page.locator('.ag-header-cell[col-id="actions"]').boundingBox())!;
  expect(reorder.x + reorder.width).toBeLessThanOrEqual(actions.x + 1);
  await expect(page.locator('.ag-header-cell[col-id="reorderPoint"]')).toContainText("Reorder point");

  // one small button per row, a menu button
  const button = actionsButton(page, row);
  await expect(button).toHaveAccessibleName(`Actions for ${pepper.sku}`);
  await expect(button).toHaveAttribute("aria-haspopup", "menu");
  await expect(button).toHaveAttribute("aria-expanded", "false");
  const b = (await button.boundingBox())!;
  expect(b.width).toBeGreaterThanOrEqual(44); // a touch target
  expect(b.width).toBeLessThanOrEqual(48);
  expect(b.x + b.width).toBeLessThanOrEqual(1024);
  // nothing drawn over its right edge (the grid's scrollbar lies over the last 16 px on tablets)
  const onTop = await page.evaluate(([x, y]) => document.elementFromPoint(x!, y!)?.closest("button")?.getAttribute("aria-label") ?? null, [b.x + b.width - 1, b.y + b.height / 2]);
  expect(onTop).toBe(`Actions for ${pepper.sku}`);

  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/stock-grid-1024.png" });
  await page.context().close();
});

test("the row menu works from the keyboard and opens the history and record sheets", async ({ browser }) => {
  test.setTimeout(90_000);
  const page = await signedInPage(browser, co.users.manager.email, co.password, co.kitchens[0]!.id);
  const row = `item:${pepper.id}`;
  await expect(cell(page, row, "onHand")).toContainText("500 g");

  // Shift+F10 on any cell of the row opens its menu on the first item
  await cell(page, row, "onHand").click();
  await page.keyboard.press("Shift+F10");
  const menu = page.getByRole("menu", { name: `Actions for ${pepper.sku}` });
  await expect(menu).toBeVisible();
  await expect(menu.getByRole("menuitem")).toHaveText(["History", "Record waste", "Record adjustment", "Transfer out"]);
  await expect(menu.getByRole("menuitem", { name: "History" })).toBeFocused();
  await expect(actionsButton(page, row)).toHaveAttribute("aria-expanded", "true");
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/stock-grid-menu.png" });

  // arrows go round, Home and End jump, a letter finds an item
  await page.keyboard.press("ArrowDown");
  await expect(menu.getByRole("menuitem", { name: "Record waste" })).toBeFocused();
  await page.keyboard.press("ArrowUp");
  await page.keyboard.press("ArrowUp");
  await expect(menu.getByRole("menuitem", { name: "Transfer out" })).toBeFocused();
  await page.keyboard.press("Home");
  await expect(menu.getByRole("menuitem", { name: "History" })).toBeFocused();
  await page.keyboard.press("End");
  await expect(menu.getByRole("menuitem", { name: "Transfer out" })).toBeFocused();
  await page.keyboard.press("r");
  await expect(menu.getByRole("menuitem", { name: "Record waste" })).toBeFocused();
  await page.keyboard.press("r");
  await expect(menu.getByRole("menuitem", { name: "Record adjustment" })).toBeFocused();

  // Escape closes it and leaves focus on the row's actions cell
  await page.keyboard.press("Escape");
  await expect(menu).toBeHidden();
  await expect(actionsButton(page, row)).toHaveAttribute("aria-expanded", "false");
  expect(await focusedColumn(page)).toBe("actions");
  expect(await focusedRow(page)).toBe(row);

  // Enter on the actions cell opens it again; Enter on History opens the history sheet
  await page.keyboard.press("Enter");
  await expect(menu).toBeVisible();
  await expect(menu.getByRole("menuitem", { name: "History" })).toBeFocused();
  await page.keyboard.press("Enter");
  const history = page.getByRole("dialog", { name: `History of ${pepper.sku}` });
  await expect(history).toBeVisible();
  await expect(menu).toBeHidden();
  await expect(history.getByRole("listitem").first()).toContainText("Received");
  await page.keyboard.press("Escape");
  await expect(history).toBeHidden();
  expect(await focusedColumn(page)).toBe("actions");

  // a click outside closes the menu without choosing
  await openMenu(page, row, `Actions for ${pepper.sku}`);
  await page.getByRole("heading", { level: 1 }).click();
  await expect(menu).toBeHidden();

  // each record item opens the sheet in its mode
  for (const [choice, mode] of [["Record waste", "Waste"], ["Record adjustment", "Adjustment"], ["Transfer out", "Transfer out"]] as const) {
    await (await openMenu(page, row, `Actions for ${pepper.sku}`)).getByRole("menuitem", { name: choice }).click();
    const sheet = page.getByRole("dialog", { name: `Record for ${pepper.sku}` });
    await expect(sheet).toBeVisible();
    await expect(sheet.getByRole("radio", { name: mode })).toBeChecked();
    await expect(sheet.getByRole("button", { name: `Record ${mode.toLowerCase()}` })).toBeVisible();
    await sheet.getByRole("button", { name: "Cancel" }).click();
    await expect(sheet).toBeHidden();
  }
  await page.context().close();
});

test("a manager records a signed adjustment from the row menu and on hand changes exactly", async ({ browser }) => {
  const page = await signedInPage(browser, co.users.manager.email, co.password, co.kitchens[0]!.id);
  const row = `item:${pepper.id}`;
  await expect(cell(page, row, "onHand")).toContainText("500 g");
  await (await openMenu(page, row, `Actions for ${pepper.sku}`)).getByRole("menuitem", { name: "Record adjustment" }).click();
  const sheet = page.getByRole("dialog", { name: `Record for ${pepper.sku}` });
  await expect(sheet.getByRole("radio", { name: "Adjustment" })).toBeChecked();
  // the unit starts as the stock unit (not the smallest of its dimension)
  await expect(sheet.getByLabel("Unit")).toHaveValue("g");
  // zero is no adjustment: the server's field message beside the quantity
  await sheet.getByLabel("Quantity (+ or −)").fill("0");
  await sheet.getByRole("button", { name: "Record adjustment" }).click();
  await expect(sheet.getByText("An adjustment is a signed, non-zero quantity.")).toBeVisible();
  // a quarter pound off: 113.3980925 g, exactly
  await sheet.getByLabel("Quantity (+ or −)").fill("-0.25");
  await sheet.getByLabel("Unit").selectOption("lb");
  await sheet.getByLabel("Reason (optional)").fill("Scale check");
  await sheet.getByRole("button", { name: "Record adjustment" }).click();
  await expect(sheet).toBeHidden();
  await expect(page.getByRole("status").filter({ hasText: "Adjustment recorded" })).toContainText(`-0.25 lb of ${pepper.sku}`);
  await expect(cell(page, row, "onHand")).toContainText("386.6 g");
  const res = await page.request.get(`/api/stock?kitchen=${co.kitchens[0]!.code}`);
  const stock = (await res.json()) as { rows: { itemId: string; onHand: string }[] };
  expect(stock.rows.find((r) => r.itemId === pepper.id)?.onHand).toBe("386.6019075");
  // and back up with a plus sign
  await (await openMenu(page, row, `Actions for ${pepper.sku}`)).getByRole("menuitem", { name: "Record adjustment" }).click();
  await sheet.getByLabel("Quantity (+ or −)").fill("13.3980925");
  await sheet.getByLabel("Unit").selectOption("g");
  await sheet.getByRole("button", { name: "Record adjustment" }).click();
  await expect(sheet).toBeHidden();
  await expect(cell(page, row, "onHand")).toContainText("400 g");
  await page.context().close();
});

test("a manager transfers stock out to another kitchen from the row menu and the balance leaves", async ({ browser }) => {
  const [k1, k2] = [co.kitchens[0]!, co.kitchens[1]!];
  const page = await signedInPage(browser, co.users.manager.email, co.password, k1.id);
  const row = `item:${mace.id}`;
  await expect(cell(page, row, "onHand")).toContainText("400 g");
  await (await openMenu(page, row, `Actions for ${mace.sku}`)).getByRole("menuitem", { name: "Transfer out" }).click();
  const sheet = page.getByRole("dialog", { name: `Record for ${mace.sku}` });
  await expect(sheet.getByRole("radio", { name: "Transfer out" })).toBeChecked();
  await sheet.getByLabel("Quantity").fill("150");
  await sheet.getByLabel("Unit").selectOption("g");
  // no kitchen chosen: refused, naming the field
  await sheet.getByRole("button", { name: "Record transfer out" }).click();
  await expect(sheet.getByText("Name the kitchen the stock goes to.")).toBeVisible();
  await sheet.getByLabel("Receiving kitchen").selectOption(k2.code);
  expect(await seriousViolations(page)).toEqual([]);
  await sheet.getByRole("button", { name: "Record transfer out" }).click();
  await expect(sheet).toBeHidden();
  await expect(page.getByRole("status").filter({ hasText: "Transfer recorded" })).toContainText(`150 g of ${mace.sku} sent to ${k2.code}`);
  await expect(cell(page, row, "onHand")).toContainText("250 g");
  await expect(cell(page, row, "available")).toContainText("250 g");

  // the other kitchen has it
  await page.context().addCookies([{ name: "hl_kitchen", value: k2.id, url: page.url() }]);
  await page.reload();
  await expect(page.getByRole("heading", { level: 1 })).toContainText(k2.name);
  await expect(cell(page, row, "onHand")).toContainText("150 g");
  await (await openMenu(page, row, `Actions for ${mace.sku}`)).getByRole("menuitem", { name: "History" }).click();
  const history = page.getByRole("dialog", { name: `History of ${mace.sku}` });
  await expect(history.getByRole("listitem").first()).toContainText(`Transfer in from ${k1.code}`);
  await expect(history.getByRole("listitem").first()).toContainText("+150 g");
  await page.context().close();
});

test("waste is recorded on a cure lot's own row, from that row's menu", async ({ browser }) => {
  const page = await signedInPage(browser, co.users.manager.email, co.password, co.kitchens[0]!.id);
  const itemRow = `item:${cure.id}`;
  const lotRow = `lot:${cure.id}:${freshLot}`;
  await expect(cell(page, itemRow, "onHand")).toContainText("1.2 kg");
  await cell(page, itemRow, "item").getByRole("button", { name: `Show lots of ${cure.sku}` }).click();
  await expect(cell(page, lotRow, "item")).toContainText("Lot PINK-NEW");
  await expect(cell(page, lotRow, "onHand")).toContainText("1 kg");
  const menu = await openMenu(page, lotRow, `Actions for ${cure.sku}, lot PINK-NEW`);
  await menu.getByRole("menuitem", { name: "Record waste" }).click();
  const sheet = page.getByRole("dialog", { name: `Record for ${cure.sku}` });
  await expect(sheet).toContainText("lot PINK-NEW");
  await expect(sheet).toContainText("Available in lot PINK-NEW: 1 kg");
  await expect(sheet.getByRole("complementary", { name: "Cure caution" })).toBeVisible();
  await sheet.getByLabel("Quantity").fill("50");
  await sheet.getByLabel("Unit").selectOption("g");
  await sheet.getByLabel("Reason").fill("Spilled on the bench");
  await sheet.getByRole("button", { name: "Record waste" }).click();
  await expect(sheet).toBeHidden();
  await expect(page.getByRole("status").filter({ hasText: "Waste recorded" })).toContainText(`50 g of ${cure.sku}, lot PINK-NEW`);
  await expect(cell(page, lotRow, "onHand")).toContainText("950 g");
  await expect(cell(page, itemRow, "onHand")).toContainText("1.15 kg");
  // the other lot was not touched
  await expect(cell(page, `lot:${cure.id}:${oldLot}`, "onHand")).toContainText("200 g");
  await page.context().close();
});

test("an expired cure lot: wasting it works, using it by name is refused with LOT_EXPIRED", async ({ browser }) => {
  const k1 = co.kitchens[0]!;
  const page = await signedInPage(browser, co.users.manager.email, co.password, k1.id);
  const itemRow = `item:${cure.id}`;
  const lotRow = `lot:${cure.id}:${oldLot}`;
  await cell(page, itemRow, "item").getByRole("button", { name: `Show lots of ${cure.sku}` }).click();
  await expect(cell(page, lotRow, "item")).toContainText("Lot PINK-OLD");
  // the band's word stays whole in the narrow item column; the date gives way
  const band = cell(page, lotRow, "item").getByText("expired", { exact: true });
  await expect(band).toBeVisible();
  const [tag, itemCell] = [(await band.boundingBox())!, (await cell(page, lotRow, "item").boundingBox())!];
  expect(tag.x + tag.width).toBeLessThanOrEqual(itemCell.x + itemCell.width);

  // the record sheet has no "use" mode (use happens in production); the product refuses using an
  // expired lot by name, with its own words
  const use = await page.request.post("/api/movements", {
    data: { kind: "use", kitchen: k1.code, item: cure.id, lot: oldLot, quantity: "10", unit: "g" },
  });
  expect(use.status()).toBe(409);
  const refused = (await use.json()) as { error: { code: string; message: string } };
  expect(refused.error.code).toBe("LOT_EXPIRED");
  expect(refused.error.message).toBe(`Lot PINK-OLD expired on ${inDays(-10)}; it cannot be used. Waste it instead.`);

  // from the lot's menu the sheet says the lot is expired, and wasting it works
  await (await openMenu(page, lotRow, `Actions for ${cure.sku}, lot PINK-OLD`)).getByRole("menuitem", { name: "Record waste" }).click();
  const sheet = page.getByRole("dialog", { name: `Record for ${cure.sku}` });
  await expect(sheet.getByText(`Lot PINK-OLD is expired (use by ${asPeopleRead(inDays(-10))}): it may be wasted, but not used in production.`)).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/stock-expired-lot-sheet.png" });
  await sheet.getByLabel("Quantity").fill("150");
  await sheet.getByLabel("Unit").selectOption("g");
  await sheet.getByLabel("Reason").fill("Past its use-by date");
  await sheet.getByRole("button", { name: "Record waste" }).click();
  await expect(sheet).toBeHidden();
  await expect(page.getByRole("status").filter({ hasText: "Waste recorded" })).toContainText(`150 g of ${cure.sku}, lot PINK-OLD`);
  await expect(cell(page, lotRow, "onHand")).toContainText("50 g");

  // more than the lot holds is refused with what it has
  await (await openMenu(page, lotRow, `Actions for ${cure.sku}, lot PINK-OLD`)).getByRole("menuitem", { name: "Record waste" }).click();
  await sheet.getByLabel("Quantity").fill("60");
  await sheet.getByLabel("Unit").selectOption("g");
  await sheet.getByLabel("Reason").fill("Past its use-by date");
  await sheet.getByRole("button", { name: "Record waste" }).click();
  await expect(sheet.getByRole("alert").filter({ hasText: "not enough stock" })).toContainText("Only 50 g available in lot PINK-OLD");
  await sheet.getByRole("button", { name: "Cancel" }).click();

  // an adjustment of the expired lot by name is not a use: the ledger records it
  await (await openMenu(page, lotRow, `Actions for ${cure.sku}, lot PINK-OLD`)).getByRole("menuitem", { name: "Record adjustment" }).click();
  await sheet.getByLabel("Quantity (+ or −)").fill("-5");
  await sheet.getByLabel("Unit").selectOption("g");
  await sheet.getByRole("button", { name: "Record adjustment" }).click();
  await expect(sheet).toBeHidden();
  await expect(page.getByRole("status").filter({ hasText: "Adjustment recorded" })).toContainText(`-5 g of ${cure.sku}, lot PINK-OLD`);
  await expect(cell(page, lotRow, "onHand")).toContainText("45 g");
  await page.context().close();
});

test("someone who may not post (an accountant) gets History alone in the row menu", async ({ browser }) => {
  const page = await signedInPage(browser, co.users.accountant.email, co.password, co.kitchens[0]!.id);
  const row = `item:${pepper.id}`;
  await expect(cell(page, row, "onHand")).toBeVisible();
  const menu = await openMenu(page, row, `Actions for ${pepper.sku}`);
  await expect(menu.getByRole("menuitem")).toHaveText(["History"]);
  await menu.getByRole("menuitem", { name: "History" }).click();
  await expect(page.getByRole("dialog", { name: `History of ${pepper.sku}` })).toBeVisible();
  await page.context().close();
});

test("at 1024 x 768 the items table fits, Edit buttons included", async ({ browser }) => {
  const page = await signedInPage(browser, co.users.manager.email, co.password);
  await page.goto("/stock/items");
  await expect(page.getByRole("heading", { level: 1 })).toContainText("Items");
  const table = page.getByRole("table", { name: "Items by category" });
  await expect(table).toBeVisible();
  const scroller = table.locator("xpath=..");
  const scroll = await scroller.evaluate((el) => ({ width: el.scrollWidth, visible: el.clientWidth }));
  expect(scroll.width).toBeLessThanOrEqual(scroll.visible + 1);
  for (const item of [pepper, cure, casing]) {
    const edit = table.getByRole("button", { name: new RegExp(`^Edit ${item.sku} `) });
    await expect(edit).toBeVisible();
    const b = (await edit.boundingBox())!;
    expect(b.x + b.width, `${item.sku}'s Edit button is on screen`).toBeLessThanOrEqual(1024);
    const panel = (await scroller.boundingBox())!;
    expect(b.x + b.width, `${item.sku}'s Edit button is inside the table`).toBeLessThanOrEqual(panel.x + panel.width);
  }
  // the folded columns still say what they held
  const cureRow = table.getByRole("row", { name: new RegExp(cure.sku) });
  await expect(cureRow).toContainText("nitrite 6.25 % · nitrate 0 %");
  await expect(cureRow).toContainText("by lot and date");
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/stock-items-1024.png" });
  await page.context().close();
});
