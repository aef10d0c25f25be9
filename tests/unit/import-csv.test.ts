// lib/import: sniffCsv and importCsv over real files as spreadsheets save them
// (tests/fixtures/csv, described in its README) and over generated ones.
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { detectDelimiter, importCsv, MAX_RECORD_CHARS, proposeMapping, sniffCsv, type ImportRow } from "@/lib/import";
import { detectEncoding } from "@/lib/import/encoding";
import { csvMapping, type CsvMappingInput } from "@/lib/validation/imports";
import { TEST_FIELDS } from "../support/import-fields";

type Key = (typeof TEST_FIELDS)[number]["key"];
const fixture = (name: string) => path.join(import.meta.dirname, "../fixtures/csv", name);
const scratch = mkdtempSync(path.join(tmpdir(), "hl-import-"));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));
const file = (name: string, content: string | Buffer) => {
  const p = path.join(scratch, name);
  writeFileSync(p, content);
  return p;
};

const BY_HEADER = { sku: { header: "SKU" }, description: { header: "Description" }, price: { header: "Unit price" } };

async function run(p: string, mapping: CsvMappingInput, opts: { maxErrors?: number } = {}) {
  const rows: [number, ImportRow<Key>][] = [];
  const summary = await importCsv(p, TEST_FIELDS, csvMapping.parse(mapping), { ...opts, onRow: (row, n) => void rows.push([n, row]) });
  return { rows, summary };
}

describe("encodings", () => {
  it("UTF-8 with a byte-order mark: the mark is not part of the first header", async () => {
    const s = await sniffCsv(fixture("utf8-bom-comma.csv"));
    expect(s).toMatchObject({ encoding: "utf-8", bom: true, delimiter: ",", headers: ["SKU", "Description", "Unit price", "Pack size", "Valid from"] });
    const { rows, summary } = await run(fixture("utf8-bom-comma.csv"), { columns: proposeMapping(s.headers, TEST_FIELDS).columns });
    expect(summary).toMatchObject({ rows: 3, accepted: 3, rejected: 0, errors: [], complete: true });
    expect(rows[0]).toEqual([2, { sku: "PEP-BLK-1K", description: "Black pepper, ground", price: "12.40", pack: "1", validFrom: "2026-12-01" }]);
    expect(rows[1]![1].description).toBe("Nutmeg (ground) – Grenada"); // U+2013 survives
  });

  it("Windows-1252 bytes (not valid UTF-8) are read as Windows-1252: ü, ß, °, É", async () => {
    const s = await sniffCsv(fixture("windows-1252-semicolon.csv"));
    expect(s).toMatchObject({ encoding: "windows-1252", bom: false, delimiter: ";", headers: ["Artikelnummer", "Bezeichnung", "Preis", "Menge", "Gültig ab"] });
    const { rows, summary } = await run(fixture("windows-1252-semicolon.csv"), {
      columns: proposeMapping(s.headers, TEST_FIELDS).columns, decimal: ",", thousands: ".", dateFormat: "dd.MM.yyyy",
    });
    expect(summary).toMatchObject({ rows: 4, accepted: 4, errors: [], encoding: "windows-1252" });
    expect(rows.map(([, r]) => r.description)).toEqual(["Kümmel ganz", "Paprika edelsüß", "Schweinedarm 28/30 °Kaliber", "Épices à saucisson"]);
    expect(rows.map(([, r]) => r.price)).toEqual(["7.85", "9.10", "64.00", "1234.50"]);
    expect(rows[3]![1]).toMatchObject({ pack: "10", validFrom: "2026-12-15" });
  });

  it("UTF-16 with its mark (Excel's Unicode text), tab separated", async () => {
    const s = await sniffCsv(fixture("utf16le-tab.txt"));
    expect(s).toMatchObject({ encoding: "utf-16le", bom: true, delimiter: "\t", headers: ["SKU", "Description", "Unit price"] });
    const { rows } = await run(fixture("utf16le-tab.txt"), { columns: BY_HEADER });
    expect(rows).toEqual([[2, { sku: "FEN-1", description: "Fenouil épicé", price: "3.75", pack: null, validFrom: null }]]);
  });

  it("a UTF-8 character cut by the end of a read buffer is still UTF-8; one stray byte anywhere makes the file Windows-1252", async () => {
    const line = "SKU,Description,Unit price\n" + "X,é é é é,1\n".repeat(30_000); // > 256 KiB: many buffers
    expect(await detectEncoding(file("long-utf8.csv", line))).toEqual({ encoding: "utf-8", bom: false });
    const bytes = Buffer.concat([Buffer.from(line), Buffer.from([0x58, 0x2c, 0xb0, 0x2c, 0x31, 0x0a])]); // "X,°,1" in Windows-1252 at the very end
    expect(await detectEncoding(file("late-1252.csv", bytes))).toEqual({ encoding: "windows-1252", bom: false });
  });
});

describe("delimiters", () => {
  it("finds semicolons even when the numbers have decimal commas", () => {
    expect(detectDelimiter("Code;Name;Price\nC1;Pepper;1,50\nC2;Salt;2,00\n")).toBe(";");
  });
  it("finds commas when a text cell holds a semicolon", () => {
    expect(detectDelimiter('SKU,Description,Price\nA,"Pepper; black",1.50\nB,Salt,2.00\n')).toBe(",");
    expect(detectDelimiter("SKU,Description,Price\nA,Pepper; black,1.50\nB,Salt,2.00\n")).toBe(",");
  });
  it("finds tabs and pipes, and falls back to comma for a single column", () => {
    expect(detectDelimiter("a\tb\tc\n1\t2\t3\n")).toBe("\t");
    expect(detectDelimiter("a|b\n1|2\n")).toBe("|");
    expect(detectDelimiter("sku\nA\nB\n")).toBe(",");
  });
  it("a delimiter in the mapping overrides detection", async () => {
    const p = file("pipe-in-text.csv", "SKU;Description;Unit price\nA;x|y|z|w|v;1\n");
    const { rows } = await run(p, { columns: BY_HEADER, delimiter: ";" });
    expect(rows[0]![1]).toMatchObject({ sku: "A", description: "x|y|z|w|v" });
  });
});

describe("real-file shapes", () => {
  it("semicolons, decimal comma and thousands dot; a bad number names row and column as a spreadsheet shows them", async () => {
    const s = await sniffCsv(fixture("semicolon-decimal-comma.csv"));
    const { rows, summary } = await run(fixture("semicolon-decimal-comma.csv"), {
      columns: proposeMapping(s.headers, TEST_FIELDS).columns, decimal: ",", thousands: ".", dateFormat: "dd.MM.yyyy",
    });
    expect(summary).toMatchObject({ rows: 18, accepted: 17, rejected: 1, complete: true, delimiter: ";" });
    expect(summary.errors).toEqual([
      { row: 14, column: "Price", field: "price", message: "row 14, column 'Price': '12,5.0' is not a number with decimal ',' and thousands '.'" },
    ]);
    expect(rows.find(([n]) => n === 5)![1].price).toBe("1234.50");
    expect(rows.map(([n]) => n)).not.toContain(14);
  });

  it("quoted cells keep commas, line breaks (CRLF and LF) and doubled quotes; rows count as a spreadsheet shows them", async () => {
    const { rows, summary } = await run(fixture("quoted-multiline.csv"), { columns: BY_HEADER });
    expect(summary).toMatchObject({ rows: 3, accepted: 3, blankRows: 4, errors: [], warnings: [] });
    expect(rows).toEqual([
      [2, { sku: "HOG-32", description: "Hog casing 32/35, salted\r\nhank of 91.44 m", price: "38.00", pack: null, validFrom: null }],
      [3, { sku: "SHEEP-22", description: 'Sheep casing "A" grade, 22/24', price: "41.50", pack: null, validFrom: null }],
      // row 4 is a row of empty cells; the file then ends in blank lines
      [5, { sku: "CURE-1", description: "Cure #1\n6.25 % nitrite\npink", price: "6.10", pack: null, validFrom: null }],
    ]);
  });

  it("a quote that never closes stops the import at its row", async () => {
    const { rows, summary } = await run(fixture("broken-quoting.csv"), { columns: BY_HEADER });
    expect(rows.map(([n]) => n)).toEqual([2]);
    expect(summary.complete).toBe(false);
    expect(summary.errors).toEqual([{ row: 3, column: null, message: expect.stringMatching(/^row 3: a quoted cell starts in this row and its closing quote never comes/) }]);
  });

  it("text after a closing quote stops the import at its row (papaparse would join the next lines into it)", async () => {
    const { rows, summary } = await run(fixture("invalid-quotes.csv"), { columns: BY_HEADER });
    expect(rows.map(([n]) => n)).toEqual([2]);
    expect(summary.errors).toEqual([{ row: 3, column: null, message: expect.stringMatching(/^row 3: a quoted cell in this row has text after its closing quote/) }]);
  });

  it("a quote that never closes in a big file stops once the open cell passes the record limit, naming its row", async () => {
    const body = "SKU,Description,Unit price\nA,ok,1\nB,\"open," + "x,2\n".repeat(Math.ceil((MAX_RECORD_CHARS * 1.5) / 4));
    const started = performance.now();
    const { summary } = await run(file("runaway.csv", body), { columns: BY_HEADER });
    expect(summary.complete).toBe(false);
    expect(summary.errors).toEqual([{ row: 3, column: null, message: expect.stringMatching(/^row 3: this row runs on for more than 1,000,000 characters/) }]);
    expect(performance.now() - started).toBeLessThan(5000);
  });

  it("no matching columns: the proposal says so and the import names the missing choice", async () => {
    const s = await sniffCsv(fixture("no-matching-columns.csv"));
    const proposal = proposeMapping(s.headers, TEST_FIELDS);
    expect(proposal.problem).toMatch(/^No matching columns: none of this file's columns \("Contact", "Phone", "E-mail"\)/);
    const { summary } = await run(fixture("no-matching-columns.csv"), { columns: proposal.columns });
    expect(summary).toMatchObject({ rows: 0, complete: false, errors: [{ row: 1, column: null, message: "row 1: no column is chosen for Supplier code" }] });
  });

  it("a saved mapping whose column is gone from the file names the columns the file has", async () => {
    const { summary } = await run(fixture("utf8-bom-comma.csv"), { columns: { ...BY_HEADER, price: { header: "Price per kg" } } });
    expect(summary.errors[0]!.message).toBe(
      'row 1: there is no column "Price per kg" for Unit price (the columns are "SKU", "Description", "Unit price", "Pack size", "Valid from"); was the file\'s layout changed?',
    );
  });

  it("formula-like text cells are data: kept exactly as sent", async () => {
    const { rows } = await run(fixture("formula-text.csv"), { columns: BY_HEADER });
    expect(rows.map(([, r]) => [r.sku, r.description])).toEqual([
      ["=1+1", '=HYPERLINK("http://example.test","click")'],
      ["+49-LINE", "@SUM(A1:A2)"],
      ["-DRY", "-2+3+cmd|' /C calc'!A0"],
    ]);
  });
});

describe("mapping options", () => {
  it("header matching tolerates case, spacing and punctuation; columns may be chosen by number", async () => {
    const p = file("loose.csv", "sku , DESCRIPTION,unit-price,extra\nA-1,Mace,2.5,x\n");
    const { rows } = await run(p, { columns: { sku: { header: "SKU" }, description: { column: 2 }, price: { header: "Unit price" } } });
    expect(rows).toEqual([[2, { sku: "A-1", description: "Mace", price: "2.5", pack: null, validFrom: null }]]);
  });

  it("a header further down (title lines above it) and a file without a header", async () => {
    const titled = file("titled.csv", "Price list winter 2026\n\nSKU,Description,Unit price\nA-1,Mace,2.5\n");
    const a = await run(titled, { headerRow: 3, columns: BY_HEADER });
    expect(a.rows).toEqual([[4, { sku: "A-1", description: "Mace", price: "2.5", pack: null, validFrom: null }]]);
    const bare = file("bare.csv", "A-1,Mace,2.5\nB-2,Sage,3\n");
    const b = await run(bare, { headerRow: 0, columns: { sku: { column: 1 }, price: { column: 3 } } });
    expect(b.rows.map(([n, r]) => [n, r.sku, r.price])).toEqual([[1, "A-1", "2.5"], [2, "B-2", "3"]]);
    expect(csvMapping.safeParse({ headerRow: 0, columns: { sku: { header: "SKU" } } }).success).toBe(false);
  });

  it("a repeated header must be chosen by number", async () => {
    const p = file("twice.csv", "SKU,Unit price,Unit price\nA,1,2\n");
    const { summary } = await run(p, { columns: { sku: { header: "SKU" }, price: { header: "Unit price" } } });
    expect(summary.errors[0]!.message).toBe('row 1: the column "Unit price" appears 2 times (columns 2 and 3); choose Unit price by column number');
  });

  it("required cells, every bad cell of a row, extra cells as one warning", async () => {
    const p = file("mixed.csv", "SKU,Description,Unit price,Valid from\nA,Mace,2.5,2026-12-01\n,Sage,x,2026-02-30\nB,Thyme,3,2026-12-02,surplus\nC,Dill,4,2026-12-03,surplus\n");
    const { rows, summary } = await run(p, { columns: { ...BY_HEADER, validFrom: { header: "Valid from" } } });
    expect(rows.map(([n]) => n)).toEqual([2, 4, 5]);
    expect(summary.errors.map((e) => e.message)).toEqual([
      "row 3, column 'SKU': empty; Supplier code is required",
      "row 3, column 'Unit price': 'x' is not a number with decimal '.' and no thousands separator",
      "row 3, column 'Valid from': '2026-02-30' is not a real date in the form yyyy-MM-dd",
    ]);
    expect(summary.warnings.map((w) => w.message)).toEqual(["row 4 and 1 more: more cells than the header row has columns (4); the extra cells are ignored"]);
  });

  it("onRow may refuse a row or warn about it, naming the field's column; it is awaited", async () => {
    const p = file("refuse.csv", "SKU,Description,Unit price\nA,Mace,2.5\nZZZ,Unknown,1\nB,Sage,0\n");
    const seen: string[] = [];
    const summary = await importCsv(p, TEST_FIELDS, csvMapping.parse({ columns: BY_HEADER }), {
      onRow: async (row) => {
        await new Promise((r) => setTimeout(r, 5));
        seen.push(row.sku!);
        if (row.sku === "ZZZ") return [{ field: "sku", message: "no item of this supplier has the code ZZZ" }];
        if (row.price === "0") return [{ field: "price", message: "a price of 0", warning: true }];
      },
    });
    expect(seen).toEqual(["A", "ZZZ", "B"]);
    expect(summary).toMatchObject({ rows: 3, accepted: 2, rejected: 1 });
    expect(summary.errors).toEqual([{ row: 3, column: "SKU", field: "sku", message: "row 3, column 'SKU': no item of this supplier has the code ZZZ" }]);
    expect(summary.warnings).toEqual([{ row: 4, column: "Unit price", field: "price", message: "row 4, column 'Unit price': a price of 0" }]);
  });

  it("stops after maxErrors and says so", async () => {
    const p = file("all-bad.csv", "SKU,Description,Unit price\n" + "A,x,bad\n".repeat(50_000));
    const { summary } = await run(p, { columns: BY_HEADER }, { maxErrors: 10 });
    expect(summary.errors).toHaveLength(10);
    expect(summary).toMatchObject({ complete: false, rows: 10, rejected: 10 });
    expect(summary.warnings.at(-1)!.message).toBe("stopped reading at row 11 after 10 errors; correct these and send the file again");
  });

  it("an empty file and a header-only file", async () => {
    expect((await run(file("empty.csv", ""), { columns: BY_HEADER })).summary.errors).toEqual([{ row: 1, column: null, message: "the file is empty" }]);
    const headerOnly = await run(file("header-only.csv", "SKU,Description,Unit price\r\n\r\n"), { columns: BY_HEADER });
    expect(headerOnly.summary).toMatchObject({ complete: true, rows: 0, errors: [] });
    expect(headerOnly.summary.warnings.map((w) => w.message)).toEqual(["the file has no rows below its header"]);
  });

  it("streams a 100,000-row file through, row numbers intact", async () => {
    const lines = ["SKU;Description;Unit price"];
    for (let i = 0; i < 100_000; i++) lines.push(`S${i};"Spice; no. ${i}";${i},${String(i % 100).padStart(2, "0")}`);
    const p = file("big.csv", lines.join("\r\n") + "\r\n");
    let count = 0;
    let last: [number, ImportRow<Key>] | null = null;
    const summary = await importCsv(p, TEST_FIELDS, csvMapping.parse({ columns: BY_HEADER, decimal: "," }), {
      onRow: (row, n) => {
        count++;
        last = [n, row];
      },
    });
    expect(summary).toMatchObject({ rows: 100_000, accepted: 100_000, errors: [], delimiter: ";" });
    expect(count).toBe(100_000);
    expect(last).toEqual([100_001, { sku: "S99999", description: "Spice; no. 99999", price: "99999.99", pack: null, validFrom: null }]);
  });
});

describe("sniffCsv for the mapping screen", () => {
  it("gives the first 10 non-blank rows under the header and a name for every column", async () => {
    const lines = ["SKU,,Unit price"];
    for (let i = 1; i <= 15; i++) lines.push(i === 3 ? "" : `S${i},d${i},${i}`);
    const s = await sniffCsv(file("sample.csv", lines.join("\n")));
    expect(s.headers).toEqual(["SKU", "", "Unit price"]);
    expect(s.columnNames).toEqual(["SKU", "Column 2", "Unit price"]);
    expect(s.sampleRows).toHaveLength(10);
    expect(s.sampleRows[0]).toEqual(["S1", "d1", "1"]);
    expect(s.sampleRows[2]).toEqual(["S4", "d4", "4"]);
  });
});
