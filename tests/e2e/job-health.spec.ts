// Story: a company two days old whose morning expiry check has never run (the worker started
// before it existed). Its admin sees "Alerts delayed" in the header, opens Settings > Jobs, finds
// the expiry scan "Not run yet" with its next run at 05:00, presses "Run now" and sees the page say
// it is queued, then the last run arrive with what it found: a casing lot 6 days from its date has
// crossed the 30- and 7-day windows (the product's defaults, issue 6), so its most urgent one: "1 new alert, 1 lot checked".
// Back on another page the header no longer says alerts are delayed. Then a scan job of the company
// fails (a scan the worker does not know: unrecoverable) and shows with its reason; Retry queues it
// again. Finally Redis stops answering (CLIENT PAUSE, a real outage of a few seconds): the stock
// page still opens, the header says alerts are delayed, the Jobs page says the queue is not
// answering and still shows the last run. A test company (the suites never use the demo data); no
// serious or critical axe findings; screenshots at 1024 and 1280.
import { expect, test } from "@playwright/test";
import { closeDb, db } from "../../db/client";
import { syncScanSchedulers } from "../../jobs/definitions/scans";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { createItem } from "../support/stock";
import { Queue } from "bullmq";
import { Redis } from "ioredis";
import { SCANS_QUEUE } from "../../jobs/queues";
import { seriousViolations, signedInPage } from "./support";

let co: TestCompany;
const inDays = (n: number) => new Date(Date.now() + n * 24 * 3600_000).toISOString().slice(0, 10);

test.beforeAll(async ({ browser }) => {
  co = await createCompany({ kitchens: 1 });
  await db()("companies").where({ id: co.company.id }).update({ created_at: new Date(Date.now() - 48 * 3600_000) });
  const casing = await createItem(co.company.id, { category: "casing", trackLots: true, trackDates: true });
  const admin = await signedInPage(browser, co.users.admin.email, co.password);
  const receipt = await admin.request.post("/api/movements", {
    data: { kind: "receipt", kitchen: co.kitchens[0]!.code, item: casing.sku, quantity: "3", unit: "pc", lot: { code: `L-${tag()}`, date: inDays(6), dateKind: "best_before", unitCost: "1" } },
  });
  expect(receipt.status(), await receipt.text()).toBe(201);
  await admin.context().close();
  // what the worker does every hour: the new company gets its schedulers (so a next run is known)
  const queue = new Queue(SCANS_QUEUE, { connection: new Redis(process.env.REDIS_URL!, { maxRetriesPerRequest: null }) });
  await syncScanSchedulers(db(), queue);
  await queue.close();
});
test.afterAll(async () => {
  await closeDb();
});

test("the admin runs the expiry scan now and sees its last run arrive", async ({ browser }) => {
  test.setTimeout(90_000);
  const page = await signedInPage(browser, co.users.admin.email, co.password);
  const header = page.getByRole("banner");
  const delayed = header.getByRole("link", { name: /Alerts are delayed: the morning check/ });
  await expect(delayed).toBeVisible();
  // the header stays on one line with the notice in it: at 1024 px the clock, from 1280 px its words too
  expect((await header.boundingBox())!.height).toBeLessThanOrEqual(72);
  await page.screenshot({ path: "tests/e2e/screenshots/job-health-header-1024.png", clip: { x: 0, y: 0, width: 1024, height: 120 } });
  await page.setViewportSize({ width: 1280, height: 800 });
  await expect(delayed).toContainText("Alerts delayed");
  expect((await header.boundingBox())!.height).toBeLessThanOrEqual(72);
  await page.screenshot({ path: "tests/e2e/screenshots/job-health-header-1280.png", clip: { x: 0, y: 0, width: 1280, height: 120 } });
  await page.setViewportSize({ width: 1024, height: 768 });

  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Settings" }).click();
  await page.getByRole("navigation", { name: "Settings" }).getByRole("link", { name: "Jobs" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Jobs" })).toBeVisible();

  const scans = page.getByRole("table", { name: "Scans" });
  const row = scans.getByRole("row").filter({ hasText: "expiry-scan" });
  await expect(row).toContainText("Every day at 05:00");
  await expect(row).toContainText("Europe/London");
  await expect(row.getByTestId("last-run-expiry-scan")).toHaveText("Not run yet");
  await expect(row.getByRole("cell").nth(2)).toContainText(/3 Dec|05:00/); // the next run, from the company's scheduler
  await expect(row.getByRole("cell").nth(2)).toContainText("05:00");
  await expect(page.getByText("No failed jobs.")).toBeVisible();
  await expect(page.getByRole("table", { name: "Queues, installation-wide" }).getByRole("row").filter({ hasText: "Alert scans" })).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/job-health-1024.png", fullPage: true });

  await row.getByRole("button", { name: /Run now/ }).click();
  await expect(page.getByRole("status").filter({ hasText: "queued — results arrive within seconds" })).toBeVisible();
  await expect(row.getByTestId("last-run-expiry-scan")).toContainText("1 new alert, 1 lot checked", { timeout: 15_000 });
  await expect(row.getByTestId("last-run-expiry-scan")).toContainText("just now");
  await expect(page.getByRole("status").filter({ hasText: "ran" })).toContainText("1 new alert");
  await expect(row.getByRole("button", { name: /Run now/ })).toBeEnabled();
  const run = await db()("job_runs").where({ company_id: co.company.id, job: "expiry-scan" }).first();
  expect(run.last_result).toMatchObject({ status: "done", created: 1, lotsChecked: 1 });
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/job-health-ran-1024.png", fullPage: true });

  // the check ran: the header no longer says alerts are delayed
  await page.reload();
  await expect(page.getByRole("heading", { level: 1, name: "Jobs" })).toBeVisible();
  await expect(header.getByRole("link", { name: /Alerts are delayed/ })).toHaveCount(0);

  await page.setViewportSize({ width: 1280, height: 800 });
  await page.screenshot({ path: "tests/e2e/screenshots/job-health-1280.png", fullPage: true });
});

test("a failed job shows with its reason and is retried; while Redis does not answer, stock works and the page says so", async ({ browser }) => {
  test.setTimeout(90_000);
  const url = process.env.REDIS_URL!;
  const queue = new Queue(SCANS_QUEUE, { connection: new Redis(url, { maxRetriesPerRequest: null }) });
  const job = await queue.add("tidy-the-larder", { companyId: co.company.id }, { jobId: `e2e-fail-${tag()}`, attempts: 1 });
  await expect.poll(() => job.getState(), { timeout: 15_000 }).toBe("failed");
  await queue.close();

  const page = await signedInPage(browser, co.users.admin.email, co.password);
  await page.goto("/settings/jobs");
  const failed = page.getByRole("table", { name: "Failed jobs" }).getByRole("row").filter({ hasText: job.id! });
  await expect(failed).toContainText("Unknown scan job tidy-the-larder");
  await expect(failed.getByRole("cell").nth(1)).toHaveText("1"); // attempts
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/job-health-failed-1024.png", fullPage: true });
  await failed.getByRole("button", { name: /Retry/ }).click();
  await expect(page.getByRole("status").filter({ hasText: "tidy-the-larder: queued again." })).toBeVisible();

  // Redis stops answering every client for 8 s (nothing is lost: it is paused, not stopped)
  const admin = new Redis(url);
  await admin.call("CLIENT", "PAUSE", "8000", "ALL");
  admin.disconnect();
  const t0 = Date.now();
  await page.goto("/stock");
  await expect(page.getByRole("heading", { level: 1, name: /Stock/ })).toBeVisible();
  expect(Date.now() - t0).toBeLessThan(3000);
  await expect(page.getByRole("banner").getByRole("link", { name: "Alerts are delayed: the job queue is not answering" })).toBeVisible();

  await page.goto("/settings/jobs");
  await expect(page.getByRole("alert").filter({ hasText: "The job queue is not answering, so alerts are delayed." })).toBeVisible();
  const row = page.getByRole("table", { name: "Scans" }).getByRole("row").filter({ hasText: "expiry-scan" });
  await expect(row.getByTestId("last-run-expiry-scan")).toContainText("1 new alert, 1 lot checked"); // from the database
  await expect(row).toContainText("Unknown while the queue is down");
  await expect(row.getByRole("button", { name: /Run now/ })).toBeDisabled();
  await expect(page.getByText("Not known while the queue is down.").first()).toBeVisible();
  await page.screenshot({ path: "tests/e2e/screenshots/job-health-down-1024.png", fullPage: true });

  // back: the page answers with the queues again (the shell remembers a "down" for 5 s)
  await expect(async () => {
    await page.reload();
    await expect(page.getByRole("table", { name: "Queues, installation-wide" })).toBeVisible({ timeout: 1000 });
    await expect(page.getByRole("banner").getByRole("link", { name: /Alerts are delayed/ })).toHaveCount(0, { timeout: 1000 });
  }).toPass({ timeout: 30_000 });
});
