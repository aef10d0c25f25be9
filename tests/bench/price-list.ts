// Benchmark: a supplier's price list of N rows applied through the real import (runPriceList in
// lib/data/price-lists.ts: sniff and propose the mapping, stream the file through papaparse, check
// every row against the supplier's items, and while reading send the good rows in batches that
// are compared with the price in effect and written; then record the import),
// against a raw PostgreSQL COPY of the same rows into a scratch table shaped like
// supplier_item_prices (same columns, defaults, checks, indexes and foreign keys; and once more
// without the foreign keys), in the same run. Prints the times and the ratio (raw COPY time /
// import time: the share of raw COPY throughput the import reaches).
//
// In a database of its own (tests/bench/bench-db.ts): one company and supplier with N supplier
// items over 1,000 spices in grams, each with an earlier price, so every row is a change (a
// second price list, the usual case). The file: UTF-8, comma, "SKU,Description,Pack price,Pack
// size,Unit", a quoted description with a comma on every row, pack size and unit on every row (so
// every pack is converted and compared too). After the import it checks that every price landed
// with the exact value written, and that the raw copy holds every row (it throws otherwise).
//
//   BENCH_SIZE=tiny|full node --conditions=react-server --import tsx tests/bench/price-list.ts
//   tiny (npm test): 2,000 rows; full: 100,000 rows (about 6 MB)
// env: DATABASE_URL (any database of the cluster), BENCH_SIZE (tiny), BENCH_ROWS (overrides the row count)
import { once } from "node:events";
import { createHash } from "node:crypto";
import { createWriteStream, mkdtempSync, readFileSync, rmSync, statSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { Readable } from "node:stream";
import { pipeline } from "node:stream/promises";
import type pg from "pg";
import { from as copyFrom } from "pg-copy-streams";
import { benchDatabase } from "./bench-db";

const SIZES = { tiny: 2_000, full: 100_000 } as const;
const sizeName = (process.env.BENCH_SIZE ?? "tiny") as keyof typeof SIZES;
if (!(sizeName in SIZES)) throw new Error(`BENCH_SIZE must be one of ${Object.keys(SIZES).join(", ")}, not ${sizeName}`);
const rows = Number(process.env.BENCH_ROWS ?? SIZES[sizeName]);
const ITEMS = 1_000;

const fmt = (n: number) => Math.round(n).toLocaleString("en-US");
const cents = (i: number) => String(i % 100).padStart(2, "0");
/** the earlier price of row i: a few euros, two decimals; the list raises a third, lowers a third, keeps a third */
const oldPrice = (i: number) => `${(i % 400) + 2}.${cents(i)}`;
const newPrice = (i: number) => `${(i % 400) + [3, 1, 2][i % 3]!}.${cents(i)}`;
const packGrams = (i: number) => [250, 500, 1000, 5000][i % 4]!;

/** COPY ... FROM STDIN (text format) of the lines a generator yields, in chunks of about 256 KiB. */
async function copyLines(client: pg.PoolClient, sql: string, lines: Iterable<string>): Promise<void> {
  function* chunks() {
    let buf = "";
    for (const l of lines) {
      buf += l;
      if (buf.length > 262_144) {
        yield buf;
        buf = "";
      }
    }
    if (buf) yield buf;
  }
  await pipeline(Readable.from(chunks()), client.query(copyFrom(sql)));
}

const bench = benchDatabase();
const knex = await bench.create();
const dir = mkdtempSync(path.join(tmpdir(), "hl-bench-price-list-"));
try {
  const { loadCurrentUser } = await import("../../lib/data/users");
  const { runPriceList } = await import("../../lib/data/price-lists");
  const { recordUpload } = await import("../../lib/data/uploads");

  // the company, a buyer, a supplier with N items (loaded with COPY: setup, not timed)
  const [company] = await knex("companies").insert({ name: "Bench Provisions", time_zone: "Europe/Berlin", currency: "EUR" }).returning<{ id: string }[]>("id");
  const companyId = company!.id;
  const [user] = await knex("app_users").insert({ company_id: companyId, email: `buyer-${bench.name}@bench.test`, name: "Bench Buyer", role: "buyer" }).returning<{ id: string }[]>("id");
  const buyer = (await loadCurrentUser(user!.id))!;
  const [supplier] = await knex("suppliers").insert({ company_id: companyId, name: "Bench Spice Wholesale", lead_time_days: 2 }).returning<{ id: string }[]>("id");
  const items: { id: string }[] = await knex("items")
    .insert(Array.from({ length: ITEMS }, (_, i) => ({ company_id: companyId, sku: `SP-${i}`, name: `Spice ${i}`, category: "spice", stock_unit: "g" })))
    .returning("id");
  const ids: string[] = (await knex.raw<{ rows: { id: string }[] }>(`select gen_random_uuid()::text as id from generate_series(1, ?)`, [rows])).rows.map((r) => r.id);
  const conn = (await knex.client.acquireConnection()) as pg.PoolClient;
  try {
    await copyLines(conn, "copy supplier_items (id, company_id, supplier_id, item_id, sku, description, pack_label, pack_quantity, pack_unit, pack_size_stock) from stdin",
      (function* () {
        for (let i = 0; i < rows; i++) {
          const g = packGrams(i);
          yield `${ids[i]}\t${companyId}\t${supplier!.id}\t${items[i % ITEMS]!.id}\tBS-${i}\tSpice ${i}\t${g} g bag\t${g}\tg\t${g}\n`;
        }
      })());
    await copyLines(conn, "copy supplier_item_prices (company_id, supplier_item_id, pack_price, effective_from) from stdin",
      (function* () {
        for (let i = 0; i < rows; i++) yield `${companyId}\t${ids[i]}\t${oldPrice(i)}\t2027-01-01\n`;
      })());
  } finally {
    await knex.client.releaseConnection(conn);
  }
  await knex.raw("analyze supplier_items; analyze supplier_item_prices");

  // the file
  const file = path.join(dir, "price-list.csv");
  const out = createWriteStream(file);
  const write = async (s: string) => {
    if (!out.write(s)) await once(out, "drain");
  };
  await write("SKU,Description,Pack price,Pack size,Unit\r\n");
  for (let i = 0; i < rows; i++) {
    const g = packGrams(i);
    await write(`BS-${i},"Spice ${i}, ground, ${g} g",${newPrice(i)},${g >= 1000 ? g / 1000 : g},${g >= 1000 ? "kg" : "g"}\r\n`);
  }
  out.end();
  await once(out, "finish");
  const bytes = readFileSync(file);
  const megabytes = statSync(file).size / 1024 / 1024;
  const sha256 = createHash("sha256").update(bytes).digest("hex");
  const { upload } = await recordUpload(buyer, "price_list", {
    field: "file", companyId, path: file, sha256, size: bytes.length, filename: "price-list.csv", mediaType: "text/csv", type: "csv",
  });

  // 1. raw COPY of the same rows (already resolved to supplier items, in COPY's own text format) into
  //    scratch tables like supplier_item_prices: the same columns, defaults, checks and indexes,
  //    (a) with its two foreign keys too (to supplier_items, and to an import row, as the import's
  //    rows have), which is what writing these rows into this table costs: the main figure;
  //    (b) without foreign keys, shown beside it.
  const [otherSupplier] = await knex("suppliers").insert({ company_id: companyId, name: "Bench Baseline", lead_time_days: 2 }).returning<{ id: string }[]>("id");
  const [baselineImport] = await knex("price_list_imports")
    .insert({
      company_id: companyId, supplier_id: otherSupplier!.id, upload_id: upload.id, mapping: "{}", effective_from: "2027-03-01",
      rows: 0, priced: 0, raised: 0, lowered: 0, unchanged: 0, first_prices: 0, skipped: 0, warning_count: 0,
    })
    .returning<{ id: string }[]>("id");
  const like = "(like supplier_item_prices including defaults including constraints including indexes)";
  await knex.raw(`create table bench_copy_fk ${like}`);
  await knex.raw(`alter table bench_copy_fk
    add foreign key (company_id, supplier_item_id) references supplier_items (company_id, id),
    add foreign key (company_id, price_list_import_id) references price_list_imports (company_id, id)`);
  await knex.raw(`create table bench_copy_bare ${like}`);
  const lines: string[] = [];
  for (let i = 0; i < rows; i++) lines.push(`${companyId}\t${ids[i]}\t${newPrice(i)}\t2027-03-01\t${baselineImport!.id}\tSpice ${i}, ground, ${packGrams(i)} g\n`);
  const rawCopy = async (table: string): Promise<number> => {
    const conn = (await knex.client.acquireConnection()) as pg.PoolClient;
    try {
      const started = performance.now();
      await copyLines(conn, `copy ${table} (company_id, supplier_item_id, pack_price, effective_from, price_list_import_id, listed_description) from stdin`, lines);
      const ms = performance.now() - started;
      const copied = await knex(table).count<{ count: string }[]>("* as count");
      if (Number(copied[0]!.count) !== rows) throw new Error(`raw COPY wrote ${copied[0]!.count} of ${rows} rows into ${table}`);
      return ms;
    } finally {
      await knex.client.releaseConnection(conn);
    }
  };
  const bareMs = await rawCopy("bench_copy_bare");
  const rawMs = await rawCopy("bench_copy_fk");

  // 2. the preview of the same file (parse + validate + compare; nothing written), for the note
  const previewStarted = performance.now();
  const previewed = await runPriceList(buyer, supplier!.id, { upload: { ...upload, duplicate: false }, filePath: file, effectiveFrom: "2027-03-01", dryRun: true });
  const previewMs = performance.now() - previewStarted;
  if (previewed.status !== 200 || previewed.body.summary.priced !== rows) throw new Error(`the preview read ${previewed.body.summary.priced} of ${rows} rows`);

  // 3. the import: parse + validate + write, as POST /api/suppliers/{id}/price-lists does after the upload
  let peakRss = process.memoryUsage().rss;
  const sampler = setInterval(() => (peakRss = Math.max(peakRss, process.memoryUsage().rss)), 50);
  const started = performance.now();
  const outcome = await runPriceList(buyer, supplier!.id, { upload: { ...upload, duplicate: false }, filePath: file, effectiveFrom: "2027-03-01", dryRun: false });
  const importMs = performance.now() - started;
  clearInterval(sampler);

  // checks: everything applied, every price exact
  const s = outcome.body.summary;
  if (outcome.status !== 201 || s.priced !== rows || s.errors !== 0 || s.raised + s.lowered + s.unchanged !== rows) {
    throw new Error(`expected ${rows} applied rows: ${JSON.stringify({ status: outcome.status, summary: s, errors: outcome.body.errors.slice(0, 3) })}`);
  }
  const stored: { sku: string; pack_price: string }[] = await knex("supplier_item_prices as p")
    .join("supplier_items as si", "si.id", "p.supplier_item_id")
    .where({ "p.price_list_import_id": outcome.body.import!.id, "p.effective_from": "2027-03-01" })
    .select("si.sku", knex.raw("trim_scale(p.pack_price)::text as pack_price"));
  if (stored.length !== rows) throw new Error(`${stored.length} of ${rows} prices stored`);
  for (const r of stored) {
    const i = Number(r.sku.slice(3));
    const want = newPrice(i).replace(/\.?0+$/, "");
    if (r.pack_price !== want) throw new Error(`${r.sku}: stored ${r.pack_price}, the file says ${newPrice(i)}`);
  }

  const secs = (ms: number) => `${(ms / 1000).toFixed(2)} s, ${fmt(rows / (ms / 1000))} rows/s`;
  console.log(`[bench] BENCH_SIZE=${sizeName}: ${fmt(rows)} rows, ${megabytes.toFixed(1)} MB (${fmt(s.raised)} up, ${fmt(s.lowered)} down, ${fmt(s.unchanged)} unchanged; database ${bench.name})`);
  console.log(`[bench] raw COPY, table like supplier_item_prices with its foreign keys: ${secs(rawMs)}`);
  console.log(`[bench] raw COPY, same table without foreign keys:                 ${secs(bareMs)}`);
  console.log(`[bench] price-list preview (parse + validate + changes, nothing written): ${secs(previewMs)}`);
  console.log(`[bench] price-list import (parse + validate + changes + write): ${secs(importMs)}; peak RSS ${(peakRss / 1024 / 1024).toFixed(0)} MB`);
  const target = sizeName === "full" ? "; target at least 0.33x" : "; at this size fixed costs dominate, the target is for BENCH_SIZE=full";
  console.log(`[bench] ratio: the import reaches ${(rawMs / importMs).toFixed(2)}x of raw COPY (${(bareMs / importMs).toFixed(2)}x of the bare COPY${target})`);
} finally {
  rmSync(dir, { recursive: true, force: true });
  await bench.drop(knex);
}
