// Story: a kitchen lead types counts, par levels and reorder points in the unit at hand ("2.5 lb",
// "250 yd" of hog casing) instead of the item's stock unit; the grid shows the exact conversion,
// posts the count in the typed unit (the server converts and keeps what was typed) and saves levels
// in the stock unit. A unit of another dimension is refused in the cell, naming the units the item
// takes, and nothing is saved.
import { expect, test } from "@playwright/test";
import { closeDb } from "../../db/client";
import { gridCell, seriousViolations, signedInPage } from "./support";
import { createCompany, type TestCompany } from "../support/factory";
import { createItem, type TestItem } from "../support/stock";

let co: TestCompany;
let pepper: TestItem;
let casing: TestItem;
const cell = gridCell;

test.beforeAll(async ({ browser }) => {
  co = await createCompany({ kitchens: 1 });
  pepper = await createItem(co.company.id, { category: "spice" });
  casing = await createItem(co.company.id, { category: "casing" });
  const manager = await signedInPage(browser, co.users.manager.email, co.password);
  for (const r of [
    { item: pepper.sku, quantity: "500", unit: "g", lot: { unitCost: "0.03" } },
    { item: casing.sku, quantity: "3", unit: "hank", lot: { unitCost: "28.50" } },
  ]) {
    const res = await manager.request.post("/api/movements", { data: { kind: "receipt", kitchen: co.kitchens[0]!.code, supplier: "Brine & Co", ...r } });
    expect(res.status(), await res.text()).toBe(201);
  }
  await manager.context().close();
});
test.afterAll(async () => {
  await closeDb();
});

test("counts typed in pounds and yards are converted exactly; litres for a spice are refused in the cell", async ({ browser }) => {
  test.setTimeout(90_000);
  const kitchen = co.kitchens[0]!;
  const lead = await signedInPage(browser, co.users.kitchen_lead.email, co.password);
  const pepperRow = `item:${pepper.id}`;
  const casingRow = `item:${casing.id}`;
  await expect(cell(lead, pepperRow, "onHand")).toContainText("500 g");

  // a count in pounds: the conversion shows under the box while typing
  await cell(lead, pepperRow, "counted").click();
  const editor = lead.getByRole("textbox", { name: `Counted for ${pepper.sku}, in g` });
  await expect(editor).toBeFocused();
  await lead.keyboard.type("2.5 lb");
  await expect(lead.getByText("2.5 lb = 1133.980925 g")).toBeVisible();
  await lead.keyboard.press("Enter");
  await expect(editor).toBeHidden();
  await expect(cell(lead, pepperRow, "counted")).toContainText("2.5 lb");
  await expect(cell(lead, pepperRow, "counted")).toContainText("+634 g");

  // a unit of another dimension: refused in the cell, the editor stays open, nothing changes
  await cell(lead, pepperRow, "counted").click();
  await expect(editor).toBeFocused();
  await expect(editor).toHaveValue("2.5 lb");
  await lead.keyboard.press("Control+a");
  await lead.keyboard.type("2 l");
  await lead.keyboard.press("Enter");
  const refusal = lead.getByRole("alert").filter({ hasText: '"l" is a volume unit' });
  await expect(refusal).toContainText("Counted not changed");
  await expect(refusal).toContainText("counted in g (weight): use g, mg, kg, oz or lb.");
  await expect(editor).toBeVisible();
  await expect(editor).toHaveAttribute("aria-invalid", "true");
  expect(await seriousViolations(lead)).toEqual([]);
  await lead.screenshot({ path: "tests/e2e/screenshots/stock-units-refused.png" });
  await lead.keyboard.press("Escape");
  await expect(editor).toBeHidden();
  await expect(refusal).toBeHidden();
  await expect(cell(lead, pepperRow, "counted")).toContainText("2.5 lb");

  // leaving the cell with a wrong unit (a click elsewhere) is refused above the grid too
  await cell(lead, pepperRow, "counted").click();
  await lead.keyboard.press("Control+a");
  await lead.keyboard.type("3 m");
  await cell(lead, pepperRow, "onHand").click();
  await expect(lead.getByRole("alert").filter({ hasText: `Counted for ${pepper.sku} not changed` })).toContainText('"m" is a length unit');
  await expect(cell(lead, pepperRow, "counted")).toContainText("2.5 lb");

  // hog casing counted by length: 250 yd of a 100 yd hank is 2.5 hanks
  await cell(lead, casingRow, "counted").click();
  await lead.keyboard.type("250 yd");
  await expect(lead.getByText("250 yd = 2.5 hanks")).toBeVisible();
  await lead.keyboard.press("Enter");
  await expect(cell(lead, casingRow, "counted")).toContainText("250 yd");
  await expect(cell(lead, casingRow, "counted")).toContainText("−0.5 hanks");

  await lead.getByRole("button", { name: "Post count" }).click();
  await expect(lead.getByRole("status").filter({ hasText: "Count posted: 2 lines, 2 differences." })).toBeVisible();
  await expect(cell(lead, pepperRow, "onHand")).toContainText("1.134 kg");
  await expect(cell(lead, casingRow, "onHand")).toContainText("2.5 hanks");
  await expect(cell(lead, casingRow, "onHand")).toContainText("228.6 m");

  // exact in the books, and the ledger keeps what was typed (the server did the conversion)
  const stock = (await (await lead.request.get(`/api/stock?kitchen=${kitchen.code}`)).json()) as { rows: { itemId: string; onHand: string }[] };
  expect(stock.rows.find((r) => r.itemId === pepper.id)?.onHand).toBe("1133.980925");
  expect(stock.rows.find((r) => r.itemId === casing.id)?.onHand).toBe("2.5");
  const moves = (await (await lead.request.get(`/api/movements?kitchen=${kitchen.code}&item=${pepper.id}&kind=count`)).json()) as {
    movements: { counted: string; enteredQuantity: string; enteredUnit: string }[];
  };
  expect(moves.movements[0]).toMatchObject({ counted: "1133.980925", enteredQuantity: "2.5", enteredUnit: "lb" });
  await lead.context().close();
});

test("par level and reorder point typed with a unit are saved in the stock unit; another dimension saves nothing", async ({ browser }) => {
  const kitchen = co.kitchens[0]!;
  const lead = await signedInPage(browser, co.users.kitchen_lead.email, co.password);
  const pepperRow = `item:${pepper.id}`;
  const casingRow = `item:${casing.id}`;
  await expect(cell(lead, pepperRow, "parLevel")).toContainText("not set");

  await cell(lead, pepperRow, "parLevel").click();
  await lead.keyboard.type("2 lb");
  await lead.keyboard.press("Enter");
  await expect(lead.getByRole("status").filter({ hasText: `Par level of ${pepper.sku} saved: 907.18474 g.` })).toBeVisible();
  await expect(cell(lead, pepperRow, "parLevel")).toContainText("907.2 g");

  const reorder = lead.getByRole("textbox", { name: `Reorder point for ${pepper.sku}, in g` });
  await cell(lead, pepperRow, "reorderPoint").click();
  await lead.keyboard.type("300 ml");
  await lead.keyboard.press("Enter");
  await expect(lead.getByRole("alert").filter({ hasText: '"ml" is a volume unit' })).toContainText("Reorder point not changed");
  await expect(reorder).toHaveAttribute("aria-invalid", "true");
  await lead.keyboard.press("Escape");
  await expect(cell(lead, pepperRow, "reorderPoint")).toContainText("not set");

  await cell(lead, pepperRow, "reorderPoint").click();
  await lead.keyboard.type("8 oz");
  await lead.keyboard.press("Enter");
  await expect(lead.getByRole("status").filter({ hasText: `Reorder point of ${pepper.sku} saved: 226.796185 g.` })).toBeVisible();

  // a casing's par level by length: 100 yd is one hank
  await cell(lead, casingRow, "parLevel").click();
  await lead.keyboard.type("100 yd");
  await lead.keyboard.press("Enter");
  await expect(lead.getByRole("status").filter({ hasText: `Par level of ${casing.sku} saved: 1 hank.` })).toBeVisible();

  const stock = (await (await lead.request.get(`/api/stock?kitchen=${kitchen.code}`)).json()) as { rows: { itemId: string; parLevel: string | null; reorderPoint: string | null }[] };
  expect(stock.rows.find((r) => r.itemId === pepper.id)).toMatchObject({ parLevel: "907.18474", reorderPoint: "226.796185" });
  expect(stock.rows.find((r) => r.itemId === casing.id)).toMatchObject({ parLevel: "1", reorderPoint: null });
  await lead.reload();
  await expect(cell(lead, pepperRow, "parLevel")).toContainText("907.2 g");
  await expect(cell(lead, pepperRow, "reorderPoint")).toContainText("226.8 g");
  await lead.screenshot({ path: "tests/e2e/screenshots/stock-units-levels.png" });
  await lead.context().close();
});
