// Story: alert e-mail. The manager opens Your account and moves her daily digest to 06:00. A cure
// lot is 5 days from its date. The admin opens Settings > Jobs and runs the expiry check now, which
// sends what it finds as if every digest hour had come; on Settings > Captured mail the admin finds
// the manager's digest, naming the lot with its days left, linking into the product and carrying
// the cure caution; the accountant (no alerts) got nothing. A test company; screenshots kept.
import { expect, test } from "@playwright/test";
import { closeDb, db } from "../../db/client";
import { CURE_CAUTION } from "../../lib/cure/caution";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { createItem } from "../support/stock";
import { seriousViolations, signedInPage } from "./support";

let co: TestCompany;
let lotCode: string;
const inDays = (n: number) => new Date(Date.now() + n * 24 * 3600_000).toISOString().slice(0, 10);

test.beforeAll(async ({ browser }) => {
  co = await createCompany({ kitchens: 1 });
  // everyone has had today's digest already: only "Run now" can send one in this story
  await db()("app_users").where({ company_id: co.company.id }).update({ alert_last_digest_at: new Date() });
  const cure = await createItem(co.company.id, { category: "cure", trackLots: true, trackDates: true });
  lotCode = `C-${tag()}`;
  const admin = await signedInPage(browser, co.users.admin.email, co.password);
  const receipt = await admin.request.post("/api/movements", {
    data: { kind: "receipt", kitchen: co.kitchens[0]!.code, item: cure.sku, quantity: "750", unit: "g", lot: { code: lotCode, date: inDays(5), dateKind: "use_by", unitCost: "0.01" } },
  });
  expect(receipt.status(), await receipt.text()).toBe(201);
  await admin.context().close();
});
test.afterAll(async () => {
  await closeDb();
});

test("the manager chooses her digest hour; the admin runs the check now and finds her digest in the captured mail", async ({ browser }) => {
  test.setTimeout(90_000);
  const manager = await signedInPage(browser, co.users.manager.email, co.password);
  await manager.goto("/account");
  const form = manager.getByRole("form", { name: "Alert e-mail" });
  await expect(form.getByRole("radio", { name: /A daily digest/ })).toBeChecked();
  await expect(form.getByRole("checkbox", { name: /Short for planned batches/ })).toBeChecked(); // a manager's defaults: all three
  await form.getByLabel("Digest hour").selectOption("6");
  await form.getByRole("button", { name: "Save alert e-mail" }).click();
  await expect(manager.getByText("Your alert e-mail settings are saved.")).toBeVisible();
  await expect(form.getByLabel("Digest hour")).toHaveValue("6"); // the form shows what was saved
  expect(await seriousViolations(manager)).toEqual([]);
  await manager.screenshot({ path: "tests/e2e/screenshots/account-alert-email.png", fullPage: true });
  await manager.reload();
  await expect(manager.getByLabel("Digest hour")).toHaveValue("6");
  expect((await db()("app_users").where({ id: co.users.manager.id }).first()).alert_digest_hour).toBe(6);

  const admin = await signedInPage(browser, co.users.admin.email, co.password);
  await admin.goto("/settings/jobs");
  await admin.getByRole("button", { name: /Run now: .*date/i }).click();
  // the page shows the run arrive, with what it found
  await expect(admin.getByText(/just now: 1 new alert\b/)).toBeVisible({ timeout: 20_000 });
  await admin.goto("/settings/mail");
  const subject = `${co.company.name}: 1 alert in today's digest`;
  const message = admin.getByRole("listitem").filter({ hasText: `To ${co.users.manager.email}` }).filter({ has: admin.getByRole("heading", { name: subject }) });
  await expect(async () => {
    await admin.reload();
    await expect(message).toBeVisible({ timeout: 1000 });
  }).toPass({ timeout: 30_000 });
  await message.getByText("Show message").click();
  await expect(message).toContainText(`lot ${lotCode}: 5 days left`);
  await expect(message).toContainText("(7-day warning)");
  await expect(message).toContainText(CURE_CAUTION);
  await expect(message.getByRole("link", { name: /\/alerts$/ }).first()).toBeVisible();
  await admin.screenshot({ path: "tests/e2e/screenshots/captured-digest.png", fullPage: true });
  // the accountant sees no alerts, so none was sent to them
  await expect(admin.getByText(`To ${co.users.accountant.email}`)).toHaveCount(0);
});
