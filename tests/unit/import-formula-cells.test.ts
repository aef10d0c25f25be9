// Formula-like text: kept as data on import (lib/import), neutralised on export (lib/csv.ts).
// Reference: OWASP, "CSV Injection": cells starting with = + - @ tab (0x09) or carriage return
// (0x0D) are run as formulas by spreadsheet programs; prefix them with a single quote.
import path from "node:path";
import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { csvCell, neutraliseFormula, toCsv } from "@/lib/csv";
import { importCsv } from "@/lib/import";
import { csvMapping } from "@/lib/validation/imports";
import { TEST_FIELDS } from "../support/import-fields";

describe("neutraliseFormula", () => {
  it("prefixes every OWASP formula start", () => {
    for (const s of ["=1+1", "+49 30 1234", "-DRY", "@SUM(A1:A2)", "\tTAB", "\rCR"]) expect(neutraliseFormula(s)).toBe(`'${s}`);
  });
  it("leaves a plain negative number a number, and ordinary text alone", () => {
    expect(neutraliseFormula("-12.5")).toBe("-12.5");
    expect(neutraliseFormula("-3")).toBe("-3");
    expect(neutraliseFormula("Black pepper")).toBe("Black pepper");
    expect(neutraliseFormula("12=3")).toBe("12=3");
    expect(neutraliseFormula("")).toBe("");
  });
  it("does not let a number-looking start carry a formula (the DDE payload starts with -2)", () => {
    expect(neutraliseFormula("-2+3+cmd|' /C calc'!A0")).toBe("'-2+3+cmd|' /C calc'!A0");
    expect(neutraliseFormula("-1e3")).toBe("'-1e3");
  });
});

describe("csvCell and toCsv", () => {
  it("quotes per RFC 4180 after neutralising", () => {
    expect(csvCell('=HYPERLINK("http://example.test","click")')).toBe(`"'=HYPERLINK(""http://example.test"",""click"")"`);
    expect(csvCell("a,b")).toBe('"a,b"');
    expect(csvCell(-4)).toBe("-4");
    expect(csvCell(null)).toBe("");
    expect(toCsv(["sku", "price"], [["=1+1", "-2.5"]])).toBe("sku,price\r\n'=1+1,-2.5\r\n");
  });
});

describe("a file's formula-like text, imported and exported again", () => {
  it("is kept as sent on import and neutralised on the way out; the export reads back to the same cells", async () => {
    const rows: string[][] = [];
    await importCsv(path.join(import.meta.dirname, "../fixtures/csv/formula-text.csv"), TEST_FIELDS, csvMapping.parse({
      columns: { sku: { header: "SKU" }, description: { header: "Description" }, price: { header: "Unit price" } },
    }), { onRow: (r) => void rows.push([r.sku!, r.description!, r.price!]) });
    expect(rows[0]).toEqual(["=1+1", '=HYPERLINK("http://example.test","click")', "1.00"]);

    const out = toCsv(["SKU", "Description", "Unit price"], rows);
    const back = Papa.parse<string[]>(out, { skipEmptyLines: true }).data.slice(1);
    expect(back).toEqual(rows.map((r) => r.map((c) => neutraliseFormula(c))));
    for (const row of back) for (const cell of row.slice(0, 2)) expect(cell).toMatch(/^'/);
  });
});
