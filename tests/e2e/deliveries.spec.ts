// Story: a supplier's delivery note arrives as CSV against a sent order (10 bags of paprika, 4
// bundles of 5 hog hanks, 2 bundles of 5 sheep hanks, 2 tubs of cure). The note has a short line
// (8 of the 10 bags), a different item (2 bundles of 10 hog hanks instead of 4 of 5: the same 20
// hanks), a line without a lot (the sheep casings) and a short-dated cure (45 days left, under the
// 90-day default of the purchasing issue). The buyer reads the note, sees each finding, accepts the
// short line and the substitute, types the sheep casings' lot in and accepts them, accepts the
// short-dated cure knowingly (it goes into this month's bacon), books the delivery, and the stock
// grid of the kitchen shows the new lots. No serious or critical axe findings; screenshots at
// 1024 x 768 of the reconciliation before and after.
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { expect, test } from "@playwright/test";
import { closeDb, db } from "../../db/client";
import { deliveryFixture, deliveryScenario, type DeliveryScenario } from "../support/deliveries";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { gridCell, seriousViolations, signedInPage } from "./support";

let co: TestCompany;
let s: DeliveryScenario;
let csvPath: string;
const note = `DN-${tag().slice(0, 6).toUpperCase()}`;

test.beforeAll(async () => {
  co = await createCompany({ kitchens: 1 });
  s = await deliveryScenario(co.company.id, co.kitchens[0]!.id, co.users.buyer.id);
  csvPath = path.join(mkdtempSync(path.join(tmpdir(), "hl-dl-")), "delivery-note.csv");
  writeFileSync(csvPath, await deliveryFixture("story.csv", co.company.id, note));
});
test.afterAll(async () => {
  await closeDb();
});

test("the buyer reconciles a delivery note, settles each line, books it, and sees the new lots", async ({ browser }) => {
  const page = await signedInPage(browser, co.users.buyer.email, co.password, co.kitchens[0]!.id);
  await page.goto("/purchasing/deliveries");
  await expect(page.getByRole("link", { name: "Deliveries" })).toHaveAttribute("aria-current", "page");
  await page.getByLabel("Supplier", { exact: true }).selectOption({ label: s.supplierName });
  await page.getByLabel("Against order").selectOption({ label: s.orderNumber });
  await page.getByLabel("The supplier's delivery note as CSV").setInputFiles(csvPath);
  await page.getByRole("button", { name: "Read the note" }).click();
  await expect(page).toHaveURL(/\/purchasing\/deliveries\/[0-9a-f-]{36}$/);
  await expect(page.getByRole("heading", { name: `Delivery ${note}` })).toBeVisible();

  const row = (n: number) => page.locator(`tr[data-line="${n}"]`);
  await expect(row(1).getByLabel("Findings")).toContainText("Less than ordered");
  await expect(row(2).getByLabel("Findings")).toContainText("Substitute for the ordered item");
  await expect(row(3).getByLabel("Findings")).toContainText("No lot code");
  await expect(row(4).getByLabel("Findings")).toContainText("Too little life left");
  await expect(page.getByRole("complementary", { name: "Cure caution" })).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/deliveries-1-reconciliation.png", fullPage: true });

  // booking with lines unsettled is refused, naming how many
  await page.getByRole("button", { name: "Book into stock" }).click();
  await expect(page.getByText("4 lines still to decide")).toBeVisible();

  await page.getByRole("button", { name: "Accept line 1" }).click();
  await expect(row(1)).toContainText("Accepted");
  await page.getByRole("button", { name: "Accept line 2" }).click();
  await expect(row(2)).toContainText("Accepted");
  await page.getByRole("button", { name: "Correct line 3" }).click();
  const fix = page.getByRole("form", { name: "Correct line 3" });
  await fix.getByLabel("Lot").fill("SH-4410");
  await fix.getByRole("button", { name: "Save correction" }).click();
  await expect(row(3).getByLabel("Findings")).not.toContainText("No lot code");
  await expect(row(3)).toContainText("SH-4410");
  await page.getByRole("button", { name: "Accept line 3" }).click();
  await expect(row(3)).toContainText("Accepted");
  await page.getByRole("button", { name: "Accept line 4" }).click();
  await expect(row(4)).toContainText("Accepted");
  await expect(page.getByText("Every line is settled.")).toBeVisible();

  await page.getByRole("button", { name: "Book into stock" }).click();
  await expect(page.getByRole("status").filter({ hasText: "Booked into stock." })).toBeVisible();
  await expect(page.getByRole("region", { name: "Booked" })).toBeVisible();
  // 2 x 379.00 over 20 hanks, no freight: 37.9 per hank landed
  await expect(row(2)).toContainText("landed 37.9 per pc");
  await page.screenshot({ path: "tests/e2e/screenshots/deliveries-2-booked.png", fullPage: true });
  const order = await db()("purchase_orders").where({ id: s.orderId }).first();
  expect(order.status).toBe("partly_received");

  // the stock grid of the kitchen shows the new lots
  await page.getByRole("link", { name: "Open the stock grid" }).click();
  await expect(page).toHaveURL(/\/stock$/);
  const hogRow = `item:${s.items.hog.id}`;
  await expect(gridCell(page, hogRow, "item")).toBeVisible();
  await gridCell(page, hogRow, "item").getByRole("button", { name: `Show lots of ${s.items.hog.sku}` }).click();
  await expect(page.locator(`.ag-row[row-id^="lot:${s.items.hog.id}:"] [col-id="item"]`)).toContainText("Lot HG-6002");
  const sheepRow = `item:${s.items.sheep.id}`;
  await gridCell(page, sheepRow, "item").getByRole("button", { name: `Show lots of ${s.items.sheep.sku}` }).click();
  await expect(page.locator(`.ag-row[row-id^="lot:${s.items.sheep.id}:"] [col-id="item"]`)).toContainText("Lot SH-4410");
  const cureRow = `item:${s.items.cure.id}`;
  await gridCell(page, cureRow, "item").getByRole("button", { name: `Show lots of ${s.items.cure.sku}` }).click();
  await expect(page.locator(`.ag-row[row-id^="lot:${s.items.cure.id}:"] [col-id="item"]`)).toContainText("Lot CU-3005");
  await page.screenshot({ path: "tests/e2e/screenshots/deliveries-3-stock-grid.png", fullPage: true });
});
