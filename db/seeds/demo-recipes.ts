// The demo company's recipes and next week's batch plans (invented: names, rates and plans are
// demo data, never check values). Posted through lib/data as the demo manager and kitchen lead,
// so they pass the same checks as anything a person writes. Loaded by load-demo.ts when the demo
// company has no recipe yet.
import type { Knex } from "knex";
import type { CurrentUser } from "../../lib/auth/current-user";
import { createBatch, produceBatch, reserveBatch } from "../../lib/data/batches";
import { createRecipe } from "../../lib/data/recipes";
import { loadCurrentUser } from "../../lib/data/users";
import { batchCreateInput, batchProduceInput } from "../../lib/validation/batches";
import { recipeCreateInput } from "../../lib/validation/recipes";

const lean = (pct: string, fat: string, leanName = "Pork shoulder, trimmed", fatName = "Back fat") => [
  { name: leanName, percent: pct },
  { name: fatName, percent: fat },
];

export const DEMO_RECIPES = [
  {
    code: "YARD-SMK", name: "Yard smoked sausage", productClass: "comminuted", storage: "keep_refrigerated",
    meatBlock: lean("70", "30"),
    lines: [
      { item: "SALT-FINE", rate: "16", unit: "g/kg" },
      { item: "CURE-1", rate: "2.5", unit: "g/kg" },
      { item: "DEXTROSE", rate: "3", unit: "g/kg" },
      { item: "PEP-BLK-GR", rate: "2.5", unit: "g/kg" },
      { item: "GARLIC-PWD", rate: "1.5", unit: "g/kg" },
      { item: "PAPRIKA-SM", rate: "4", unit: "g/kg" },
    ],
    casing: { item: "HOG-32-35", calibreMinMm: "32", calibreMaxMm: "36", linkLength: { quantity: "15", unit: "cm" } },
    processNotes: "Grind 4.5 mm below 2 °C. Mix to 4 °C, stuff, hang 1 h. Hot smoke to 68 °C core; shower, chill below 5 °C within 2 h.",
  },
  {
    code: "LANE-BKF", name: "Lane breakfast link (fresh, uncured)", productClass: "comminuted", storage: "keep_refrigerated",
    meatBlock: lean("75", "25"),
    lines: [
      { item: "SALT-FINE", rate: "17", unit: "g/kg" },
      { item: "PEP-WHT", rate: "2", unit: "g/kg" },
      { item: "SAGE", rate: "1.5", unit: "g/kg" },
      { item: "NUTMEG", rate: "0.4", unit: "g/kg" },
      { item: "GINGER", rate: "0.3", unit: "g/kg" },
    ],
    casing: { item: "SHP-22-24", calibreMinMm: "20", calibreMaxMm: "24", linkWeight: { quantity: "50", unit: "g" } },
    processNotes: "Fresh sausage, no cure. Grind 6 mm, mix cold, stuff and link; keep at or below 4 °C.",
  },
  {
    code: "ROPE-SAL", name: "Rope fennel salami (dry, fermented)", productClass: "comminuted", storage: "shelf_stable",
    meatBlock: lean("80", "20", "Pork leg, trimmed", "Hard back fat"),
    lines: [
      { item: "SALT-SEA", rate: "26", unit: "g/kg" },
      { item: "CURE-2", rate: "2.5", unit: "g/kg" },
      { item: "DEXTROSE", rate: "4", unit: "g/kg" },
      { item: "CULTURE-SM4", rate: "0.25", unit: "g/kg" },
      { item: "FENNEL", rate: "3", unit: "g/kg" },
      { item: "PEP-BLK-WH", rate: "2", unit: "g/kg" },
      { item: "GARLIC-PWD", rate: "1", unit: "g/kg" },
    ],
    casing: { item: "BEEF-MID-50-55", calibreMinMm: "50", calibreMaxMm: "55" },
    processNotes: "Dry and fermented sausage: comminuted, never the whole-muscle class. Ferment to pH 5.3 or below within the time the HACCP plan sets; dry to the target weight loss.",
  },
];

/**
 * Plans in the lead's kitchen (offsets in days from today): which to reserve, and one made today
 * (actual meat weight as weighed) so the batch codes and the lot traces have something to show.
 */
export const DEMO_BATCHES: { recipe: string; kitchen: string; inDays: number; meatKg: string; reserve: boolean; producedWithKg?: string }[] = [
  { recipe: "YARD-SMK", kitchen: "YARD", inDays: 0, meatKg: "20", reserve: true, producedWithKg: "20.3" },
  { recipe: "YARD-SMK", kitchen: "YARD", inDays: 5, meatKg: "40", reserve: true },
  { recipe: "LANE-BKF", kitchen: "YARD", inDays: 6, meatKg: "25", reserve: false },
  { recipe: "YARD-SMK", kitchen: "YARD", inDays: 8, meatKg: "60", reserve: false },
];

async function firstActive(knex: Knex, companyId: string, role: string): Promise<CurrentUser> {
  const row: { id: string } | undefined = await knex("app_users").where({ company_id: companyId, role }).whereNull("disabled_at").orderBy("created_at").first("id");
  const user = row && (await loadCurrentUser(row.id));
  if (!user) throw new Error(`The demo company has no active ${role}.`);
  return user;
}

/** Writes the demo recipes and plans; the caller checks that the company has no recipe yet. */
export async function loadDemoRecipes(knex: Knex, companyId: string, today: string): Promise<{ recipes: number; batches: number }> {
  const manager = await firstActive(knex, companyId, "manager");
  const lead = await firstActive(knex, companyId, "kitchen_lead");
  const haveItems = new Set<string>(await knex("items").where({ company_id: companyId }).pluck("sku"));
  let recipes = 0;
  for (const r of DEMO_RECIPES) {
    const lines = r.lines.filter((l) => haveItems.has(l.item));
    const casing = haveItems.has(r.casing.item) ? r.casing : { ...r.casing, item: undefined };
    await createRecipe(manager, recipeCreateInput.parse({ ...r, lines, casing }));
    recipes++;
  }
  let batches = 0;
  for (const b of DEMO_BATCHES) {
    const day = new Date(`${today}T00:00:00Z`);
    day.setUTCDate(day.getUTCDate() + b.inDays);
    const batch = await createBatch(lead, batchCreateInput.parse({ kitchen: b.kitchen, recipe: b.recipe, plannedFor: day.toISOString().slice(0, 10), meatBlock: { quantity: b.meatKg, unit: "kg" } }));
    batches++;
    if (b.reserve && batch.shortLines === 0) await reserveBatch(lead, batch.id);
    if (b.producedWithKg) await produceBatch(lead, batch.id, batchProduceInput.parse({ actualMeatBlock: { quantity: b.producedWithKg, unit: "kg" } }));
  }
  return { recipes, batches };
}
