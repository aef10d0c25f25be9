// Reports as spreadsheet files (.xlsx, through exceljs). The figures are the reports' own decimal
// strings: text stays text, numbers become number cells. A spreadsheet number is a binary double by
// the file format's definition; every figure here has at most 15 significant digits, so the number
// written reads back as exactly the decimal shown (tests/integration/reports-xlsx.test.ts checks
// the cells). Money cells carry the currency's decimals as their number format.
import ExcelJS from "exceljs";

export interface SheetColumn {
  header: string;
  key: string;
  kind: "text" | "quantity" | "money";
  width?: number;
}

export interface SheetSpec {
  name: string;
  /** lines above the table: title, range, formula */
  preamble: string[];
  columns: SheetColumn[];
  rows: Record<string, string | null | undefined>[];
  /** the totals line: values by column key (text in the first column) */
  totals?: Record<string, string>;
  currencyDecimals: number;
}

/** A figure for a number cell: the decimal string as a JS number (exact for <= 15 significant digits). */
function numberCell(s: string | null | undefined): number | null {
  if (s === null || s === undefined || s === "") return null;
  if (!/^-?\d+(\.\d+)?$/.test(s)) throw new Error(`Not a decimal figure: ${s}`);
  if (s.replace(/^-|\./g, "").replace(/^0+/, "").length > 15) throw new Error(`Too many digits for a spreadsheet number: ${s}`);
  return Number(s);
}

export async function workbook(sheets: readonly SheetSpec[]): Promise<Buffer> {
  const wb = new ExcelJS.Workbook();
  wb.creator = "Hank & Lot";
  for (const spec of sheets) {
    const ws = wb.addWorksheet(spec.name);
    for (const line of spec.preamble) ws.addRow([line]);
    if (spec.preamble.length) ws.addRow([]);
    const header = ws.addRow(spec.columns.map((c) => c.header));
    header.font = { bold: true };
    const moneyFormat = spec.currencyDecimals > 0 ? `#,##0.${"0".repeat(spec.currencyDecimals)}` : "#,##0";
    const put = (values: Record<string, string | null | undefined>, bold = false) => {
      const row = ws.addRow(spec.columns.map((c) => (c.kind === "text" ? (values[c.key] ?? "") : numberCell(values[c.key]))));
      spec.columns.forEach((c, i) => {
        if (c.kind === "money") row.getCell(i + 1).numFmt = moneyFormat;
      });
      if (bold) row.font = { bold: true };
    };
    for (const r of spec.rows) put(r);
    if (spec.totals) put(spec.totals, true);
    spec.columns.forEach((c, i) => {
      ws.getColumn(i + 1).width = c.width ?? (c.kind === "text" ? 22 : 14);
    });
  }
  return Buffer.from(await wb.xlsx.writeBuffer());
}

export function xlsxResponse(body: Buffer, filename: string): Response {
  return new Response(new Uint8Array(body), {
    headers: {
      "content-type": "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet",
      "content-disposition": `attachment; filename="${filename}"`,
    },
  });
}
