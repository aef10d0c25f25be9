// Story: a kitchen lead opens the cure calculator from Planning, checks 2.5 g per kg of a 6.25 %
// cure and sees 156.2500 ppm within the US comminuted maximum (9 CFR 424.21(c): 1/4 oz to 100 lb
// chopped meat = 156.25 ppm; trade-facts §1 [calc]) with the cure caution; then asks how much cure
// 120 ppm needs (1.92 g/kg, trade-facts §3 [calc]) and gets it rounded up to the 0.1 g scale over
// the keep-refrigerated floor. An admin sets the company's table and scale under Settings > Company,
// and the calculator follows them. No serious accessibility problems; 1024 x 768 screenshots kept.
import { expect, test } from "@playwright/test";
import { closeDb } from "../../db/client";
import { seriousViolations, signedInPage } from "./support";
import { createCompany, type TestCompany } from "../support/factory";

let co: TestCompany;

test.beforeAll(async () => {
  co = await createCompany();
});
test.afterAll(async () => {
  await closeDb();
});

test("a kitchen lead checks 2.5 g/kg of a 6.25 % cure and finds the cure for 120 ppm", async ({ browser }) => {
  test.setTimeout(90_000);
  const page = await signedInPage(browser, co.users.kitchen_lead.email, co.password, co.kitchens[0]!.id);
  await page.goto("/planning");
  await page.getByRole("link", { name: "Cure calculator" }).click();
  await expect(page).toHaveURL(/\/planning\/cure$/);
  await expect(page.getByRole("heading", { level: 1 })).toContainText("Cure calculator");
  // the caution is on the page before anything is calculated
  await expect(page.getByRole("complementary", { name: "Cure caution" })).toContainText("toxic in overdose");
  await expect(page.getByLabel("Product class")).toHaveValue("comminuted");
  await expect(page.getByText("Dry and fermented sausages (salami, pepperoni) are comminuted")).toBeVisible();
  await expect(page.getByLabel("Regulatory table")).toHaveValue("us");

  await page.getByLabel("Meat block (green weight)", { exact: true }).fill("1");
  await page.getByLabel("Cure 1: quantity", { exact: true }).fill("2.5");
  await page.getByLabel("Cure 1: quantity: unit").selectOption("g");
  await expect(page.getByLabel("Cure 1: nitrite (%)")).toHaveValue("6.25");
  await page.getByRole("button", { name: "Calculate" }).click();

  const result = page.getByRole("region", { name: "Result" });
  await expect(result.getByText("Within every check.")).toBeVisible();
  await expect(result.getByText("156.2500 ppm")).toBeVisible();
  const row = result.getByRole("row", { name: /1\/4 oz to 100 lb chopped meat/ });
  await expect(row).toContainText("156.25 ppm");
  await expect(row).toContainText("Maximum (blocks)");
  await expect(row).toContainText("Within");
  await expect(page.getByRole("complementary", { name: "Cure caution" })).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/cure-calculator.png" });

  // a required field left empty: the server's message appears beside the field
  await page.getByLabel("Cure 1: nitrite (%)").fill("");
  await page.getByRole("button", { name: "Calculate" }).click();
  await expect(page.getByText("Enter the nitrite percentage from the label")).toBeVisible();
  await page.getByLabel("Cure 1: nitrite (%)").fill("6.25");

  // inverse: 120 ppm is 1.92 g per kg; keep refrigerated, the 0.1 g scale rounds up to 2 g (125 ppm)
  await page.getByRole("radio", { name: "How much cure for a target ppm" }).check();
  await page.getByLabel("Target ingoing nitrite (ppm)").fill("120");
  await page.getByRole("button", { name: "Calculate" }).click();
  await expect(result.getByText("2 g", { exact: false }).first()).toBeVisible();
  await expect(result.getByText("exact 1.92 g; rounded up to the 0.1 g scale")).toBeVisible();
  await expect(result.getByText("125.0000 ppm")).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: "tests/e2e/screenshots/cure-calculator-inverse.png", fullPage: true });
  await page.context().close();
});

test("an admin sets the company's table and scale; the calculator follows them", async ({ browser }) => {
  const admin = await signedInPage(browser, co.users.admin.email, co.password);
  await admin.goto("/settings");
  const form = admin.getByRole("form", { name: "Cure calculator" });
  await expect(form.getByLabel("Regulatory table")).toHaveValue("us");
  await expect(form.getByLabel("Kitchen scale resolution (g)")).toHaveValue("0.1");
  await form.getByLabel("Regulatory table").selectOption("none");
  await form.getByLabel("Kitchen scale resolution (g)").fill("0.01");
  await form.getByRole("button", { name: "Save cure settings" }).click();
  await expect(form.getByText("Cure calculator settings saved.")).toBeVisible();
  expect(await seriousViolations(admin)).toEqual([]);
  await form.scrollIntoViewIfNeeded();
  await admin.screenshot({ path: "tests/e2e/screenshots/cure-settings.png" });

  await admin.goto("/planning/cure");
  await expect(admin.getByLabel("Regulatory table")).toHaveValue("none");
  await admin.getByRole("radio", { name: "How much cure for a target ppm" }).check();
  await admin.getByLabel("Meat block (green weight)", { exact: true }).fill("1");
  await admin.getByLabel("Target ingoing nitrite (ppm)").fill("120");
  await admin.getByRole("button", { name: "Calculate" }).click();
  const result = admin.getByRole("region", { name: "Result" });
  await expect(result.getByText("No regulatory check was made: nothing is blocked.")).toBeVisible();
  await expect(result.getByText("exact 1.92 g; on the 0.01 g scale")).toBeVisible();
  await admin.context().close();
});
