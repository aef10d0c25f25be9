// Benchmark: stream a generated price-list CSV through importCsv (parse + validate only: detect
// encoding, detect the delimiter, read every row into the fields' kinds, hand it to onRow), and
// print rows per second and the peak memory. The file is what a European supplier's export looks
// like: Windows-1252, semicolons, decimal comma with thousands dot, dd.MM.yyyy, quoted text with
// embedded semicolons, CRLF. Checks that every row arrived with the exact values written (it
// throws otherwise, so the script cannot rot). Needs no database.
//
//   BENCH_SIZE=tiny|full node --conditions=react-server --import tsx tests/bench/csv-import.ts
//   tiny (npm test): 2,000 rows; full: 500,000 rows (about 30 MB, past the 25 MB upload limit)
// env: BENCH_SIZE (tiny), BENCH_ROWS (overrides the size's row count)
import { createWriteStream, mkdtempSync, rmSync, statSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { once } from "node:events";
import { importCsv } from "../../lib/import";
import { csvMapping } from "../../lib/validation/imports";
import { TEST_FIELDS } from "../support/import-fields";

const SIZES = { tiny: 2_000, full: 500_000 } as const;
const sizeName = (process.env.BENCH_SIZE ?? "tiny") as keyof typeof SIZES;
if (!(sizeName in SIZES)) throw new Error(`BENCH_SIZE must be one of ${Object.keys(SIZES).join(", ")}, not ${sizeName}`);
const rows = Number(process.env.BENCH_ROWS ?? SIZES[sizeName]);

const dir = mkdtempSync(path.join(tmpdir(), "hl-bench-csv-"));
const file = path.join(dir, "price-list.csv");
try {
  // the file, written in Windows-1252 (latin1 covers every character used here: ü, é, °)
  const out = createWriteStream(file);
  const write = async (s: string) => {
    if (!out.write(Buffer.from(s, "latin1"))) await once(out, "drain");
  };
  // row i: price (i x 1013) with two decimals i mod 100, grouped by dots ("1.013,01"); pack i mod 50 + 0,5
  const grouped = (n: number) => String(n).replace(/\B(?=(\d{3})+$)/g, ".");
  const cents = (i: number) => String(i % 100).padStart(2, "0");
  const price = (i: number) => `${grouped(i * 1013)},${cents(i)}`;
  const expectedPrice = (i: number) => `${i * 1013}.${cents(i)}`;
  await write("Artikelnummer;Bezeichnung;Preis;Menge;Gültig ab\r\n");
  for (let i = 1; i <= rows; i++) {
    const day = String((i % 28) + 1).padStart(2, "0");
    const month = String((i % 12) + 1).padStart(2, "0");
    await write(`K-${i};"Kümmel; Sorte ${i} (°${i % 40})";${price(i)};${i % 50},5;${day}.${month}.2027\r\n`);
  }
  out.end();
  await once(out, "finish");
  const megabytes = statSync(file).size / 1024 / 1024;

  const mapping = csvMapping.parse({
    columns: { sku: { header: "Artikelnummer" }, description: { header: "Bezeichnung" }, price: { header: "Preis" }, pack: { header: "Menge" }, validFrom: { header: "Gültig ab" } },
    decimal: ",", thousands: ".", dateFormat: "dd.MM.yyyy",
  });
  let seen = 0;
  let peakRss = process.memoryUsage().rss;
  const started = performance.now();
  const summary = await importCsv(file, TEST_FIELDS, mapping, {
    onRow(row, rowNumber) {
      const i = rowNumber - 1;
      seen++;
      if (row.sku !== `K-${i}` || row.price !== expectedPrice(i) || row.pack !== `${i % 50}.5` || !row.description?.startsWith(`Kümmel; Sorte ${i} (°`)) {
        throw new Error(`row ${rowNumber} came out as ${JSON.stringify(row)}`);
      }
      if (i % 10_000 === 0) peakRss = Math.max(peakRss, process.memoryUsage().rss);
    },
  });
  const seconds = (performance.now() - started) / 1000;
  if (summary.errors.length || seen !== rows || summary.rows !== rows || summary.encoding !== "windows-1252" || summary.delimiter !== ";") {
    throw new Error(`expected ${rows} clean rows, got ${seen}: ${JSON.stringify({ ...summary, errors: summary.errors.slice(0, 3) })}`);
  }
  console.log(`[bench] BENCH_SIZE=${sizeName}: ${rows.toLocaleString("en")} rows, ${megabytes.toFixed(1)} MB (${summary.encoding}, '${summary.delimiter}')`);
  console.log(`[bench] importCsv: ${seconds.toFixed(2)} s, ${Math.round(rows / seconds).toLocaleString("en")} rows/s, ${(megabytes / seconds).toFixed(1)} MB/s; peak RSS ${(peakRss / 1024 / 1024).toFixed(0)} MB`);
} finally {
  rmSync(dir, { recursive: true, force: true });
}
