// Story: a buyer opens Buying > Orders, drafts an order for a supplier (the supplier's items at
// their current prices, packs typed, the line totals and the order total worked out while typing),
// lands on the order, approves it (under the company's approval threshold) and sends it; the order
// then says "Sent to supplier", its history names the buyer, and the supplier's order address has
// the e-mail with the PDF and CSV (read from the mail catcher, sent by the real worker). No serious
// accessibility problems; 1024 x 768 screenshots of the form and the sent order are kept for review.
import { expect, test } from "@playwright/test";
import { closeDb, db } from "../../db/client";
import { createCompany, tag, uniqueEmail, type TestCompany } from "../support/factory";
import { waitForMail } from "../support/mail";
import { createItem, type TestItem } from "../support/stock";
import { seriousViolations, signedInPage } from "./support";

let co: TestCompany;
let casing: TestItem;
let cure: TestItem;
const supplierName = `Hollin Casings ${tag()}`;
const orderEmail = uniqueEmail("orders");
const daysFromToday = (n: number) => new Date(Date.now() + n * 86_400_000).toISOString().slice(0, 10);

test.beforeAll(async () => {
  co = await createCompany({ kitchens: 2 });
  casing = await createItem(co.company.id, { category: "casing" });
  cure = await createItem(co.company.id, { category: "cure" });
  // the supplier and its price list straight into the tables (the supplier pages have their own story)
  const [s] = await db()("suppliers")
    .insert({ company_id: co.company.id, name: supplierName, contact_name: "Tamsin Hollin", order_email: orderEmail, lead_time_days: 4, min_order_value: "100" })
    .returning<{ id: string }[]>("id");
  const items = [
    { item: casing, sku: "HC-3235-B5", description: "Hog casings 32/35, bundled", pack: "bundle of 5 hanks", size: "5", price: "118.40" },
    { item: cure, sku: "HC-CURE1", description: "Curing salt No. 1", pack: "1 kg tub", size: "1000", price: "6.85" },
  ];
  for (const i of items) {
    const [si] = await db()("supplier_items")
      .insert({ company_id: co.company.id, supplier_id: s!.id, item_id: i.item.id, sku: i.sku, description: i.description, pack_label: i.pack, pack_quantity: "1", pack_unit: i.pack, pack_size_stock: i.size })
      .returning<{ id: string }[]>("id");
    await db()("supplier_item_prices").insert({ company_id: co.company.id, supplier_item_id: si!.id, pack_price: i.price, effective_from: daysFromToday(-7) });
  }
});
test.afterAll(async () => {
  await closeDb();
});

test("a buyer drafts an order for a supplier, approves it and sends it; the order shows Sent to supplier", async ({ browser }) => {
  test.setTimeout(120_000);
  const page = await signedInPage(browser, co.users.buyer.email, co.password);
  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Buying" }).click();
  await page.getByRole("navigation", { name: "Buying" }).getByRole("link", { name: "Orders" }).click();
  await expect(page).toHaveURL(/\/purchasing\/orders$/);
  await expect(page.getByRole("heading", { level: 1, name: "Purchase orders" })).toBeVisible();
  await expect(page.getByRole("heading", { name: "No purchase orders yet" })).toBeVisible();

  // the new order, in a side sheet
  await page.getByRole("button", { name: "New order" }).click();
  const sheet = page.getByRole("dialog", { name: "New purchase order" });
  await sheet.getByLabel("Supplier", { exact: true }).selectOption({ label: supplierName });
  await sheet.getByLabel("Deliver to").selectOption({ label: co.kitchens[1]!.name });
  await sheet.getByLabel("Needed by (optional)").fill(daysFromToday(4));
  await sheet.getByLabel("Add an item").selectOption({ label: "HC-3235-B5 · Hog casings 32/35, bundled · bundle of 5 hanks · €118.40" });
  const first = sheet.getByRole("listitem", { name: "Line 1: HC-3235-B5" });
  await expect(first.getByLabel("Pack price (EUR)")).toHaveValue("118.40"); // the current price
  await expect(first).toContainText("(5 hanks)"); // one bundle in our stock unit
  await first.getByLabel("Packs").fill("3");
  // 3 x 118.40 = 355.20, worked out as it is typed
  await expect(first.getByLabel("Line total of HC-3235-B5")).toHaveText("€355.20");
  await sheet.getByLabel("Add an item").selectOption({ label: "HC-CURE1 · Curing salt No. 1 · 1 kg tub · €6.85" });
  const second = sheet.getByRole("listitem", { name: "Line 2: HC-CURE1" });
  await expect(second.getByText("Cure", { exact: true })).toBeVisible(); // the cure marker
  await expect(sheet.getByRole("complementary", { name: "Cure caution" })).toBeVisible();
  await second.getByLabel("Packs").fill("2.5");
  await expect(second.getByLabel("Line total of HC-CURE1")).toHaveText("—"); // not whole packs: no total yet
  await sheet.getByRole("button", { name: "Create draft" }).click();
  await expect(sheet.getByText("Order whole packs, e.g. \"3\": suppliers sell these items by the pack.")).toBeVisible(); // the server names lines.1.packs
  await second.getByLabel("Packs").fill("4");
  await expect(sheet.getByText("Order whole packs")).toHaveCount(0); // the error goes once the field is changed
  // 4 x 6.85 = 27.40; 355.20 + 27.40 = 382.60
  await expect(second.getByLabel("Line total of HC-CURE1")).toHaveText("€27.40");
  await expect(sheet.getByLabel("Order total")).toHaveText("€382.60");
  await sheet.getByLabel("Notes for the supplier (optional)").fill("Back door, before 10:00.");
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/purchase-order-new.png" });
  await sheet.getByRole("button", { name: "Create draft" }).click();

  // the order's own page
  await expect(page).toHaveURL(/\/purchasing\/orders\/[0-9a-f-]{36}$/);
  const title = page.getByRole("heading", { level: 1 });
  await expect(title).toHaveText(/^Purchase order PO-\d{4}-\d{4}$/);
  const number = (await title.textContent())!.replace("Purchase order ", "");
  await expect(page.getByText("Draft", { exact: true })).toBeVisible();
  const lines = page.getByRole("table", { name: `Lines of ${number}` });
  await expect(lines.getByRole("row", { name: /HC-3235-B5/ })).toContainText("15 hanks"); // 3 bundles of 5 hanks
  await expect(lines.getByRole("row", { name: /HC-CURE1/ })).toContainText("4 kg"); // 4 tubs of 1 kg
  await expect(lines.getByRole("row", { name: "Order total" })).toContainText("€382.60");
  await expect(page.getByRole("complementary", { name: "Cure caution" })).toBeVisible();

  await page.getByRole("button", { name: "Approve" }).click();
  await expect(page.getByRole("status").filter({ hasText: `${number} is approved` })).toBeVisible();
  await expect(page.getByText("Approved", { exact: true }).first()).toBeVisible();
  await page.getByRole("button", { name: "Send to supplier" }).click();
  await expect(page.getByRole("status").filter({ hasText: `${number} is on its way to ${supplierName}` })).toBeVisible();
  await expect(page.getByText("Sent to supplier", { exact: true }).first()).toBeVisible();
  const history = page.getByRole("list").filter({ hasText: "Drafted" });
  await expect(history).toContainText(`Sent to supplier`);
  await expect(history).toContainText(`To ${orderEmail}`);
  await expect(history).toContainText(`by ${co.users.buyer.name}`);
  await expect(page.getByRole("button", { name: "Send to supplier" })).toHaveCount(0);
  await expect(page.getByRole("link", { name: "PDF" })).toHaveAttribute("href", /\/pdf$/);
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/purchase-order-sent.png", fullPage: true });

  // the supplier has it, with both files
  const mail = await waitForMail({ to: orderEmail, subjectIncludes: number, timeoutMs: 20_000 });
  expect(mail.attachments.map((a) => a.filename)).toEqual([`${number}.pdf`, `${number}.csv`]);

  // and the list shows it sent
  await page.getByRole("link", { name: "All orders" }).click();
  const row = page.getByRole("table", { name: "Purchase orders" }).getByRole("row", { name: new RegExp(number) });
  await expect(row).toContainText("Sent to supplier");
  await expect(row).toContainText("€382.60");
  await page.getByRole("link", { name: "Sent to supplier", exact: true }).click();
  await expect(page).toHaveURL(/status=sent$/);
  await expect(page.getByRole("table", { name: "Purchase orders" }).getByRole("row")).toHaveCount(2); // header and the one order
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/purchase-orders-list.png" });
});
