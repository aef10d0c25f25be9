// CSV out, per RFC 4180: CRLF line ends, fields with a comma, quote or line break quoted, quotes
// doubled. Text that a spreadsheet would run as a formula (= + - @ tab CR at the start) gets a
// leading apostrophe; numbers (a leading minus and a digit) are left as numbers.
export type CsvCell = string | number | null | undefined;

export function csvCell(v: CsvCell): string {
  let s = v === null || v === undefined ? "" : String(v);
  if (/^[=+\-@\t\r]/.test(s) && !/^-?\d/.test(s)) s = `'${s}`;
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
