// Stories: a manager records waste of a spice from the grid's Record sheet and sees on hand drop;
// a kitchen lead asks another kitchen for stock on the transfers page, that kitchen's lead fulfils
// it, and the asking kitchen's stock shows it. No serious accessibility problems on the transfers
// page or the open sheets; a 1024 x 768 screenshot of the transfers page is kept for review.
import { expect, test, type Browser, type Page } from "@playwright/test";
import { closeDb } from "../../db/client";
import { gridCell, seriousViolations, signedInPage } from "./support";
import { createCompany, createUser, type TestCompany, type TestUser } from "../support/factory";
import { createItem, type TestItem } from "../support/stock";

let co: TestCompany;
let pepper: TestItem;
let paprika: TestItem;
let lead2: TestUser;

test.beforeAll(async ({ browser }) => {
  co = await createCompany({ kitchens: 2 });
  const [k1, k2] = [co.kitchens[0]!, co.kitchens[1]!];
  lead2 = await createUser(co.company.id, "kitchen_lead", { kitchenIds: [k2.id] });
  pepper = await createItem(co.company.id, { category: "spice" });
  paprika = await createItem(co.company.id, { category: "spice" });
  const manager = await signedInPage(browser, co.users.manager.email, co.password);
  const receipts = [
    { kitchen: k1.code, item: pepper.sku, quantity: "500", unit: "g", lot: { unitCost: "0.03" } },
    { kitchen: k2.code, item: paprika.sku, quantity: "300", unit: "g", lot: { unitCost: "0.02" } },
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

  await cell(page, row, "history").getByRole("button", { name: `Record for ${pepper.sku}` }).click();
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
  await cell(page, row, "history").getByRole("button", { name: `History of ${pepper.sku}` }).click();
  const history = page.getByRole("dialog", { name: `History of ${pepper.sku}` });
  await expect(history.getByText("Wasted")).toBeVisible();
  await expect(history.getByText("Damp got into the tub")).toBeVisible();
  await page.context().close();
});

test("a kitchen lead asks another kitchen for stock, its lead fulfils it and the stock arrives", async ({ browser }) => {
  test.setTimeout(120_000);
  const [k1, k2] = [co.kitchens[0]!, co.kitchens[1]!];

  // the asking kitchen's lead
  const asker = await signedInPage(browser, co.users.kitchen_lead.email, co.password);
  await expect(asker.getByRole("heading", { level: 1 })).toContainText(k1.name);
  await asker.getByRole("link", { name: "Transfers" }).click();
  await expect(asker).toHaveURL(/\/stock\/transfers$/);
  await expect(asker.getByRole("heading", { level: 1 })).toContainText(`Transfers · ${k1.name}`);
  await expect(asker.getByText("This kitchen has not asked another for stock yet.")).toBeVisible();

  await asker.getByRole("button", { name: "Ask another kitchen" }).click();
  const ask = asker.getByRole("dialog", { name: "Ask another kitchen" });
  await expect(ask).toBeVisible();
  await ask.getByLabel("Item").selectOption(paprika.id);
  await ask.getByLabel("Quantity").fill("120");
  await ask.getByLabel("Unit").selectOption("g");
  await expect(ask.getByLabel("Kitchen to ask")).toHaveValue(k2.code);
  await ask.getByLabel("Note (optional)").fill("For Saturday's chorizo");
  expect(await seriousViolations(asker)).toEqual([]);
  await ask.getByRole("button", { name: "Send request" }).click();
  await expect(ask).toBeHidden();
  await expect(asker.getByRole("status").filter({ hasText: "Asked" })).toContainText(`120 g of ${paprika.sku}`);
  const mine = asker.getByRole("table", { name: "Requests this kitchen made of other kitchens" });
  await expect(mine.getByRole("row", { name: new RegExp(paprika.sku) })).toContainText("Open");
  expect(await seriousViolations(asker)).toEqual([]);
  await asker.screenshot({ path: "tests/e2e/screenshots/stock-transfers.png" });

  // the sending kitchen's lead fulfils it
  const sender = await signedInPage(browser, lead2.email, co.password);
  await expect(sender.getByRole("heading", { level: 1 })).toContainText(k2.name);
  await sender.goto("/stock/transfers");
  const asked = sender.getByRole("table", { name: "Open requests other kitchens made of this kitchen" });
  const line = asked.getByRole("row", { name: new RegExp(paprika.sku) });
  await expect(line).toContainText("120 g");
  await expect(line).toContainText(k1.name);
  await expect(line).toContainText("For Saturday's chorizo");
  expect(await seriousViolations(sender)).toEqual([]);
  await line.getByRole("button", { name: `Fulfil ${paprika.sku} for ${k1.name}` }).click();
  await expect(sender.getByRole("status").filter({ hasText: "Sent" })).toContainText(`120 g of ${paprika.sku}`);
  await expect(sender.getByText("No open requests from other kitchens.")).toBeVisible();
  await sender.goto("/stock");
  await expect(cell(sender, `item:${paprika.id}`, "onHand")).toContainText("180 g");
  await sender.context().close();

  // the asking kitchen sees it fulfilled, and in its stock
  await asker.reload();
  await expect(mine.getByRole("row", { name: new RegExp(paprika.sku) })).toContainText("Fulfilled");
  await asker.goto("/stock");
  await expect(cell(asker, `item:${paprika.id}`, "onHand")).toContainText("120 g");
  await asker.context().close();
});
