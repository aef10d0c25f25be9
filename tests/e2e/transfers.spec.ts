// Stories of the transfers page (Stock > Transfers), between two kitchens of one company:
// - a kitchen lead asks the other kitchen for a spice; that kitchen's lead declines with a reason,
//   and the asking lead sees the request declined and why;
// - the lead asks for cure; the other kitchen's lead sees which lot first expired first out would
//   send, names a later lot instead, and the asking kitchen then holds exactly that lot.
// No serious accessibility problems on the page or its sheets; 1024 x 768 screenshots of the
// transfers page and the fulfil sheet are kept for review. The stock grid is not used here: the
// receiving kitchen's lots are read from GET /api/stock, as the grid reads them.
import { expect, test, type Page } from "@playwright/test";
import { closeDb } from "../../db/client";
import { seriousViolations, signedInPage } from "./support";
import { createCompany, createUser, type TestCompany, type TestUser } from "../support/factory";
import { createItem, type TestItem } from "../support/stock";

let co: TestCompany;
let paprika: TestItem;
let cure: TestItem;
let lead2: TestUser;

const daysFromToday = (n: number) => new Date(Date.now() + n * 86_400_000).toISOString().slice(0, 10);

test.beforeAll(async ({ browser }) => {
  co = await createCompany({ kitchens: 2 });
  const k2 = co.kitchens[1]!;
  lead2 = await createUser(co.company.id, "kitchen_lead", { kitchenIds: [k2.id] });
  paprika = await createItem(co.company.id, { category: "spice" });
  cure = await createItem(co.company.id, { category: "cure" });
  const manager = await signedInPage(browser, co.users.manager.email, co.password);
  const receipts = [
    { item: paprika.sku, quantity: "300", unit: "g", lot: { unitCost: "0.02" } },
    { item: cure.sku, quantity: "500", unit: "g", lot: { code: "HV-EARLY", date: daysFromToday(20), dateKind: "use_by", unitCost: "0.004" } },
    { item: cure.sku, quantity: "800", unit: "g", lot: { code: "HV-LATE", date: daysFromToday(200), dateKind: "use_by", unitCost: "0.004" } },
    { item: cure.sku, quantity: "100", unit: "g", lot: { code: "HV-PAST", date: daysFromToday(-4), dateKind: "best_before", unitCost: "0.004" } },
  ];
  for (const r of receipts) {
    const res = await manager.request.post("/api/movements", { data: { kind: "receipt", kitchen: k2.code, supplier: "Haverby Curing Supplies", ...r } });
    expect(res.status(), await res.text()).toBe(201);
  }
  await manager.context().close();
});
test.afterAll(async () => {
  await closeDb();
});

/** Asks the other kitchen from the transfers page's sheet. */
async function askFor(page: Page, itemId: string, quantity: string, unit: string, note: string) {
  await page.getByRole("button", { name: "Ask another kitchen" }).click();
  const ask = page.getByRole("dialog", { name: "Ask another kitchen" });
  await expect(ask).toBeVisible();
  await ask.getByLabel("Item").selectOption(itemId);
  await ask.getByLabel("Quantity").fill(quantity);
  await ask.getByLabel("Unit").selectOption(unit);
  await expect(ask.getByLabel("Kitchen to ask")).toHaveValue(co.kitchens[1]!.code);
  await ask.getByLabel("Note (optional)").fill(note);
  return ask;
}

test("a kitchen lead asks another kitchen for stock; its lead declines with a reason the asker sees", async ({ browser }) => {
  test.setTimeout(120_000);
  const [k1, k2] = [co.kitchens[0]!, co.kitchens[1]!];

  // the asking kitchen's lead
  const asker = await signedInPage(browser, co.users.kitchen_lead.email, co.password);
  await expect(asker.getByRole("heading", { level: 1 })).toContainText(k1.name);
  await asker.getByRole("link", { name: "Transfers" }).click();
  await expect(asker).toHaveURL(/\/stock\/transfers$/);
  await expect(asker.getByRole("heading", { level: 1 })).toContainText(`Transfers · ${k1.name}`);
  await expect(asker.getByText("This kitchen has not asked another for stock yet.")).toBeVisible();

  const ask = await askFor(asker, paprika.id, "120", "g", "For Saturday's chorizo");
  expect(await seriousViolations(asker)).toEqual([]);
  await ask.getByRole("button", { name: "Send request" }).click();
  await expect(ask).toBeHidden();
  await expect(asker.getByRole("status").filter({ hasText: "Asked" })).toContainText(`120 g of ${paprika.sku}`);
  const mine = asker.getByRole("table", { name: "Requests this kitchen made of other kitchens" });
  await expect(mine.getByRole("row", { name: new RegExp(paprika.sku) })).toContainText("Open");
  expect(await seriousViolations(asker)).toEqual([]);
  await asker.screenshot({ path: "tests/e2e/screenshots/stock-transfers.png" });

  // the asked kitchen's lead declines, and must say why
  const sender = await signedInPage(browser, lead2.email, co.password);
  await expect(sender.getByRole("heading", { level: 1 })).toContainText(k2.name);
  await sender.goto("/stock/transfers");
  const asked = sender.getByRole("table", { name: "Open requests other kitchens made of this kitchen" });
  const line = asked.getByRole("row", { name: new RegExp(paprika.sku) });
  await expect(line).toContainText("120 g");
  await expect(line).toContainText(k1.name);
  await expect(line).toContainText("For Saturday's chorizo");
  await line.getByRole("button", { name: `Decline ${paprika.sku} for ${k1.name}` }).click();
  const decline = sender.getByRole("dialog", { name: `Decline ${paprika.sku}` });
  await expect(decline).toBeVisible();
  await expect(decline).toContainText(`120 g asked by ${k1.name}`);
  await decline.getByRole("button", { name: "Decline request" }).click();
  await expect(decline.getByText("Say why the request is declined.")).toBeVisible();
  await decline.getByLabel("Reason").fill("Our own chorizo run needs all of it this week");
  expect(await seriousViolations(sender)).toEqual([]);
  await decline.getByRole("button", { name: "Decline request" }).click();
  await expect(decline).toBeHidden();
  await expect(sender.getByRole("status").filter({ hasText: "Declined" })).toContainText(`Declined the request for ${paprika.sku}.`);
  await expect(sender.getByText("No open requests from other kitchens.")).toBeVisible();
  await sender.context().close();

  // the asker sees it declined, with the reason; nothing moved
  await asker.reload();
  const row = mine.getByRole("row", { name: new RegExp(paprika.sku) });
  await expect(row).toContainText("Declined");
  await expect(row).toContainText("Our own chorizo run needs all of it this week");
  const stock = await (await asker.request.get(`/api/stock?kitchen=${encodeURIComponent(k1.code)}`)).json();
  expect(stock.rows.find((r: { sku: string }) => r.sku === paprika.sku).onHand).toBe("0");
  await asker.context().close();
});

test("the sending kitchen names the lot to send instead of the suggested one, and the asking kitchen holds that lot", async ({ browser }) => {
  test.setTimeout(120_000);
  const [k1, k2] = [co.kitchens[0]!, co.kitchens[1]!];

  const asker = await signedInPage(browser, co.users.kitchen_lead.email, co.password);
  await asker.goto("/stock/transfers");
  const ask = await askFor(asker, cure.id, "0.25", "kg", "Bacon cure for Monday");
  await expect(ask.getByLabel("Cure caution")).toBeVisible();
  await ask.getByRole("button", { name: "Send request" }).click();
  await expect(asker.getByRole("status").filter({ hasText: "Asked" })).toContainText(`0.25 kg of ${cure.sku}`);

  const sender = await signedInPage(browser, lead2.email, co.password);
  await sender.goto("/stock/transfers");
  const line = sender.getByRole("table", { name: "Open requests other kitchens made of this kitchen" }).getByRole("row", { name: new RegExp(cure.sku) });
  await line.getByRole("button", { name: `Fulfil ${cure.sku} for ${k1.name}` }).click();
  const sheet = sender.getByRole("dialog", { name: `Fulfil ${cure.sku}` });
  await expect(sheet).toBeVisible();
  await expect(sheet.getByLabel("Cure caution")).toBeVisible();

  // suggested: first expired first out, which takes the earliest lot in date and skips the expired one
  const fefo = sheet.getByRole("radio", { name: /First expired, first out \(suggested\)/ });
  await expect(fefo).toBeChecked();
  await expect(fefo).toHaveAccessibleName(/Takes 250 g from lot HV-EARLY\./);
  await expect(fefo).toHaveAccessibleName(/Expired lots are skipped\./);
  // each lot with stock here: code, date and its kind, days left, available
  await expect(sheet.getByRole("radio", { name: /^Lot HV-EARLY/ })).toHaveAccessibleName(/^Lot HV-EARLY\s*expires soon\s*use by \d+ \w+ \d{4} · (19|20|21) days left\s*500 g available$/);
  await expect(sheet.getByRole("radio", { name: /^Lot HV-LATE/ })).toHaveAccessibleName(/^Lot HV-LATE\s*in date\s*use by \d+ \w+ \d{4} · (199|200|201) days left\s*800 g available$/);
  const past = sheet.getByRole("radio", { name: /^Lot HV-PAST/ });
  await expect(past).toHaveAccessibleName(/^Lot HV-PAST\s*expired\s*best before \d+ \w+ \d{4} · expired (3|4|5) days ago\s*100 g available: less than asked$/);
  await expect(past).toBeDisabled();
  expect(await seriousViolations(sender)).toEqual([]);
  await sender.screenshot({ path: "tests/e2e/screenshots/transfer-fulfil.png" });

  await sheet.getByRole("radio", { name: /^Lot HV-LATE/ }).check();
  await sheet.getByRole("button", { name: `Send to ${k1.name}` }).click();
  await expect(sheet).toBeHidden();
  await expect(sender.getByRole("status").filter({ hasText: "Sent" })).toContainText(`Sent 0.25 kg of ${cure.sku} to ${k1.name} (lot HV-LATE).`);
  await expect(sender.getByText("No open requests from other kitchens.")).toBeVisible();
  await sender.context().close();

  // the asking kitchen: the request fulfilled, and the named lot (only that one) in its stock
  await asker.reload();
  await expect(asker.getByRole("table", { name: "Requests this kitchen made of other kitchens" }).getByRole("row", { name: new RegExp(cure.sku) })).toContainText("Fulfilled");
  const lotsAt = async (code: string) => {
    const res = await asker.request.get(`/api/stock?kitchen=${encodeURIComponent(code)}`);
    expect(res.status()).toBe(200);
    const row = (await res.json()).rows.find((r: { sku: string }) => r.sku === cure.sku);
    return Object.fromEntries(row.lots.map((l: { code: string; onHand: string }) => [l.code, l.onHand]));
  };
  expect(await lotsAt(k1.code)).toEqual({ "HV-LATE": "250" });
  expect(await lotsAt(k2.code)).toEqual({ "HV-PAST": "100", "HV-EARLY": "500", "HV-LATE": "550" });
  await asker.context().close();
});
