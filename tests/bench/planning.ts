// Benchmark: plan and reserve many batches in one go (lib/data/batches: createBatch, then
// reserveAll for the kitchen), timing each step and counting the SQL statements per batch.
//
// In a database of its own (tests/bench/bench-db.ts): one company and kitchen, a recipe with cure,
// salt, five spices and a hog casing, and stock for every batch received in many dated lots, so
// reservations split across lots first-expired-first-out. After reserving it checks that every
// batch was reserved in full and that the balances' reserved equals the reservations (it throws
// otherwise, so the script cannot rot).
//
//   BENCH_SIZE=tiny|full node --conditions=react-server --import tsx tests/bench/planning.ts
//   tiny (npm test): 5 batches; full: 500 batches
// env: DATABASE_URL (any database of the cluster), BENCH_SIZE (tiny)
import { benchDatabase } from "./bench-db";

const SIZES = { tiny: { batches: 5, lotsPerItem: 4 }, full: { batches: 500, lotsPerItem: 40 } } as const;
const sizeName = (process.env.BENCH_SIZE ?? "tiny") as keyof typeof SIZES;
if (!(sizeName in SIZES)) throw new Error(`BENCH_SIZE must be one of ${Object.keys(SIZES).join(", ")}, not ${sizeName}`);
const size = SIZES[sizeName];

const bench = benchDatabase();
const knex = await bench.create();
try {
  const { db } = await import("../../db/client");
  const { loadCurrentUser } = await import("../../lib/data/users");
  const { createItem } = await import("../../lib/data/items");
  const { createRecipe } = await import("../../lib/data/recipes");
  const { createBatch, reserveAll } = await import("../../lib/data/batches");
  const { itemCreateInput } = await import("../../lib/validation/items");
  const { recipeCreateInput } = await import("../../lib/validation/recipes");
  const { batchCreateInput } = await import("../../lib/validation/batches");

  const [company] = await knex("companies").insert({ name: "Bench Larder", time_zone: "Europe/London", currency: "GBP" }).returning<{ id: string }[]>("id");
  const [kitchen] = await knex("kitchens").insert({ company_id: company!.id, code: "K01", name: "Kitchen 1" }).returning<{ id: string }[]>("id");
  const [user] = await knex("app_users").insert({ company_id: company!.id, email: `bench-${bench.name}@bench.test`, name: "Bench Manager", role: "manager" }).returning<{ id: string }[]>("id");
  const manager = (await loadCurrentUser(user!.id))!;

  // the catalogue and a recipe: 10 kg batches of a cured sausage in hog casing
  const drafts = [
    { sku: "CURE", name: "Cure 6.25 %", category: "cure", unit: "g", nitriteFraction: "0.0625", nitrateFraction: "0" },
    { sku: "SALT", name: "Salt", category: "ingredient", unit: "g", trackLots: true, trackDates: false },
    ...["PEPPER", "GARLIC", "PAPRIKA", "NUTMEG", "CORIANDER"].map((s) => ({ sku: s, name: s.toLowerCase(), category: "spice", unit: "g", trackLots: true, trackDates: true })),
    { sku: "HOG", name: "Hog 32/35", category: "casing", unit: "pc", casingKind: "natural_hog", calibreMinMm: "32", calibreMaxMm: "35", putUp: "hank" },
  ];
  for (const d of drafts) await createItem(manager, itemCreateInput.parse(d));
  const rates: Record<string, string> = { CURE: "2.5", SALT: "18", PEPPER: "2", GARLIC: "1", PAPRIKA: "3", NUTMEG: "0.5", CORIANDER: "1" };
  await createRecipe(manager, recipeCreateInput.parse({
    code: "BENCH", name: "Bench sausage", productClass: "comminuted", storage: "keep_refrigerated",
    meatBlock: [{ name: "Lean", percent: "70" }, { name: "Fat", percent: "30" }],
    lines: Object.entries(rates).map(([item, rate]) => ({ item, rate, unit: "g/kg" })),
    casing: { item: "HOG", calibreMinMm: "32", calibreMaxMm: "35" },
  }));

  // stock for every batch (with room to spare), in dated lots straight into lots and balances
  const items: { id: string; sku: string }[] = await knex("items").where({ company_id: company!.id }).select("id", "sku");
  const perBatch: Record<string, number> = { ...Object.fromEntries(Object.entries(rates).map(([k, v]) => [k, Number(v) * 10])), HOG: 0.25 };
  for (const item of items) {
    const each = Math.ceil((perBatch[item.sku]! * size.batches * 1.2) / size.lotsPerItem) + 1;
    const lots = await knex("lots")
      .insert(Array.from({ length: size.lotsPerItem }, (_, i) => ({
        company_id: company!.id, item_id: item.id, code: `${item.sku}-${i}`, received_on: "2026-01-01",
        date: item.sku === "SALT" ? null : `2027-${String((i % 12) + 1).padStart(2, "0")}-${String((i % 27) + 1).padStart(2, "0")}`,
        date_kind: item.sku === "SALT" ? null : "best_before", unit_cost: "0.01",
      })))
      .returning<{ id: string }[]>("id");
    await knex("stock_balances").insert(lots.map((l) => ({ company_id: company!.id, kitchen_id: kitchen!.id, item_id: item.id, lot_id: l.id, on_hand: String(each) })));
  }

  // count the statements lib/data sends
  let queries = 0;
  db().on("query", () => queries++);
  const today = new Date().toISOString().slice(0, 10);
  const day = (n: number) => new Date(Date.now() + n * 86_400_000).toISOString().slice(0, 10);

  let started = performance.now();
  for (let i = 0; i < size.batches; i++) {
    await createBatch(manager, batchCreateInput.parse({ kitchen: "K01", recipe: "BENCH", plannedFor: day(1 + (i % 7)), meatBlock: { quantity: "10", unit: "kg" } }));
  }
  const planMs = performance.now() - started;
  const planQueries = queries;

  queries = 0;
  started = performance.now();
  const result = await reserveAll(manager, { kitchen: "K01", from: today, to: day(8) });
  const reserveMs = performance.now() - started;
  const reserveQueries = queries;

  // checks: every batch reserved in full, balances' reserved = the reservations
  const notReserved = result.batches.filter((b) => !b.reserved);
  if (result.batches.length !== size.batches || notReserved.length) throw new Error(`${notReserved.length} of ${result.batches.length} batches were not reserved`);
  const gap = await knex.raw<{ rows: { n: string }[] }>(
    `select count(*) as n from stock_balances b
      where b.reserved <> coalesce((select sum(r.quantity) from reservations r where r.kitchen_id = b.kitchen_id and r.lot_id = b.lot_id), 0)`,
  );
  if (gap.rows[0]!.n !== "0") throw new Error(`${gap.rows[0]!.n} balances disagree with their reservations`);
  const short = await knex.raw<{ rows: { n: string }[] }>(
    `select count(*) as n from batch_lines l where l.quantity > coalesce((select sum(quantity) from reservations r where r.batch_line_id = l.id), 0)`,
  );
  if (short.rows[0]!.n !== "0") throw new Error(`${short.rows[0]!.n} batch lines are not fully reserved`);
  const split = await knex.raw<{ rows: { n: string }[] }>("select count(*) as n from reservations");

  const per = (ms: number) => (ms / size.batches).toFixed(1);
  console.log(`[bench] BENCH_SIZE=${sizeName}: ${size.batches} batches of 8 lines, ${size.lotsPerItem} lots per item (database ${bench.name})`);
  console.log(`[bench] plan:    ${(planMs / 1000).toFixed(2)} s in all, ${per(planMs)} ms and ${(planQueries / size.batches).toFixed(1)} queries per batch`);
  console.log(`[bench] reserve: ${(reserveMs / 1000).toFixed(2)} s in all, ${per(reserveMs)} ms and ${(reserveQueries / size.batches).toFixed(1)} queries per batch (${split.rows[0]!.n} reservations)`);
} finally {
  await bench.drop(knex);
}
