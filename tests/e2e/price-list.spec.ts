// Story: a buyer opens a supplier's page and sends the supplier's price list (a German export:
// semicolons, decimal commas, the SKU under "Bestell-Nr.", which no field name matches). The check
// says which column is missing; the buyer picks the SKU column and checks again. The preview shows
// the unknown SKU as a warning and each price up or down in percent and per hank / per kg; nothing
// is written yet. The buyer applies it; the list appears under the applied lists, and the casing's
// price page shows the new price beside the old one. No serious accessibility problems; 1024 x 768
// screenshots of the preview and the price page are kept for review.
import { fileURLToPath } from "node:url";
import { expect, test } from "@playwright/test";
import { closeDb, db } from "../../db/client";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { createItem, type TestItem } from "../support/stock";
import { seriousViolations, signedInPage } from "./support";

let co: TestCompany;
let hog: TestItem;
let pepper: TestItem;
let supplierId: string;
const supplierName = `Brackwater Naturdarm ${tag()}`;
const daysFromToday = (n: number) => new Date(Date.now() + n * 86_400_000).toISOString().slice(0, 10);
const FILE = fileURLToPath(new URL("../fixtures/csv/price-lists/order-code-header.csv", import.meta.url));

test.beforeAll(async () => {
  co = await createCompany({ kitchens: 1 });
  hog = await createItem(co.company.id, { category: "casing" }); // pc, one pc = one hank of 91.44 m
  pepper = await createItem(co.company.id, { category: "spice" }); // g
  const [s] = await db()("suppliers").insert({ company_id: co.company.id, name: supplierName, lead_time_days: 3 }).returning<{ id: string }[]>("id");
  supplierId = s!.id;
  const items = [
    { item: hog, sku: "HOG-B5", pack: "bundle of 5 hanks", quantity: "5", unit: "hank", size: "5", price: "199.00" },
    { item: pepper, sku: "PEP-1K", pack: "1 kg bag", quantity: "1", unit: "kg", size: "1000", price: "13.49" },
  ];
  for (const i of items) {
    const [si] = await db()("supplier_items")
      .insert({ company_id: co.company.id, supplier_id: supplierId, item_id: i.item.id, sku: i.sku, pack_label: i.pack, pack_quantity: i.quantity, pack_unit: i.unit, pack_size_stock: i.size })
      .returning<{ id: string }[]>("id");
    await db()("supplier_item_prices").insert({ company_id: co.company.id, supplier_item_id: si!.id, pack_price: i.price, effective_from: daysFromToday(-30) });
  }
});
test.afterAll(async () => {
  await closeDb();
});

test("a buyer sends a price list, sets the SKU column, reviews the changes and applies them", async ({ browser }) => {
  test.setTimeout(120_000);
  const page = await signedInPage(browser, co.users.buyer.email, co.password);
  await page.goto(`/purchasing/suppliers/${supplierId}`);
  await expect(page.getByRole("heading", { level: 1, name: supplierName })).toBeVisible();
  const section = page.getByRole("region", { name: "Price lists" });
  await expect(section.getByRole("heading", { name: "No price list applied yet" })).toBeVisible();

  // the first check: no column is named like a supplier SKU
  await section.getByLabel("Price list file (CSV)").setInputFiles(FILE);
  await expect(section.getByLabel("Prices take effect on")).toHaveValue(/^\d{4}-\d{2}-\d{2}$/);
  await section.getByRole("button", { name: "Check the file" }).click();
  const preview = section.getByRole("region", { name: "What this list would change" });
  await expect(preview).toBeVisible();
  await expect(preview.getByRole("table", { name: "Rows to look at" })).toContainText("no column is chosen for Supplier SKU");
  const columns = section.getByRole("group", { name: "Which column is which" });
  await expect(columns).toContainText("Read as UTF-8, cells separated by semicolons.");
  await expect(columns.getByLabel("Pack price (required)")).toHaveValue("2"); // "Preis", proposed
  await expect(columns.getByLabel("Decimal separator")).toHaveValue(",");
  await expect(section.getByRole("button", { name: /^Apply/ })).toBeDisabled();

  // the buyer says which column holds the SKU and checks again
  await columns.getByLabel("Supplier SKU (required)").selectOption({ label: "Bestell-Nr. (e.g. HOG-B5)" });
  await section.getByRole("button", { name: "Check again" }).click();
  await expect(preview.getByText("Ready to apply: 1 up, 1 down, 1 unknown SKU skipped. Nothing is written until you apply.")).toBeVisible();
  const findings = preview.getByRole("table", { name: "Rows to look at" });
  await expect(findings.getByRole("row")).toHaveCount(2); // header + the warning
  await expect(findings).toContainText('unknown SKU "ANIS-9"');
  await expect(findings).toContainText("Warning");
  const changes = preview.getByRole("table", { name: "Price changes" });
  // 199.00 -> 208.40: +4.72 %; per hank 39.80 -> 41.68 (a bundle of 5 hanks)
  const hogRow = changes.getByRole("row").filter({ hasText: "HOG-B5" });
  await expect(hogRow).toContainText("€199.00");
  await expect(hogRow).toContainText("€208.40");
  await expect(hogRow).toContainText("Up +4.7 %");
  await expect(hogRow).toContainText("€39.80 → €41.68 / hank");
  // 13.49 -> 13.10: -2.89 %; a 1 kg bag, so per kg the same
  const pepperRow = changes.getByRole("row").filter({ hasText: "PEP-1K" });
  await expect(pepperRow).toContainText("Down −2.9 %");
  await expect(pepperRow).toContainText("€13.49 → €13.10 / kg");
  expect(await db()("supplier_item_prices").where({ company_id: co.company.id }).count("* as n").first()).toEqual({ n: "2" }); // nothing written yet
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/price-list-preview.png", fullPage: true });

  // apply: the notice, the applied list, the mapping kept
  const apply = section.getByRole("button", { name: /^Apply 2 prices from \d{4}-\d{2}-\d{2}$/ });
  await expect(apply).toBeEnabled();
  await apply.click();
  await expect(section.getByRole("status")).toContainText(`Applied order-code-header.csv for ${supplierName}`);
  const applied = section.getByRole("table", { name: `Price lists applied for ${supplierName}` });
  await expect(applied.getByRole("row").filter({ hasText: "order-code-header.csv" })).toContainText(co.users.buyer.name);
  expect((await db()("supplier_import_mappings").where({ supplier_id: supplierId }).first()).mapping.columns.sku).toEqual({ header: "Bestell-Nr." });

  // the casing's prices: the new price in the history, above the old one
  await page.getByRole("link", { name: `Prices of ${hog.sku} from every supplier` }).click();
  await expect(page.getByRole("heading", { level: 1, name: /^Prices: / })).toBeVisible();
  const offers = page.getByRole("table", { name: `Prices of ${hog.sku} by supplier` });
  await expect(offers.getByRole("row").filter({ hasText: supplierName })).toContainText("€208.40");
  await expect(offers.getByRole("row").filter({ hasText: supplierName })).toContainText("€41.68"); // per hank
  const history = page.getByRole("table", { name: `Price history of ${hog.sku}` });
  const rows = history.getByRole("row");
  await expect(rows).toHaveCount(3);
  await expect(rows.nth(1)).toContainText("€208.40");
  await expect(rows.nth(1)).toContainText("Up +4.7 %");
  await expect(rows.nth(1)).toContainText("order-code-header.csv");
  await expect(rows.nth(2)).toContainText("€199.00");
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/price-list-item-prices.png", fullPage: true });
});
