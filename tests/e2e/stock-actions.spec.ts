// Story: a manager records waste of a spice from the grid's row menu and sees on hand drop. No
// serious accessibility problems on the open sheet. (Asking another kitchen for stock, declining
// and fulfilling it: transfers.spec.ts.)
import { expect, test } from "@playwright/test";
import { closeDb } from "../../db/client";
import { gridCell, seriousViolations, signedInPage } from "./support";
import { createCompany, type TestCompany } from "../support/factory";
import { createItem, type TestItem } from "../support/stock";

let co: TestCompany;
let pepper: TestItem;

test.beforeAll(async ({ browser }) => {
  co = await createCompany({ kitchens: 2 });
  const k1 = co.kitchens[0]!;
  pepper = await createItem(co.company.id, { category: "spice" });
  const manager = await signedInPage(browser, co.users.manager.email, co.password);
  const receipts = [
    { kitchen: k1.code, item: pepper.sku, quantity: "500", unit: "g", lot: { unitCost: "0.03" } },
  ];
  for (const r of receipts) {
    const res = await manager.request.post("/api/movements", { data: { kind: "receipt", supplier: "Brine & Co", ...r } });
    expect(res.status(), await res.text()).toBe(201);
  }
  await manager.context().close();
});
test.afterAll(async () => {
  await closeDb();
});



const cell = gridCell;

test("a manager records waste of a spice from the grid and on hand drops", async ({ browser }) => {
  test.setTimeout(90_000);
  const k1 = co.kitchens[0]!;
  const page = await signedInPage(browser, co.users.manager.email, co.password, k1.id);
  await expect(page.getByRole("heading", { level: 1 })).toContainText(k1.name);
  const row = `item:${pepper.id}`;
  await expect(cell(page, row, "onHand")).toContainText("500 g");

  // the row's actions button opens a small menu; Record waste opens the record sheet in that mode
  await cell(page, row, "actions").getByRole("button", { name: `Actions for ${pepper.sku}` }).click();
  const menu = page.getByRole("menu", { name: `Actions for ${pepper.sku}` });
  await expect(menu.getByRole("menuitem")).toHaveText(["History", "Record waste", "Record adjustment", "Transfer out"]);
  await menu.getByRole("menuitem", { name: "Record waste" }).click();
  await expect(menu).toBeHidden();
  const sheet = page.getByRole("dialog", { name: `Record for ${pepper.sku}` });
  await expect(sheet).toBeVisible();
  await expect(sheet.getByRole("radio", { name: "Waste" })).toBeChecked();
  expect(await seriousViolations(page)).toEqual([]);

  // waste needs a reason: the server's field message appears beside the field
  await sheet.getByLabel("Quantity").fill("0.1");
  await sheet.getByLabel("Unit").selectOption("kg");
  await sheet.getByRole("button", { name: "Record waste" }).click();
  await expect(sheet.getByText("Say why it was wasted.")).toBeVisible();

  // more than there is: refused with what is available
  await sheet.getByLabel("Quantity").fill("2");
  await sheet.getByLabel("Reason").fill("Damp got into the tub");
  await sheet.getByRole("button", { name: "Record waste" }).click();
  await expect(sheet.getByRole("alert").filter({ hasText: "not enough stock" })).toContainText("500 g available");

  await sheet.getByLabel("Quantity").fill("0.1");
  await sheet.getByRole("button", { name: "Record waste" }).click();
  await expect(sheet).toBeHidden();
  await expect(page.getByRole("status").filter({ hasText: "Waste recorded" })).toContainText(`0.1 kg of ${pepper.sku}`);
  await expect(cell(page, row, "onHand")).toContainText("400 g");

  // the history shows it
  await cell(page, row, "actions").getByRole("button", { name: `Actions for ${pepper.sku}` }).click();
  await menu.getByRole("menuitem", { name: "History" }).click();
  const history = page.getByRole("dialog", { name: `History of ${pepper.sku}` });
  await expect(history.getByText("Wasted")).toBeVisible();
  await expect(history.getByText("Damp got into the tub")).toBeVisible();
  await page.context().close();
});
