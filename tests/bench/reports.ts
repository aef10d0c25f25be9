// Benchmark: the accountant's reports over a long ledger. The reports cost every movement from the
// first (lib/costing/load.ts + engine.ts), so their time grows with the whole ledger, not with the
// month asked for: this prints how long a month's usage report and a valuation take at a ledger size.
//
// In a database of its own (tests/bench/bench-db.ts): one company, kitchens and items, a year of
// receipts, uses and wastes per kitchen and item, every lot of an item at one cost (so FIFO, the
// moving average and plain quantity x cost agree, and the script can check the reports against SQL
// sums: it throws on a difference, so it cannot rot).
//
//   BENCH_SIZE=tiny|full node --conditions=react-server --import tsx tests/bench/reports.ts
//   tiny (npm test): 2 kitchens x 3 items, about 300 movements; full: 4 kitchens x 250 items, about 200,000
// env: DATABASE_URL (any database of the cluster), BENCH_SIZE (tiny)
import { benchDatabase } from "./bench-db";

const SIZES = { tiny: { kitchens: 2, items: 3, days: 365, every: 7 }, full: { kitchens: 4, items: 250, days: 365, every: 2 } } as const;
const sizeName = (process.env.BENCH_SIZE ?? "tiny") as keyof typeof SIZES;
if (!(sizeName in SIZES)) throw new Error(`BENCH_SIZE must be one of ${Object.keys(SIZES).join(", ")}, not ${sizeName}`);
const size = SIZES[sizeName];

const bench = benchDatabase();
const knex = await bench.create();
try {
  const { loadCurrentUser } = await import("../../lib/data/users");
  const { usageReport, valuationReport } = await import("../../lib/data/reports");
  const { randomUUID } = await import("node:crypto");

  const [company] = await knex("companies").insert({ name: "Bench Larder", time_zone: "Europe/London", currency: "GBP" }).returning<{ id: string }[]>("id");
  const companyId = company!.id;
  const kitchens = await knex("kitchens")
    .insert(Array.from({ length: size.kitchens }, (_, i) => ({ company_id: companyId, code: `K${i + 1}`, name: `Kitchen ${i + 1}` })))
    .returning<{ id: string }[]>("id");
  const items = await knex("items")
    .insert(Array.from({ length: size.items }, (_, i) => ({ company_id: companyId, sku: `SP-${i + 1}`, name: `Spice ${i + 1}`, category: "spice", stock_unit: "g" })))
    .returning<{ id: string }[]>("id");
  const [user] = await knex("app_users").insert({ company_id: companyId, email: `bench-${bench.name}@bench.test`, name: "Bench Accountant", role: "accountant" }).returning<{ id: string }[]>("id");
  const accountant = (await loadCurrentUser(user!.id))!;

  // one lot per item at a cost of (item number) pence per 100 g; a year of movements ending yesterday
  const cost = (i: number) => ((i % 97) + 1) / 10_000; // 0.0001 .. 0.0097 per g: exact in 4 places
  const lots = await knex("lots")
    .insert(items.map((it, i) => ({ company_id: companyId, item_id: it.id, code: `L-${i + 1}`, received_on: "2025-01-01", unit_cost: cost(i).toFixed(4) })))
    .returning<{ id: string; item_id: string }[]>(["id", "item_id"]);
  const start = Date.now() - size.days * 86_400_000;
  let rows: Record<string, unknown>[] = [];
  let total = 0;
  const flush = async () => {
    if (rows.length) await knex.batchInsert("stock_movements", rows, 2000);
    total += rows.length;
    rows = [];
  };
  for (const [k, kitchen] of kitchens.entries()) {
    for (const [i, item] of items.entries()) {
      const lot = lots.find((l) => l.item_id === item.id)!;
      let onHand = 0;
      for (let d = 0; d < size.days; d += size.every) {
        const at = new Date(start + d * 86_400_000 + k * 60_000);
        const move = (kind: string, delta: number, minutes: number) =>
          rows.push({
            company_id: companyId, posting_id: randomUUID(), kind, kitchen_id: kitchen.id, item_id: item.id, lot_id: lot.id, delta: String(delta),
            unit_cost: cost(i).toFixed(4), user_id: user!.id, reason: kind === "waste" ? "bench" : null, occurred_at: new Date(at.getTime() + minutes * 60_000),
          });
        if (onHand < 600) { move("receipt", 1000, 0); onHand += 1000; }
        const use = 100 + ((d * 7 + i * 13 + k) % 300);
        move("use", -use, 5); onHand -= use;
        if (d % 5 === 0) { move("waste", -10, 10); onHand -= 10; }
      }
      if (rows.length > 20_000) await flush();
    }
  }
  await flush();
  await knex.raw(
    `insert into stock_balances (company_id, kitchen_id, item_id, lot_id, on_hand)
     select company_id, kitchen_id, item_id, lot_id, sum(delta) from stock_movements where company_id = ? group by 1, 2, 3, 4`, [companyId]);
  await knex.raw("vacuum analyze");
  console.log(`[bench] reports: ${total.toLocaleString("en")} movements, ${size.kitchens} kitchens x ${size.items} items (${sizeName})`);

  // last month in London and its last day
  const now = new Date();
  const lastMonth = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth() - 1, 15)).toISOString().slice(0, 7);
  const lastDay = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), 0)).toISOString().slice(0, 10);
  const time = async <T>(label: string, fn: () => Promise<T>): Promise<T> => {
    const ms: number[] = [];
    let out: T | undefined;
    for (let r = 0; r < 3; r++) {
      const t = performance.now();
      out = await fn();
      ms.push(performance.now() - t);
    }
    ms.sort((a, b) => a - b);
    console.log(`[bench] ${label}: median ${ms[1]!.toFixed(0)} ms (runs ${ms.map((m) => m.toFixed(0)).join(", ")})`);
    return out!;
  };
  const { costCompany } = await import("../../lib/costing/load");
  const { db } = await import("../../db/client");
  await time("reading the movements alone", () => db()("stock_movements").where({ company_id: companyId }).select("id", "posting_id", "kind", "kitchen_id", "other_kitchen_id", "item_id", "lot_id", "delta", "unit_cost", "reverses_id", "occurred_at", "recorded_at"));
  await time("costing (read + engine, every item)", () => costCompany(db(), companyId, { before: new Date(), formula: "fifo" }));
  const usage = await time(`usage report ${lastMonth} by item`, () => usageReport(accountant, { from: lastMonth, to: lastMonth, groupBy: "item", format: "json", bom: false }));
  const valuation = await time(`valuation at ${lastDay}`, () => valuationReport(accountant, { asOf: lastDay, format: "json", bom: false }));

  // checks against SQL: one cost per item, so every formula gives quantity x cost (rounded per row, as the reports do)
  const monthStart = new Date(`${lastMonth}-01T00:00:00Z`);
  // exact sums from SQL, rounded here half-even per row as the reports round (SQL's round() is half-up)
  const { Dec } = await import("../../lib/units/decimal");
  const half = (v: string) => new Dec(v).toDecimalPlaces(2, Dec.ROUND_HALF_EVEN);
  const usageRows = await knex.raw<{ rows: { u: string; w: string }[] }>(
    `select sum(case when kind = 'use' then -delta * unit_cost else 0 end)::text as u, sum(case when kind = 'waste' then -delta * unit_cost else 0 end)::text as w
       from stock_movements
      where company_id = ? and kind in ('use', 'waste')
        and occurred_at >= (?::timestamp at time zone 'Europe/London') and occurred_at < ((?::timestamp + interval '1 month') at time zone 'Europe/London')
      group by item_id`,
    [companyId, monthStart.toISOString().slice(0, 19), monthStart.toISOString().slice(0, 19)]);
  const valueRows = await knex.raw<{ rows: { v: string }[] }>(
    `select sum(delta * unit_cost)::text as v from stock_movements
      where company_id = ? and occurred_at < ((?::date + 1) at time zone 'Europe/London')
      group by kitchen_id, item_id having sum(delta) <> 0`, [companyId, lastDay]);
  const expectedUsage = { rows: [{ cost: usageRows.rows.reduce((t, r) => t.add(half(r.u)).add(half(r.w)), new Dec(0)).toFixed(2) }] };
  const expectedValue = { rows: [{ value: valueRows.rows.reduce((t, r) => t.add(half(r.v)), new Dec(0)).toFixed(2) }] };
  const same = (a: string, b: string) => new Dec(a).eq(new Dec(b));
  if (!same(usage.totals.cost, expectedUsage.rows[0]!.cost)) throw new Error(`usage total ${usage.totals.cost} != SQL ${expectedUsage.rows[0]!.cost}`);
  if (!same(valuation.totals.value, expectedValue.rows[0]!.value)) throw new Error(`valuation total ${valuation.totals.value} != SQL ${expectedValue.rows[0]!.value}`);
  if (usage.rows.length === 0 || valuation.rows.length === 0) throw new Error("the reports came back empty");
  console.log(`[bench] checked against SQL: usage ${usage.totals.cost}, valuation ${valuation.totals.value}`);
} finally {
  await bench.drop(knex);
}
