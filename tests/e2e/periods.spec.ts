// Story: the month is over and its stock figures are final. The accountant opens Reports > Periods,
// finds last month open (the company's first movements are in it), presses Close, reads what
// closing means, confirms, and sees the month closed by them and the close on the audit trail; an
// accountant is offered no Reopen. A manager's back-dated receipt into that month is then refused
// with PERIOD_CLOSED. The admin reopens the month: without a reason the page asks for one; with
// one, the month is open again and the reason is on the trail. A test company (never the demo
// data); no serious or critical axe findings; screenshots at 1024 x 768.
import { expect, test } from "@playwright/test";
import { closeDb, db } from "../../db/client";
import { addMonths, monthLabel } from "../../lib/periods/months";
import { createCompany, type TestCompany } from "../support/factory";
import { createItem, type TestItem } from "../support/stock";
import { seriousViolations, signedInPage } from "./support";

let co: TestCompany;
let pepper: TestItem;
let last: string;

test.beforeAll(async ({ browser }) => {
  co = await createCompany({ kitchens: 1 });
  pepper = await createItem(co.company.id, { category: "spice" });
  const r = await db().raw<{ rows: { m: string }[] }>("select to_char(now() at time zone time_zone, 'YYYY-MM') as m from companies where id = ?", [co.company.id]);
  last = addMonths(r.rows[0]!.m, -1);
  const manager = await signedInPage(browser, co.users.manager.email, co.password);
  const res = await manager.request.post("/api/movements", {
    data: { kind: "receipt", kitchen: co.kitchens[0]!.code, item: pepper.sku, quantity: "500", unit: "g", lot: { unitCost: "0.03" }, occurredAt: `${last}-15T12:00:00Z` },
  });
  expect(res.status(), await res.text()).toBe(201);
  await manager.context().close();
});
test.afterAll(async () => {
  await closeDb();
});

test("the accountant closes last month; the admin reopens it with a reason", async ({ browser }) => {
  test.setTimeout(90_000);
  const label = monthLabel(last);
  const page = await signedInPage(browser, co.users.accountant.email, co.password);
  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Reports" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Reports" })).toBeVisible();
  await page.getByRole("link", { name: /Periods/ }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Periods" })).toBeVisible();
  await expect(page.getByRole("heading", { name: "No month is closed yet" })).toBeVisible();

  const months = page.getByRole("table", { name: /Months and their status/ });
  const row = months.getByRole("row", { name: new RegExp(`^${label}`) });
  await expect(row).toContainText("Open");
  await row.getByRole("button", { name: `Close ${label}…` }).click();
  const confirm = page.getByRole("group", { name: `Close ${label}?` });
  await expect(confirm).toContainText(`stock movements dated in ${label} or earlier are refused`);
  await page.screenshot({ path: "tests/e2e/screenshots/periods-confirm-1024.png", fullPage: true });
  expect(await seriousViolations(page)).toEqual([]);
  await confirm.getByRole("button", { name: `Close ${label}`, exact: true }).click();

  await expect(page.getByText(`${label} is closed. Movements dated in it are refused from now on.`)).toBeVisible();
  await expect(page.getByRole("heading", { name: `Closed through ${label}` })).toBeVisible();
  await expect(row).toContainText("Closed");
  await expect(row).toContainText(`by ${co.users.accountant.name}`);
  await expect(row.getByRole("button", { name: /Reopen/ })).toHaveCount(0);
  const trail = page.getByRole("table", { name: /Audit trail/ });
  await expect(trail.getByRole("row", { name: new RegExp(label) })).toContainText("Closed");
  await expect(trail).toContainText(co.users.accountant.name);
  // the page fits at 1024: nothing scrolls sideways
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(1024);
  await page.screenshot({ path: "tests/e2e/screenshots/periods-closed-1024.png", fullPage: true });
  expect(await seriousViolations(page)).toEqual([]);
  await page.context().close();

  // a receipt back-dated into the closed month is refused, and says where the correction goes
  const manager = await signedInPage(browser, co.users.manager.email, co.password);
  const refused = await manager.request.post("/api/movements", {
    data: { kind: "receipt", kitchen: co.kitchens[0]!.code, item: pepper.sku, quantity: "100", unit: "g", lot: { unitCost: "0.03" }, occurredAt: `${last}-20T09:00:00Z` },
  });
  expect(refused.status()).toBe(409);
  const body = await refused.json();
  expect(body.error).toMatchObject({ code: "PERIOD_CLOSED", details: { month: last } });
  await manager.context().close();

  // the admin reopens it: a reason first
  const admin = await signedInPage(browser, co.users.admin.email, co.password);
  await admin.goto("/reports/periods");
  const adminRow = admin.getByRole("table", { name: /Months and their status/ }).getByRole("row", { name: new RegExp(`^${label}`) });
  await adminRow.getByRole("button", { name: `Reopen ${label}…` }).click();
  await admin.getByRole("button", { name: `Reopen ${label}`, exact: true }).click();
  await expect(admin.getByText("Say why the month is reopened")).toBeVisible();
  await admin.getByLabel("Why reopen it?").fill("Supplier credit note for a delivery booked late");
  await admin.screenshot({ path: "tests/e2e/screenshots/periods-reopen-1024.png", fullPage: true });
  await admin.getByRole("button", { name: `Reopen ${label}`, exact: true }).click();
  await expect(admin.getByText(`${label} is open again.`)).toBeVisible();
  await expect(admin.getByRole("heading", { name: "No month is closed yet" })).toBeVisible();
  await expect(admin.getByRole("table", { name: /Audit trail/ })).toContainText("Supplier credit note for a delivery booked late");
  expect(await seriousViolations(admin)).toEqual([]);
});
