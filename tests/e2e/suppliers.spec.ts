// Story: a buyer opens Buying, adds a supplier (order e-mail, lead time, minimum order) and sees it
// listed; on the supplier's page adds an item: the supplier's SKU for our hog casing, sold as a
// "bundle of 5 hanks", which the form works out as 5 hanks = 457.2 m while it is typed, with the
// GTIN from the label padded to 14 digits; a bad GTIN is refused at its field. The supplier list
// then counts the item. An accountant reads the same pages without the add buttons.
import { expect, test } from "@playwright/test";
import { closeDb } from "../../db/client";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { createItem, type TestItem } from "../support/stock";
import { seriousViolations, signedInPage } from "./support";

let co: TestCompany;
let hank: TestItem;
let cure: TestItem;

test.beforeAll(async () => {
  co = await createCompany({ kitchens: 1 });
  hank = await createItem(co.company.id, { category: "casing" });
  cure = await createItem(co.company.id, { category: "cure" });
});
test.afterAll(async () => {
  await closeDb();
});

test("a buyer adds a supplier and an item sold in bundles of hanks, and sees both listed", async ({ browser }) => {
  test.setTimeout(90_000);
  const supplierName = `Brackwater Casings ${tag()}`;
  const page = await signedInPage(browser, co.users.buyer.email, co.password);
  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Buying" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Buying" })).toBeVisible();
  await expect(page.getByRole("heading", { name: "No active suppliers" })).toBeVisible();

  // the supplier, in a side sheet
  await page.getByRole("button", { name: "Add supplier" }).click();
  const sheet = page.getByRole("dialog", { name: "Add a supplier" });
  await expect(sheet.getByLabel("Name")).toBeFocused();
  await sheet.getByLabel("Name").fill(supplierName);
  await sheet.getByLabel("Lead time, days").fill("4");
  await sheet.getByLabel("Minimum order, EUR").fill("120.505"); // EUR has 2 decimals (ISO 4217)
  await sheet.getByLabel("Order e-mail").fill("Orders@Brackwater.Example");
  await sheet.getByLabel("Contact").fill("Hedda Vane");
  await sheet.getByRole("button", { name: "Add supplier" }).click();
  await expect(sheet.getByText("EUR has 2 decimals")).toBeVisible();
  await sheet.getByLabel("Minimum order, EUR").fill("120.50");
  await sheet.getByRole("button", { name: "Add supplier" }).click();
  await expect(sheet).toBeHidden();
  await expect(page.getByRole("status").filter({ hasText: `Added ${supplierName}.` })).toBeVisible();

  const table = page.getByRole("table", { name: "Suppliers" });
  const row = table.getByRole("row").filter({ hasText: supplierName });
  await expect(row).toContainText("4 days");
  await expect(row).toContainText("€120.50");
  await expect(row).toContainText("orders@brackwater.example");
  await expect(row.getByRole("cell").nth(2)).toHaveText("0"); // no items yet
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/buying-suppliers.png" });

  // its page: details and an empty list of items
  await row.getByRole("link", { name: supplierName }).click();
  await expect(page.getByRole("heading", { level: 1, name: supplierName })).toBeVisible();
  await expect(page.getByText("Lead time 4 days, minimum order €120.50.")).toBeVisible();
  await expect(page.getByRole("heading", { name: "No items yet" })).toBeVisible();

  // an item: the pack converted while typing; a bad GTIN refused at its field
  await page.getByRole("button", { name: "Add item" }).click();
  const itemSheet = page.getByRole("dialog", { name: "Add an item" });
  await itemSheet.getByLabel("Supplier's SKU").fill("BW-HOG-B5");
  await itemSheet.getByLabel("Their description").fill("Hog casings 32/35, salted, bundled");
  await itemSheet.getByLabel("Our item").selectOption({ label: `${hank.sku} · Test casing ${hank.sku}` });
  await itemSheet.getByLabel("As the supplier calls it").fill("bundle of 5 hanks");
  await itemSheet.getByLabel("Size").fill("5");
  await itemSheet.getByLabel("Unit").fill("hank");
  // a hank is 100 yd = 91.44 m (trade-facts §4): 5 hanks are 457.2 m
  await expect(itemSheet.getByText("One pack = 5 hanks (457.2 m)")).toBeVisible();
  await itemSheet.getByLabel("Unit").fill("kg");
  await expect(itemSheet.getByText('"kg" is a mass unit')).toBeVisible();
  await itemSheet.getByLabel("Unit").fill("hank");
  // 036000291453: wrong check digit (mod 10 gives 2, trade-facts §6)
  await itemSheet.getByLabel("GTIN (barcode number)").fill("036000291453");
  await itemSheet.getByRole("button", { name: "Add item" }).click();
  await expect(itemSheet.getByText("Not a valid GTIN")).toBeVisible();
  await expect(itemSheet.getByLabel("GTIN (barcode number)")).toHaveAttribute("aria-invalid", "true");
  await itemSheet.getByLabel("GTIN (barcode number)").fill("036000291452");
  await expect(itemSheet.getByText("Kept as 00036000291452 (14 digits).")).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/supplier-item-form.png" });
  await itemSheet.getByRole("button", { name: "Add item" }).click();
  await expect(itemSheet).toBeHidden();
  await expect(page.getByRole("status").filter({ hasText: "Added BW-HOG-B5." })).toBeVisible();

  const items = page.getByRole("table", { name: `Items sold by ${supplierName}` });
  const itemRow = items.getByRole("row").filter({ hasText: "BW-HOG-B5" });
  await expect(itemRow).toContainText("bundle of 5 hanks");
  await expect(itemRow).toContainText("5 hanks");
  await expect(itemRow).toContainText("457.2 m");
  await expect(itemRow).toContainText("00036000291452");
  await expect(itemRow).toContainText(hank.sku);

  // a cure brings the cure caution with it
  await page.getByRole("button", { name: "Add item" }).click();
  const cureSheet = page.getByRole("dialog", { name: "Add an item" });
  await cureSheet.getByLabel("Supplier's SKU").fill("BW-CURE1-1KG");
  await cureSheet.getByLabel("Our item").selectOption({ label: `${cure.sku} · Test cure ${cure.sku}` });
  await cureSheet.getByLabel("Size").fill("1");
  await cureSheet.getByLabel("Unit").fill("kg");
  await expect(cureSheet.getByText("One pack = 1 kg")).toBeVisible();
  await cureSheet.getByRole("button", { name: "Add item" }).click();
  await expect(cureSheet).toBeHidden();
  await expect(page.getByRole("complementary", { name: "Cure caution" })).toBeVisible();
  await expect(items.getByRole("row").filter({ hasText: "BW-CURE1-1KG" })).toContainText("1 kg");
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/supplier-page.png" });

  // back on the list, the supplier counts its two items
  await page.getByRole("link", { name: "All suppliers" }).click();
  await expect(page.getByRole("table", { name: "Suppliers" }).getByRole("row").filter({ hasText: supplierName }).getByRole("cell").nth(2)).toHaveText("2");
  await page.context().close();

  // an accountant reads it all, without the buttons that change it
  const accountant = await signedInPage(browser, co.users.accountant.email, co.password);
  await accountant.goto("/purchasing");
  await expect(accountant.getByRole("table", { name: "Suppliers" })).toContainText(supplierName);
  await expect(accountant.getByRole("button", { name: "Add supplier" })).toHaveCount(0);
  await accountant.getByRole("link", { name: supplierName }).click();
  await expect(accountant.getByRole("table", { name: `Items sold by ${supplierName}` })).toContainText("BW-HOG-B5");
  await expect(accountant.getByRole("button", { name: "Add item" })).toHaveCount(0);
  await expect(accountant.getByRole("button", { name: "Edit details" })).toHaveCount(0);
  await accountant.context().close();
});
