// Story: the demo manager signs in and lands on the Overview, where the cure getting close to its
// date is listed with its days left and the cure caution, beside next week's shortages, what to
// reorder, stock value by kitchen and the usage chart with its figures. No serious or critical axe
// findings; screenshots at 1280 and 1024 px wide, and no sideways scrolling at 1024.
//
// This story is about the demo as a manager first sees it, so, unlike the other stories, it uses
// the demo company: the real seed (db/seeds/load-demo.ts, run as `npm run seed` runs it) loads its
// six months of stock into the test database. The seed creates the demo companies only in an empty
// database, so when other stories ran first the demo company, kitchens and users are written here
// from db/seeds/demo-data.ts and the seed fills them. The lots the page must show are read from the
// database (dates relative to today, in the company's time zone), not assumed.
import { execFile } from "node:child_process";
import { promisify } from "node:util";
import { expect, test, type Page } from "@playwright/test";
import { closeDb, db } from "../../db/client";
import { DEMO_COMPANIES, DEMO_PASSWORD } from "../../db/seeds/demo-data";
import { hashPassword } from "../../lib/auth/password";
import { seriousViolations, signIn } from "./support";

const exec = promisify(execFile);
const demo = DEMO_COMPANIES[0]!;
const manager = demo.users.find((u) => u.role === "manager")!;

interface CureLot { code: string; kitchen: string; daysLeft: number }
let soon: CureLot;
let expired: CureLot | undefined;
/** the demo company's cost formula in the page's words */
let costWords: string;

async function demoCompany(): Promise<{ id: string; cost_formula: "fifo" | "average" } | undefined> {
  return db()("companies as c")
    .where("c.name", demo.name)
    .whereExists(db()("app_users as u").whereRaw("u.company_id = c.id").where("u.email", manager.email))
    .first("c.id", "c.cost_formula");
}

/** The demo company, kitchens and users as load-demo.ts writes them (only when they are not there). */
async function writeDemoCompany(): Promise<void> {
  const hash = await hashPassword(DEMO_PASSWORD);
  await db().transaction(async (trx) => {
    const [company] = await trx("companies").insert({ name: demo.name, time_zone: demo.timeZone, currency: demo.currency }).returning<{ id: string }[]>("id");
    const kitchens = await trx("kitchens")
      .insert(demo.kitchens.map((k) => ({ company_id: company!.id, code: k.code, name: k.name, address: k.address, time_zone: k.timeZone })))
      .returning<{ id: string; code: string }[]>(["id", "code"]);
    for (const u of demo.users) {
      const [user] = await trx("app_users").insert({ company_id: company!.id, email: u.email, name: u.name, role: u.role, password_hash: hash }).returning<{ id: string }[]>("id");
      const ids = kitchens.filter((k) => u.kitchens.includes(k.code)).map((k) => k.id);
      if (ids.length) await trx("user_kitchens").insert(ids.map((kitchen_id) => ({ company_id: company!.id, user_id: user!.id, kitchen_id })));
    }
  });
}

/** Cure lots with stock in the demo's open kitchens, days left counted by PostgreSQL on the company's date. */
async function cureLots(companyId: string): Promise<CureLot[]> {
  const r = await db().raw<{ rows: { code: string; kitchen: string; days_left: number }[] }>(
    `select l.code, k.name as kitchen, (l.date - (now() at time zone c.time_zone)::date) as days_left
       from stock_balances b join lots l on l.id = b.lot_id join items i on i.id = b.item_id
       join kitchens k on k.id = b.kitchen_id join companies c on c.id = b.company_id
      where b.company_id = ? and b.on_hand > 0 and i.category = 'cure' and l.date is not null and k.archived_at is null
      order by l.date, l.code`,
    [companyId],
  );
  return r.rows.map((x) => ({ code: x.code, kitchen: x.kitchen, daysLeft: Number(x.days_left) }));
}

const daysText = (n: number) => (n === 1 ? "1 day" : `${n} days`);

async function noSidewaysScroll(page: Page) {
  const { scroll, client } = await page.evaluate(() => ({ scroll: document.documentElement.scrollWidth, client: document.documentElement.clientWidth }));
  expect(scroll, "the page scrolls sideways").toBeLessThanOrEqual(client);
}

test.beforeAll(async () => {
  test.setTimeout(300_000);
  if (!(await demoCompany())) {
    if (await db()("companies").first("id")) await writeDemoCompany();
    // the seed as `npm run seed` runs it: creates the demo companies in an empty database, then fills the demo company
    await exec(process.execPath, ["--conditions=react-server", "--import", "tsx", "db/seeds/load-demo.ts"], { env: process.env, timeout: 280_000 });
  }
  const company = await demoCompany();
  expect(company, "the demo company is loaded").toBeTruthy();
  costWords = company!.cost_formula === "fifo" ? "FIFO cost" : "moving average cost";
  const lots = await cureLots(company!.id);
  // the demo has cure within 60 days of today (the default cure warning window) and one past its date
  soon = lots.find((l) => l.daysLeft > 0 && l.daysLeft <= 60)!;
  expect(soon, JSON.stringify(lots)).toBeTruthy();
  expired = lots.find((l) => l.daysLeft < 0);
});
test.afterAll(async () => {
  await closeDb();
});

test("the manager signs in and sees cure expiring soon on the Overview", async ({ browser }) => {
  const page = await (await browser.newContext({ viewport: { width: 1280, height: 900 } })).newPage();
  await signIn(page, manager.email, DEMO_PASSWORD);
  await expect(page).toHaveURL(/\/overview$/);
  await expect(page.getByRole("heading", { level: 1, name: "Overview" })).toBeVisible();
  await expect(page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Overview" })).toHaveAttribute("aria-current", "page");

  const cure = page.getByRole("region", { name: "Cure expiring soon" });
  const row = cure.getByRole("row").filter({ hasText: `lot ${soon.code}` }).filter({ hasText: soon.kitchen });
  await expect(row).toBeVisible();
  await expect(row).toContainText(`${daysText(soon.daysLeft)} left`);
  await expect(row).toContainText("Cure");
  await expect(cure.getByRole("complementary", { name: "Cure caution" })).toContainText("Curing salt is toxic in overdose");
  if (expired) {
    await expect(cure.getByRole("row").filter({ hasText: `lot ${expired.code}` }).first()).toContainText(`Expired ${daysText(-expired.daysLeft)} ago`);
  }
  // the page and every money heading name the company's cost formula
  await expect(page.getByText(`Money here is at ${costWords}, the company’s cost formula`)).toBeVisible();
  await expect(cure.getByRole("columnheader", { name: new RegExp(`^Value\\s*at ${costWords}$`) })).toBeVisible();
  await expect(page.getByRole("region", { name: "Stock value by kitchen" }).getByRole("columnheader", { name: new RegExp(`^Value\\s*at ${costWords}$`) })).toBeVisible();
  await expect(page.getByRole("region", { name: "Stock value by kitchen" }).getByRole("row", { name: /^Total/ })).toBeVisible();
  for (const k of demo.kitchens) await expect(page.getByRole("region", { name: "Stock value by kitchen" })).toContainText(k.name);
  await expect(page.getByRole("region", { name: "Next week's shortages" })).toBeVisible();
  await expect(page.getByRole("region", { name: "Below the reorder point" })).toBeVisible();
  const usage = page.getByRole("region", { name: "Usage by month" });
  await expect(usage.locator(".recharts-wrapper")).toBeVisible();
  await expect(usage.locator(".recharts-bar-rectangle").first()).toBeVisible();
  await expect(usage.getByRole("table", { name: /Usage by month and category/ }).getByRole("row")).toHaveCount(7);

  expect(await seriousViolations(page)).toEqual([]);
  await noSidewaysScroll(page);
  await page.screenshot({ path: "tests/e2e/screenshots/dashboard-1280.png", fullPage: true });

  await page.setViewportSize({ width: 1024, height: 768 });
  await expect(row).toBeVisible();
  await noSidewaysScroll(page);
  await page.screenshot({ path: "tests/e2e/screenshots/dashboard-1024.png", fullPage: true });

  // "/" brings a manager back here; other roles keep Stock as their first page
  await page.goto("/");
  await expect(page).toHaveURL(/\/overview$/);
});
