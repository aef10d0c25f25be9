// Benchmark: GET /api/stock?kitchen=CODE (getStock in lib/data/stock.ts) against a large ledger,
// and the same SQL run directly, to show that the answer stays flat as the ledger grows (getStock
// reads stock_balances, never the movements).
//
// In a database of its own (created through the cluster's superuser, migrated, dropped at the
// end) it loads a company with COPY (pg-copy-streams): kitchens, items, lots and movements, then
// stock_balances as the per-(kitchen, lot) sum of the movements in one INSERT ... SELECT. It times
// getStock for one kitchen and the same queries written out as plain SQL, prints p50/p95 of both
// and their ratio, grows the ledger five-fold and prints the figures again. The API's and the
// direct SQL's answers are compared every time (a mismatch throws), so the script cannot rot.
//
//   BENCH_SIZE=tiny|full node --conditions=react-server --import tsx tests/bench/stock-api.ts
//   tiny (npm test): 2 kitchens, 20 items, 100 lots, 2,000 movements (grown to 10,000), 5 runs
//   full: 10 kitchens, 5,000 items, 50,000 lots, 1,000,000 movements (grown to 5,000,000), 50 runs
//         after 5 warm-ups; the growth is skipped (with the reason printed) under 10 GB free disk
// env: DATABASE_URL (any database of the cluster; the superuser `postgres` must be trusted on
//      127.0.0.1, as db/pg.sh sets up), BENCH_SIZE (tiny)
import { randomUUID } from "node:crypto";
import { statfs } from "node:fs/promises";
import { Readable } from "node:stream";
import { pipeline } from "node:stream/promises";
import knexFactory, { type Knex } from "knex";
import pg from "pg";
import { from as copyFrom } from "pg-copy-streams";
import { generator } from "../../db/seeds/demo-stock-plan";

const SIZES = {
  tiny: { kitchens: 2, items: 20, lots: 100, movements: 2_000, grownTo: 10_000, warmups: 1, runs: 5 },
  full: { kitchens: 10, items: 5_000, lots: 50_000, movements: 1_000_000, grownTo: 5_000_000, warmups: 5, runs: 50 },
} as const;
const MIN_FREE_BYTES_TO_GROW = 10 * 1024 ** 3;

const sizeName = (process.env.BENCH_SIZE ?? "tiny") as keyof typeof SIZES;
if (!(sizeName in SIZES)) throw new Error(`BENCH_SIZE must be one of ${Object.keys(SIZES).join(", ")}, not ${sizeName}`);
const size = SIZES[sizeName];
if (!process.env.DATABASE_URL) throw new Error("Set DATABASE_URL to a database of the cluster to benchmark in.");

const appUrl = new URL(process.env.DATABASE_URL);
const adminUrl = Object.assign(new URL(appUrl), { username: "postgres", password: "", pathname: "/postgres" });
const dbName = `hl_bench_${randomUUID().replace(/-/g, "").slice(0, 10)}`;
const benchUrl = Object.assign(new URL(appUrl), { pathname: `/${dbName}` }).toString();
// lib/data opens its handle (db/client.ts) from DATABASE_URL on first use: the bench's own database
process.env.DATABASE_URL = benchUrl;

const { closeDb } = await import("../../db/client");
const { getStock, STOCK_ITEMS_SQL, STOCK_LOTS_SQL } = await import("../../lib/data/stock");
type StockItemLine = import("../../lib/data/stock").StockItemLine;
type StockLotLine = import("../../lib/data/stock").StockLotLine;
const { loadCurrentUser } = await import("../../lib/data/users");
const { dec, plain } = await import("../../lib/units");

// ---------------------------------------------------------------------------------------------
// small helpers

const fmt = (n: number) => Math.round(n).toLocaleString("en-US");
const mb = (bytes: number | string) => `${(Number(bytes) / 1024 ** 2).toFixed(0)} MB`;
const seconds = (ms: number) => `${(ms / 1000).toFixed(1)} s`;


/** COPY ... FROM STDIN (text format) of the rows a generator yields, in chunks of about 256 KiB. */
async function copyRows(client: pg.Client, table: string, columns: readonly string[], rows: Iterable<readonly (string | null)[]>): Promise<{ rows: number; ms: number }> {
  const started = performance.now();
  let count = 0;
  function* chunks() {
    let buf = "";
    for (const r of rows) {
      buf += r.map((v) => (v === null ? "\\N" : v)).join("\t") + "\n";
      count++;
      if (buf.length > 262_144) {
        yield buf;
        buf = "";
      }
    }
    if (buf) yield buf;
  }
  await pipeline(Readable.from(chunks()), client.query(copyFrom(`copy ${table} (${columns.join(", ")}) from stdin`)));
  return { rows: count, ms: performance.now() - started };
}

const percentile = (sorted: number[], p: number) => sorted[Math.max(0, Math.ceil((p / 100) * sorted.length) - 1)]!;

async function timed<T>(fn: () => Promise<T>): Promise<{ ms: number; value: T }> {
  const started = performance.now();
  const value = await fn();
  return { ms: performance.now() - started, value };
}

// ---------------------------------------------------------------------------------------------
// the data

interface Ids {
  company: string;
  user: string;
  kitchens: { id: string; code: string }[];
  items: { id: string; category: string }[];
  lots: { id: string; itemId: string; home: number; cost: string }[];
}

const DAY = 86_400_000;
const START = Date.UTC(2024, 0, 1);
const iso = (ms: number) => new Date(ms).toISOString();

function* itemRows(ids: Ids) {
  const rnd = generator(1);
  for (const [n, item] of ids.items.entries()) {
    const sku = `SKU-${String(n + 1).padStart(5, "0")}`;
    if (item.category === "casing") {
      const min = rnd.int(18, 45);
      yield [item.id, ids.company, sku, `Casing ${min}/${min + 2} mm ${n}`, "casing", "pc", "t", "f", "natural_hog", `${min}`, `${min + 2}`, "hank", "91.44", "45", "salted", null, null, null, null];
    } else if (item.category === "cure") {
      yield [item.id, ids.company, sku, `Cure ${n}`, "cure", "g", "t", "t", null, null, null, null, null, null, null, "0.0625", "0", null, null];
    } else {
      yield [item.id, ids.company, sku, `${item.category === "spice" ? "Spice" : "Ingredient"} ${n}`, item.category, "g", "f", "f", null, null, null, null, null, null, null, null, null, "ground", null];
    }
  }
}
const ITEM_COLUMNS = [
  "id", "company_id", "sku", "name", "category", "stock_unit", "track_lots", "track_dates", "casing_kind", "calibre_min_mm", "calibre_max_mm",
  "put_up", "put_up_metres", "capacity_kg_per_put_up", "storage", "nitrite_fraction", "nitrate_fraction", "form", "density_g_per_ml",
];

function* lotRows(ids: Ids) {
  const rnd = generator(2);
  const byId = new Map(ids.items.map((i) => [i.id, i]));
  for (const [n, lot] of ids.lots.entries()) {
    const received = START + rnd.int(0, 700) * DAY;
    const dated = byId.get(lot.itemId)!.category === "cure";
    yield [lot.id, ids.company, lot.itemId, `L${String(n).padStart(6, "0")}`, "Bench Supplier", iso(received).slice(0, 10),
      dated ? iso(received + rnd.int(200, 900) * DAY).slice(0, 10) : null, dated ? "best_before" : null, lot.cost];
  }
}
const LOT_COLUMNS = ["id", "company_id", "item_id", "code", "supplier_name", "received_on", "date", "date_kind", "unit_cost"];

const MOVEMENT_COLUMNS = ["company_id", "posting_id", "kind", "kitchen_id", "item_id", "lot_id", "delta", "counted", "entered_quantity", "entered_unit", "unit_cost", "reason", "other_kitchen_id", "user_id", "occurred_at"];

/**
 * The first `total` movements: per lot a receipt of 1000 at its home kitchen, then uses (1-40
 * each, never more than received), the odd waste with a reason, counts, and transfers of 100 to
 * another kitchen (two movements, one posting). Every (kitchen, lot) sum stays >= 0.
 */
function* firstMovements(ids: Ids, total: number) {
  const rnd = generator(3);
  const perLot = Math.floor(total / ids.lots.length);
  let extra = total - perLot * ids.lots.length;
  const K = ids.kitchens.length;
  for (const [n, lot] of ids.lots.entries()) {
    let want = perLot + (extra-- > 0 ? 1 : 0);
    const home = ids.kitchens[lot.home]!.id;
    let t = START + rnd.int(0, 700) * DAY;
    let onHand = 1000;
    const row = (kind: string, kitchen: string, delta: number, extra2: { counted?: number; reason?: string; other?: string; posting?: string } = {}) =>
      [ids.company, extra2.posting ?? randomUUID(), kind, kitchen, lot.itemId, lot.id, String(delta), extra2.counted === undefined ? null : String(extra2.counted),
        String(Math.abs(delta)), "g", lot.cost, extra2.reason ?? null, extra2.other ?? null, ids.user, iso((t += rnd.int(1, 72) * 3_600_000))] as const;
    yield row("receipt", home, 1000);
    want--;
    let transferred = false;
    while (want > 0) {
      const r = rnd.next();
      if (!transferred && want >= 2 && K > 1 && r < 0.05) {
        const other = ids.kitchens[(lot.home + 1 + (n % (K - 1))) % K]!.id;
        const posting = randomUUID();
        yield row("transfer", home, -100, { other, posting });
        yield row("transfer", other, 100, { other: home, posting });
        onHand -= 100;
        transferred = true;
        want -= 2;
      } else if (r < 0.1) {
        yield row("count", home, 0, { counted: onHand });
        want--;
      } else if (r < 0.13) {
        const q = rnd.int(1, 5);
        onHand -= q;
        yield row("waste", home, -q, { reason: "Bag split" });
        want--;
      } else {
        const q = rnd.int(1, 40);
        onHand -= q;
        yield row("use", home, -q);
        want--;
      }
    }
    if (onHand < 0) throw new Error("bench data: a lot went below zero");
  }
}

/** More ledger: pairs of a receipt and a use of the same size at a lot's home kitchen (net zero). */
function* moreMovements(ids: Ids, count: number, seed: number) {
  const rnd = generator(seed);
  for (let i = 0; i < count; i += 2) {
    const lot = ids.lots[rnd.int(0, ids.lots.length - 1)]!;
    const home = ids.kitchens[lot.home]!.id;
    const q = String(rnd.int(1, 50));
    const at = START + rnd.int(0, 700) * DAY + rnd.int(0, 86_399) * 1000;
    yield [ids.company, randomUUID(), "receipt", home, lot.itemId, lot.id, q, null, q, "g", lot.cost, null, null, ids.user, iso(at)] as const;
    if (i + 1 < count) yield [ids.company, randomUUID(), "use", home, lot.itemId, lot.id, `-${q}`, null, q, "g", lot.cost, null, null, ids.user, iso(at + 3_600_000)] as const;
  }
}

// ---------------------------------------------------------------------------------------------
// the two ways of reading one kitchen's stock

/** The statements getStock issues (exported by lib/data/stock.ts), run directly without shaping. */
async function directSql(knex: Knex, companyId: string, code: string) {
  const kitchens = (await knex.raw<{ rows: { id: string; code: string }[] }>(
    `select * from kitchens where company_id = ? and archived_at is null and upper(code) = upper(?) order by code`, [companyId, code])).rows;
  const params = { company: companyId, kitchen: kitchens[0]!.id };
  const [items, lots] = await Promise.all([
    knex.raw<{ rows: StockItemLine[] }>(STOCK_ITEMS_SQL, params),
    knex.raw<{ rows: StockLotLine[] }>(STOCK_LOTS_SQL, params),
  ]);
  return { kitchens, items: items.rows, balances: lots.rows };
}

type Api = Awaited<ReturnType<typeof getStock>>;
type Direct = Awaited<ReturnType<typeof directSql>>;

/**
 * The API's answer and the direct SQL's rows must say the same, and each item's on hand must be
 * the sum of its lots' (checked with exact decimals); throws on the first difference.
 */
function assertAgree(api: Api, direct: Direct) {
  const fail = (what: string) => {
    throw new Error(`getStock and the direct SQL disagree: ${what}`);
  };
  if (api.length !== 1 || direct.kitchens.length !== 1 || api[0]!.kitchen.id !== direct.kitchens[0]!.id) fail("kitchen");
  const rows = api[0]!.rows;
  if (rows.length !== direct.items.length) fail(`${rows.length} rows against ${direct.items.length} items`);
  const lines = new Map<string, Direct["balances"]>();
  for (const b of direct.balances) (lines.get(b.item_id) ?? lines.set(b.item_id, []).get(b.item_id)!).push(b);
  rows.forEach((r, n) => {
    const d = direct.items[n]!;
    if (r.itemId !== d.id) fail(`row ${n} is ${r.sku}, the SQL has ${d.sku}`);
    if (r.onHand !== d.on_hand || r.available !== d.available) fail(`${r.sku} on hand ${r.onHand}, the SQL ${d.on_hand}`);
    const ls = lines.get(r.itemId) ?? [];
    const sum = ls.reduce((s, l) => s.plus(dec(l.on_hand)), dec("0"));
    if (plain(sum) !== r.onHand) fail(`${r.sku} on hand ${r.onHand}, its lots sum to ${plain(sum)}`);
    if (r.lots.map((l) => l.lotId).join() !== ls.map((l) => l.lot_id).join()) fail(`${r.sku} lots`);
    if (r.parLevel !== d.par_level) fail(`${r.sku} par level`);
  });
  return { rows: rows.length, lots: direct.balances.length };
}

async function measure(label: string, knex: Knex, ids: Ids) {
  const actor = await loadCurrentUser(ids.user);
  if (!actor) throw new Error("bench user missing");
  const code = ids.kitchens[0]!.code;
  const api: number[] = [];
  const sql: number[] = [];
  let agreed = { rows: 0, lots: 0 };
  for (let i = 0; i < size.warmups + size.runs; i++) {
    const a = await timed(() => getStock(actor, code));
    const d = await timed(() => directSql(knex, ids.company, code));
    if (i === 0 || i === size.warmups + size.runs - 1) agreed = assertAgree(a.value, d.value);
    if (i >= size.warmups) {
      api.push(a.ms);
      sql.push(d.ms);
    }
  }
  api.sort((x, y) => x - y);
  sql.sort((x, y) => x - y);
  const f = (ms: number) => `${ms.toFixed(1)} ms`;
  console.log(`[bench] ${label}: GET /api/stock?kitchen=${code} (${fmt(agreed.rows)} items, ${fmt(agreed.lots)} lot lines; the API and the SQL agree), ${size.runs} runs after ${size.warmups} warm-up(s)`);
  console.log(`[bench]   getStock    p50 ${f(percentile(api, 50))}  p95 ${f(percentile(api, 95))}`);
  console.log(`[bench]   direct SQL  p50 ${f(percentile(sql, 50))}  p95 ${f(percentile(sql, 95))}`);
  console.log(`[bench]   ratio       p50 ${(percentile(api, 50) / percentile(sql, 50)).toFixed(2)}x  p95 ${(percentile(api, 95) / percentile(sql, 95)).toFixed(2)}x`);
}

async function diskUsed(knex: Knex, label: string) {
  const r = (await knex.raw<{ rows: { db: string; movements: string; balances: string }[] }>(
    `select pg_database_size(current_database()) as db, pg_total_relation_size('stock_movements') as movements, pg_total_relation_size('stock_balances') as balances`)).rows[0]!;
  console.log(`[bench] disk ${label}: database ${mb(r.db)} (stock_movements with indexes ${mb(r.movements)}, stock_balances ${mb(r.balances)})`);
}

/** Balances = per-(kitchen, lot) sums of the movements, in one statement. */
async function computeBalances(knex: Knex, companyId: string) {
  const t = await timed(() => knex.raw(
    `insert into stock_balances (company_id, kitchen_id, item_id, lot_id, on_hand)
     select company_id, kitchen_id, item_id, lot_id, sum(delta) from stock_movements where company_id = ? group by company_id, kitchen_id, item_id, lot_id
     on conflict (kitchen_id, lot_id) do update set on_hand = excluded.on_hand, updated_at = now()`, [companyId]));
  const n = (await knex.raw<{ rows: { n: string }[] }>("select count(*) as n from stock_balances")).rows[0]!.n;
  console.log(`[bench] stock_balances = sum of movements per (kitchen, lot): ${fmt(Number(n))} rows in ${seconds(t.ms)} (one INSERT ... SELECT)`);
}

async function assertBalancesAreSums(knex: Knex) {
  const r = await knex.raw<{ rows: unknown[] }>(
    `select 1 from stock_balances b full join (select kitchen_id, lot_id, sum(delta) as total from stock_movements group by 1, 2) m
       on m.kitchen_id = b.kitchen_id and m.lot_id = b.lot_id
      where coalesce(b.on_hand, 0) <> coalesce(m.total, 0) or b.on_hand < 0 limit 1`);
  if (r.rows.length) throw new Error("a balance differs from the sum of its movements");
}

// ---------------------------------------------------------------------------------------------

const admin = knexFactory({ client: "pg", connection: adminUrl.toString(), pool: { min: 0, max: 1 } });
let knex: Knex | undefined;
let client: pg.Client | undefined;
const began = performance.now();
try {
  await admin.raw("create database ?? owner ??", [dbName, appUrl.username]);
  knex = knexFactory({ client: "pg", connection: benchUrl, pool: { min: 0, max: 4 } });
  await knex.migrate.latest({ directory: "db/migrations", loadExtensions: [".ts"] });
  const dataDir = (await admin.raw<{ rows: { data_directory: string }[] }>("show data_directory")).rows[0]!.data_directory;
  console.log(`[bench] BENCH_SIZE=${sizeName}: ${size.kitchens} kitchens, ${fmt(size.items)} items, ${fmt(size.lots)} lots, ${fmt(size.movements)} movements, then ${fmt(size.grownTo)} (database ${dbName})`);

  // company, kitchens, the user who reads (a manager sees every kitchen), some par levels
  const [company] = await knex("companies").insert({ name: "Bench Larder", time_zone: "Europe/London", currency: "GBP" }).returning<{ id: string }[]>("id");
  const kitchens = await knex("kitchens")
    .insert(Array.from({ length: size.kitchens }, (_, i) => ({ company_id: company!.id, code: `K${String(i + 1).padStart(2, "0")}`, name: `Kitchen ${i + 1}` })))
    .returning<{ id: string; code: string }[]>(["id", "code"]);
  kitchens.sort((a, b) => a.code.localeCompare(b.code));
  const [user] = await knex("app_users").insert({ company_id: company!.id, email: `bench-${dbName}@bench.test`, name: "Bench Manager", role: "manager" }).returning<{ id: string }[]>("id");
  const rnd = generator(7);
  const ids: Ids = {
    company: company!.id,
    user: user!.id,
    kitchens,
    items: Array.from({ length: size.items }, (_, i) => ({ id: randomUUID(), category: i % 10 === 0 ? "cure" : i % 10 < 3 ? "casing" : i % 10 < 8 ? "spice" : "ingredient" })),
    lots: [],
  };
  ids.lots = Array.from({ length: size.lots }, (_, n) => ({
    id: randomUUID(), itemId: ids.items[n % size.items]!.id, home: (n * 7 + rnd.int(0, 3)) % size.kitchens, cost: `0.${String(rnd.int(1, 999_999)).padStart(6, "0")}`,
  }));

  client = new pg.Client({ connectionString: benchUrl });
  await client.connect();
  const report = (what: string, r: { rows: number; ms: number }) =>
    console.log(`[bench] COPY ${what}: ${fmt(r.rows)} rows in ${seconds(r.ms)} (${fmt(r.rows / (r.ms / 1000))} rows/s)`);
  report("items", await copyRows(client, "items", ITEM_COLUMNS, itemRows(ids)));
  report("lots", await copyRows(client, "lots", LOT_COLUMNS, lotRows(ids)));
  report("movements", await copyRows(client, "stock_movements", MOVEMENT_COLUMNS, firstMovements(ids, size.movements)));
  await computeBalances(knex, ids.company);
  await knex.raw(
    `insert into stock_levels (company_id, kitchen_id, item_id, par_level, reorder_point)
     select ?, k.id, i.id, 5000, 1000 from kitchens k cross join items i where k.company_id = ? and i.company_id = ? and hashtext(k.id::text || i.id::text) % 2 = 0`,
    [ids.company, ids.company, ids.company]);
  if (sizeName === "tiny") await assertBalancesAreSums(knex);
  await knex.raw("vacuum analyze"); // what autovacuum would have done by now
  await diskUsed(knex, `at ${fmt(size.movements)} movements`);
  await measure(`${fmt(size.movements)} movements`, knex, ids);

  // grow the ledger; balances are recomputed from all of it
  const free = await statfs(dataDir);
  const freeBytes = free.bavail * free.bsize;
  const growth = size.grownTo - size.movements;
  if (freeBytes < MIN_FREE_BYTES_TO_GROW) {
    console.log(`[bench] growth to ${fmt(size.grownTo)} movements skipped: ${(freeBytes / 1024 ** 3).toFixed(1)} GB free at ${dataDir}, under the 10 GB this step needs`);
  } else {
    report(`${fmt(growth)} more movements`, await copyRows(client, "stock_movements", MOVEMENT_COLUMNS, moreMovements(ids, growth, 11)));
    await computeBalances(knex, ids.company);
    if (sizeName === "tiny") await assertBalancesAreSums(knex);
    await knex.raw("vacuum analyze");
    await diskUsed(knex, `at ${fmt(size.grownTo)} movements`);
    await measure(`${fmt(size.grownTo)} movements`, knex, ids);
  }
  console.log(`[bench] done in ${seconds(performance.now() - began)}`);
} finally {
  await client?.end();
  await closeDb();
  await knex?.destroy();
  await admin.raw("drop database if exists ?? with (force)", [dbName]);
  await admin.destroy();
}
