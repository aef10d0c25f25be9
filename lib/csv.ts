// CSV out, per RFC 4180: CRLF line ends, fields with a comma, quote or line break quoted, quotes
// doubled. Text that a spreadsheet would run as a formula (= + - @ tab CR at the start, OWASP's
// list) gets a leading apostrophe; only a plain negative number ("-12.5") is left as a number.
// Client-safe: the stock grid's export uses neutraliseFormula too.
export type CsvCell = string | number | null | undefined;

const FORMULA_START = /^[=+\-@\t\r]/;
// a negative number and nothing else: "-2+3+cmd|' /C calc'!A0" starts with "-2" but is a formula
const NEGATIVE_NUMBER = /^-\d+(?:\.\d+)?$/;

/** The text as a spreadsheet will show it rather than run it. Imported text (a product named "=1+1") is kept as sent and neutralised only here, on the way out. */
export function neutraliseFormula(s: string): string {
  return FORMULA_START.test(s) && !NEGATIVE_NUMBER.test(s) ? `'${s}` : s;
}

export function csvCell(v: CsvCell): string {
  if (typeof v === "number") return String(v); // a number cannot carry a formula
  const s = neutraliseFormula(v ?? "");
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function toCsv(columns: readonly string[], rows: readonly (readonly CsvCell[])[]): string {
  return [columns.map(csvCell).join(","), ...rows.map((r) => r.map(csvCell).join(","))].join("\r\n") + "\r\n";
}

export function csvResponse(body: string, filename: string, headers: Record<string, string> = {}): Response {
  return new Response(body, {
    headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="${filename}"`, ...headers },
  });
}
