// Shared steps of the browser stories.
import AxeBuilder from "@axe-core/playwright";
import { expect, type Browser, type Page } from "@playwright/test";

/** axe's serious and critical findings on the page as it is now (empty when there are none). */
export async function seriousViolations(page: Page): Promise<string[]> {
  const { violations } = await new AxeBuilder({ page }).analyze();
  return violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(" ")).join(", ")})`);
}

/** Fills and sends the sign-in form (the caller checks where it lands). */
export async function signIn(page: Page, email: string, password: string): Promise<void> {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
}

/** A fresh browser context signed in at /stock; with kitchenId, working in that kitchen. */
export async function signedInPage(browser: Browser, email: string, password: string, kitchenId?: string): Promise<Page> {
  const page = await (await browser.newContext({ viewport: { width: 1024, height: 768 } })).newPage();
  await signIn(page, email, password);
  // managers land on the Overview, accountants on Reports (lib/auth/home.ts); these stories start from the stock page
  await expect(page).toHaveURL(/\/(stock|overview|reports)$/);
  if (!new URL(page.url()).pathname.endsWith("/stock")) await page.goto("/stock");
  if (kitchenId) {
    // work in this kitchen, as the kitchen switcher would choose it
    await page.context().addCookies([{ name: "hl_kitchen", value: kitchenId, url: page.url() }]);
    await page.reload();
  }
  return page;
}

/** One cell of the stock grid, by row id and column id (pinned and centre parts are separate rows). */
export const gridCell = (page: Page, rowId: string, colId: string) => page.locator(`.ag-row[row-id="${rowId}"] [col-id="${colId}"]`);
