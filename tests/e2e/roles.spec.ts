// Story: each person signs in through the page and finds the navigation of their own job.
// Accessibility is checked with axe (no serious or critical violations) on the sign-in page and
// the signed-in shell; a 1024 x 768 screenshot of each role's first page is kept for review.
import { expect, test, type Page } from "@playwright/test";
import { ROLES, type Role } from "../../db/types";
import { createCompany, type TestCompany } from "../support/factory";
import { closeDb } from "../../db/client";
import { seriousViolations, signIn } from "./support";

const NAV: Record<Role, string[]> = {
  admin: ["Overview", "Stock", "Planning", "Buying", "Reports", "Settings"],
  manager: ["Overview", "Stock", "Planning", "Buying", "Reports"],
  buyer: ["Overview", "Stock", "Buying"],
  kitchen_lead: ["Overview", "Stock", "Planning"],
  accountant: ["Overview", "Stock", "Buying", "Reports"],
};

let co: TestCompany;
test.beforeAll(async () => {
  co = await createCompany({ kitchens: 3 });
});
test.afterAll(async () => {
  await closeDb();
});



test("the sign-in page has no serious accessibility problems and refuses a wrong password", async ({ page }) => {
  await page.goto("/sign-in");
  await expect(page.getByRole("heading", { name: "Sign in" })).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);
  await signIn(page, co.users.admin.email, "not-the-password");
  await expect(page.getByRole("alert").filter({ hasText: "e-mail or password is wrong" })).toBeVisible();
  await expect(page).toHaveURL(/\/sign-in/);
  await page.screenshot({ path: "tests/e2e/screenshots/sign-in.png" });
});

for (const role of ROLES) {
  test(`${role} signs in and sees the navigation of their job`, async ({ page }) => {
    const user = co.users[role];
    await signIn(page, user.email, co.password);
    // managers land on the Overview, accountants on Reports, everyone else on Stock (lib/auth/home.ts)
    const home = role === "manager" ? "Overview" : role === "accountant" ? "Reports" : "Stock";
    await expect(page).toHaveURL(role === "manager" ? /\/overview$/ : role === "accountant" ? /\/reports$/ : /\/stock$/);
    const nav = page.getByRole("navigation", { name: "Main" });
    await expect(nav.getByRole("listitem")).toHaveText(NAV[role]);
    await expect(nav.getByRole("link", { name: home })).toHaveAttribute("aria-current", "page");
    if (home !== "Stock") await nav.getByRole("link", { name: "Stock" }).click();
    await expect(page).toHaveURL(/\/stock$/);
    // the current kitchen is in the page title; a kitchen lead works only in their own kitchen
    const kitchen = role === "kitchen_lead" ? co.kitchens[0]! : [...co.kitchens].sort((a, b) => a.code.localeCompare(b.code))[0]!;
    await expect(page.getByRole("heading", { level: 1 })).toContainText(kitchen.name);
    const options = page.getByRole("combobox", { name: "Kitchen" }).getByRole("option");
    await expect(options).toHaveCount(role === "kitchen_lead" ? 1 : co.kitchens.length);
    expect(await seriousViolations(page)).toEqual([]);
    await page.screenshot({ path: `tests/e2e/screenshots/${role}-stock.png` });

    // pages outside the role's job are not there for them
    if (!NAV[role].includes("Settings")) {
      const res = await page.goto("/settings");
      expect(res?.status()).toBe(404);
    }
  });
}

test("switching kitchen changes the page title and survives a reload", async ({ page }) => {
  await signIn(page, co.users.manager.email, co.password);
  await expect(page).toHaveURL(/\/overview$/);
  await page.goto("/stock");
  const target = co.kitchens[2]!;
  await page.getByRole("combobox", { name: "Kitchen" }).selectOption(target.id);
  await expect(page.getByRole("heading", { level: 1 })).toContainText(target.name);
  await page.reload();
  await expect(page.getByRole("heading", { level: 1 })).toContainText(target.name);
});

test("signing out ends the session", async ({ page }) => {
  await signIn(page, co.users.buyer.email, co.password);
  await expect(page).toHaveURL(/\/stock$/);
  await page.getByRole("button", { name: "Sign out" }).click();
  await expect(page).toHaveURL(/\/sign-in/);
  await page.goto("/stock");
  await expect(page).toHaveURL(/\/sign-in/);
});
