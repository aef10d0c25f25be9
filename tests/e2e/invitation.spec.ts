// Story: an admin invites a buyer; the invitation e-mail goes through the outbox, the worker and
// the local mail catcher; the admin reads it on the captured-mail page; the new buyer follows the
// link, chooses a password and lands in the app with a buyer's navigation. The second company's
// admin sees none of it.
import { expect, test, type Browser, type Page } from "@playwright/test";
import { closeDb } from "../../db/client";
import { seriousViolations, signedInPage } from "./support";
import { createCompany, uniqueEmail, type TestCompany } from "../support/factory";

let a: TestCompany;
let b: TestCompany;
test.beforeAll(async () => {
  a = await createCompany({ kitchens: 2, name: `Inviting Larder ${Date.now()}` });
  b = await createCompany({ kitchens: 1 });
});
test.afterAll(async () => {
  await closeDb();
});



test("an invited buyer joins through the e-mailed link; the other company never sees the mail", async ({ browser }) => {
  const invitee = uniqueEmail("new-buyer");
  const admin = await signedInPage(browser, a.users.admin.email, a.password);

  await admin.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Settings" }).click();
  await admin.getByRole("link", { name: "People" }).click();
  await admin.getByRole("button", { name: "Invite someone" }).click();
  const sheet = admin.getByRole("dialog", { name: "Invite someone" });
  await expect(sheet).toBeVisible();
  expect(await seriousViolations(admin)).toEqual([]);
  await sheet.getByLabel("E-mail").fill(invitee);
  await sheet.getByLabel("Name").fill("Nell Brackett");
  await sheet.getByLabel("Role").selectOption("buyer");
  await sheet.getByRole("button", { name: "Send invitation" }).click();
  await expect(admin.getByText(`Invitation sent to ${invitee}.`)).toBeVisible();
  await admin.screenshot({ path: "tests/e2e/screenshots/admin-people.png" });

  // the worker delivers within a few seconds; the page shows what the catcher holds
  await admin.getByRole("link", { name: "Captured mail" }).click();
  await expect(admin.getByRole("heading", { level: 1, name: "Captured mail" })).toBeVisible();
  const subject = `You're invited to ${a.company.name} on Hank & Lot`;
  await expect(async () => {
    await admin.reload();
    await expect(admin.getByRole("heading", { name: subject })).toBeVisible({ timeout: 1000 });
  }).toPass({ timeout: 20_000 });
  expect(await seriousViolations(admin)).toEqual([]);
  await admin.getByText("Show message").first().click();
  const link = await admin.getByRole("link", { name: /\/invitation\// }).first().getAttribute("href");
  expect(link).toMatch(/\/invitation\/[A-Za-z0-9_-]{20,}$/);

  // the second company's admin: neither the page nor the API shows the first company's mail
  const other = await signedInPage(browser, b.users.admin.email, b.password);
  await other.goto("/settings/mail");
  await expect(other.getByRole("heading", { name: "Captured mail" })).toBeVisible();
  await expect(other.getByText(subject)).toHaveCount(0);
  await expect(other.getByText(invitee)).toHaveCount(0);
  const api = await other.request.get("/api/mail/captured");
  expect(api.status()).toBe(200);
  const mails = (await api.json()) as { to: string[]; subject: string }[];
  expect(mails.some((m) => m.to.includes(invitee) || m.subject === subject)).toBe(false);

  // the invitee, in a fresh browser, accepts
  const joiner = await (await browser.newContext()).newPage();
  await joiner.goto(new URL(link!).pathname);
  await expect(joiner.getByText(a.company.name).first()).toBeVisible();
  expect(await seriousViolations(joiner)).toEqual([]);
  await joiner.getByLabel("Choose a password").fill("a-long-new-password");
  await joiner.getByLabel("Password again").fill("a-long-new-password");
  await joiner.getByRole("button", { name: /join|create|accept|set/i }).click();
  await expect(joiner).toHaveURL(/\/stock$/);
  await expect(joiner.getByRole("navigation", { name: "Main" }).getByRole("listitem")).toHaveText(["Overview", "Stock", "Buying"]);

  // the link is single use
  const again = await (await browser.newContext()).newPage();
  await again.goto(new URL(link!).pathname);
  await expect(again.getByText(/already been used/i)).toBeVisible();
});
