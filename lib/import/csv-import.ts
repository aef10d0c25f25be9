// The CSV import engine shared by price lists and delivery notes. Two calls:
//   sniffCsv(path)                       -> encoding, delimiter, headers, first rows (the mapping screen)
//   importCsv(path, fields, mapping, {onRow}) -> streams every row through the mapping into the
//                                           fields' kinds and hands each good row to onRow
// The file is streamed (papaparse in chunk mode over a Node stream of the decoded text): a
// 100,000-row file is never one string. Rows are numbered as a spreadsheet shows them (the first
// line of the file is row 1, so the header is row 1 and the first data row is row 2; a quoted cell
// with line breaks is still one row). Every problem names its row and column in plain words.
// Text cells stay text exactly as sent (a cell "=SUM(A1)" is a name, not a formula); exports
// neutralise such cells (lib/csv.ts).
import { createReadStream } from "node:fs";
import Papa from "papaparse";
import type { CsvMapping } from "../validation/imports";
import { CSV_DELIMITERS } from "../validation/imports";
import { parseDate } from "./dates";
import { detectEncoding, decodeStream, readTextHead, type CsvEncoding } from "./encoding";
import type { ImportField, ImportRow } from "./fields";
import { normalizeHeader } from "./headers";
import { parseDecimal, parseInteger, type NumberFormat, type Parsed } from "./numbers";

export type CsvDelimiter = (typeof CSV_DELIMITERS)[number];

export interface CsvProblem {
  /** The spreadsheet row (the file's first line is row 1). */
  row: number;
  /** The column as the file names it ("Price"), or "column 3" without a header; null for the whole row or file. */
  column: string | null;
  /** The target field the cell was read for. */
  field?: string;
  /** A whole sentence naming row and column: "row 14, column 'Price': '12,5.0' is not a number with …". */
  message: string;
}

/** What onRow may answer for a row it refuses or doubts (an unknown product code, say). */
export interface RowIssue<K extends string = string> {
  field?: K;
  message: string;
  /** A warning keeps the row; anything else rejects it. */
  warning?: boolean;
}

export interface ImportOptions<K extends string> {
  /** Called once per good row, in file order; awaited (the file is read no faster than this). */
  onRow?: (row: ImportRow<K>, rowNumber: number) => void | readonly RowIssue<K>[] | Promise<void | readonly RowIssue<K>[]>;
  /** Stop reading after this many errors (default 100). */
  maxErrors?: number;
  /** Keep at most this many warnings (default 100; the rest are counted). */
  maxWarnings?: number;
}

export interface ImportSummary {
  /** Data rows read (not counting the header, rows above it, or blank rows). */
  rows: number;
  /** Rows handed to onRow and not refused by it. */
  accepted: number;
  /** Rows with at least one error. */
  rejected: number;
  blankRows: number;
  errors: CsvProblem[];
  warnings: CsvProblem[];
  /** Warnings past maxWarnings, counted only. */
  moreWarnings: number;
  /** false when reading stopped early (maxErrors reached, or a problem no later row can recover from). */
  complete: boolean;
  encoding: CsvEncoding;
  bom: boolean;
  delimiter: CsvDelimiter;
  headers: string[];
}

export interface CsvSniff {
  encoding: CsvEncoding;
  bom: boolean;
  delimiter: CsvDelimiter;
  headerRow: number;
  /** The header row's cells, trimmed ([] when headerRow is 0). */
  headers: string[];
  /** How the screen names each column: the header, or "Column 3" where the header is blank or there is none. */
  columnNames: string[];
  /** The first 10 non-blank rows after the header. */
  sampleRows: string[][];
}

/** A single record longer than this (a quote that never closes swallows the rest of the file) stops the import. */
export const MAX_RECORD_CHARS = 1_000_000;
const SNIFF_CHARS = 256 * 1024;
const DELIMITER_SAMPLE_CHARS = 64 * 1024;
const SAMPLE_ROWS = 10;
const QUEUE_HIGH = 16;

function isBlank(cells: readonly string[]): boolean {
  for (const c of cells) if (c !== "" && c.trim() !== "") return false;
  return true;
}
const quote = (s: string) => `'${s.length > 60 ? `${s.slice(0, 60)}…` : s}'`;

/**
 * The delimiter that splits the sample into the most consistent rows of more than one field
 * (comma, semicolon, tab or |). Quoted delimiters do not count. "," when nothing splits.
 */
export function detectDelimiter(sample: string, complete = true): CsvDelimiter {
  let best: { d: CsvDelimiter; consistency: number; fields: number } | null = null;
  for (const d of CSV_DELIMITERS) {
    const parsed = Papa.parse<string[]>(sample, { delimiter: d, preview: 50, skipEmptyLines: "greedy" });
    let records = parsed.data;
    if (!complete && records.length > 1) records = records.slice(0, -1); // the last one may be cut off
    if (records.length === 0) continue;
    const counts = records.map((r) => r.length);
    const freq = new Map<number, number>();
    for (const c of counts) freq.set(c, (freq.get(c) ?? 0) + 1);
    const [mode, seen] = [...freq.entries()].sort((a, b) => b[1] - a[1] || b[0] - a[0])[0]!;
    if (mode < 2) continue;
    const consistency = seen / counts.length + (counts[0] === mode ? 0.001 : 0);
    if (!best || consistency > best.consistency + 1e-9 || (Math.abs(consistency - best.consistency) < 1e-9 && mode > best.fields)) {
      best = { d, consistency, fields: mode };
    }
  }
  return best?.d ?? ",";
}

/** For the mapping screen: how the file is written and what its first rows hold. */
export async function sniffCsv(filePath: string, opts: { headerRow?: number; delimiter?: CsvDelimiter | null } = {}): Promise<CsvSniff> {
  const headerRow = opts.headerRow ?? 1;
  const { encoding, bom } = await detectEncoding(filePath);
  const { text, complete } = await readTextHead(filePath, encoding, SNIFF_CHARS);
  const delimiter = opts.delimiter ?? detectDelimiter(text.slice(0, DELIMITER_SAMPLE_CHARS), complete && text.length <= DELIMITER_SAMPLE_CHARS);
  const parsed = Papa.parse<string[]>(text, { delimiter, skipEmptyLines: false });
  let records = parsed.data;
  if (!complete && records.length > 1) records = records.slice(0, -1);
  const headers = headerRow > 0 ? (records[headerRow - 1] ?? []).map((h) => h.trim()) : [];
  const sampleRows = records.slice(headerRow).filter((r) => !isBlank(r)).slice(0, SAMPLE_ROWS);
  const width = Math.max(headers.length, ...sampleRows.map((r) => r.length));
  const columnNames = Array.from({ length: width }, (_, i) => headers[i] || `Column ${i + 1}`);
  return { encoding, bom, delimiter, headerRow, headers, columnNames, sampleRows };
}

interface Batch {
  data: string[][];
  errors: Papa.ParseError[];
  /** A record was still open after this many characters: the quoting is broken. */
  runaway: boolean;
}

/** A column as problems name it: name "Price" shown as column 'Price', or name "column 3" shown as is. */
interface Column {
  name: string;
  display: string;
}

type Resolved<K extends string> = ({ field: ImportField<K>; index: number } & Column)[];

const columnOf = (header: string | undefined, index: number): Column =>
  header ? { name: header, display: `column ${quote(header)}` } : { name: `column ${index + 1}`, display: `column ${index + 1}` };

/**
 * Streams the file through the mapping. Never throws for what is in the file (that is in the
 * summary's errors); throws only when the file cannot be read at all, or onRow throws.
 */
export async function importCsv<K extends string>(
  filePath: string,
  fields: readonly ImportField<K>[],
  mapping: CsvMapping,
  options: ImportOptions<K> = {},
): Promise<ImportSummary> {
  const maxErrors = options.maxErrors ?? 100;
  const maxWarnings = options.maxWarnings ?? 100;
  const { encoding, bom } = await detectEncoding(filePath);
  let delimiter = mapping.delimiter ?? null;
  if (!delimiter) {
    const head = await readTextHead(filePath, encoding, DELIMITER_SAMPLE_CHARS);
    delimiter = detectDelimiter(head.text, head.complete);
  }
  const numberFormat: NumberFormat = { decimal: mapping.decimal, thousands: mapping.thousands };

  const summary: ImportSummary = {
    rows: 0, accepted: 0, rejected: 0, blankRows: 0, errors: [], warnings: [], moreWarnings: 0, complete: true,
    encoding, bom, delimiter, headers: [],
  };
  const problem = (row: number, column: Column | null, message: string, field?: string): CsvProblem => ({
    row, column: column?.name ?? null, ...(field ? { field } : {}), message: `row ${row}${column ? `, ${column.display}` : ""}: ${message}`,
  });
  const warn = (p: CsvProblem) => {
    if (summary.warnings.length < maxWarnings) summary.warnings.push(p);
    else summary.moreWarnings++;
  };

  // the stream: bytes -> text -> papaparse (chunk mode), batches queued for the async loop below
  const source = createReadStream(filePath, { highWaterMark: 256 * 1024 });
  const decoded = source.pipe(decodeStream(encoding));
  const queue: (Batch | { end: true } | { failure: unknown })[] = [];
  let wake: (() => void) | null = null;
  const push = (item: (typeof queue)[number]) => {
    queue.push(item);
    if (queue.length >= QUEUE_HIGH) decoded.pause();
    wake?.();
  };
  let fed = 0;
  decoded.on("data", (text: string) => {
    fed += text.length; // registered before papaparse's listener: counts each chunk before it is parsed
  });
  source.on("error", (e) => push({ failure: e }));
  Papa.parse<string[]>(decoded, {
    delimiter,
    skipEmptyLines: false,
    chunk(results) {
      push({ data: results.data, errors: results.errors, runaway: fed - results.meta.cursor > MAX_RECORD_CHARS });
    },
    complete() {
      push({ end: true });
    },
    error(e: Error) {
      push({ failure: e });
    },
  });
  const next = async () => {
    while (queue.length === 0) await new Promise<void>((r) => (wake = r));
    wake = null;
    const item = queue.shift()!;
    if (queue.length < QUEUE_HIGH / 2 && decoded.isPaused()) decoded.resume();
    return item;
  };

  let record = 0; // records seen so far; the current one is spreadsheet row record + 1
  let columns: Resolved<K> | null = null;
  let width = 0;
  const wide = { rows: 0, first: 0 };
  let stop = false;

  const resolveColumns = (headers: readonly string[] | null, rowNumber: number): Resolved<K> | null => {
    const out: Resolved<K> = [];
    const byName = new Map<string, number[]>();
    headers?.forEach((h, i) => {
      const n = h.trim().replace(/\s+/g, " ").toLowerCase();
      if (n) byName.set(n, [...(byName.get(n) ?? []), i]);
    });
    const listed = headers ? headers.filter((h) => h.trim()).map((h) => `"${h.trim()}"`).join(", ") : "";
    const fatal = (message: string) => {
      summary.errors.push(problem(rowNumber, null, message));
      return null;
    };
    for (const key of Object.keys(mapping.columns)) {
      if (!fields.some((f) => f.key === key)) warn(problem(rowNumber, null, `the mapping names a field "${key}" this import does not have; it is ignored`));
    }
    for (const field of fields) {
      const ref = mapping.columns[field.key];
      if (!ref) {
        if (field.required) return fatal(`no column is chosen for ${field.label}`);
        continue;
      }
      if ("header" in ref) {
        let hits = byName.get(ref.header.trim().replace(/\s+/g, " ").toLowerCase()) ?? [];
        if (hits.length === 0 && headers && normalizeHeader(ref.header) !== "") {
          // "Unit-Price" still finds "unit price": the same name without case, spaces or punctuation
          hits = headers.flatMap((h, i) => (normalizeHeader(h) === normalizeHeader(ref.header) ? [i] : []));
        }
        if (hits.length === 0) return fatal(`there is no column "${ref.header}" for ${field.label} (the columns are ${listed || "none"}); was the file's layout changed?`);
        if (hits.length > 1) return fatal(`the column "${ref.header}" appears ${hits.length} times (columns ${hits.map((i) => i + 1).join(" and ")}); choose ${field.label} by column number`);
        out.push({ field, index: hits[0]!, ...columnOf(headers![hits[0]!]!.trim(), hits[0]!) });
      } else {
        const index = ref.column - 1;
        if (headers && index >= headers.length) return fatal(`${field.label} is mapped to column ${ref.column}, but the file has ${headers.length} columns`);
        out.push({ field, index, ...columnOf(headers?.[index]?.trim(), index) });
      }
    }
    return out;
  };

  const readCell = (field: ImportField<K>, raw: string): Parsed<string> => {
    switch (field.type) {
      case "decimal": return parseDecimal(raw, numberFormat, { signed: field.signed });
      case "integer": return parseInteger(raw, numberFormat, { signed: field.signed });
      case "date": return parseDate(raw, mapping.dateFormat);
      case "text": {
        const max = field.maxLength ?? 500;
        return raw.length > max ? { ok: false, message: `${raw.length} characters; at most ${max}` } : { ok: true, value: raw };
      }
    }
  };

  const rowProblems = (rowNumber: number, found: CsvProblem[]) => {
    for (const p of found) summary.errors.push(p);
    if (summary.errors.length >= maxErrors) stop = true;
  };

  try {
    while (!stop) {
      const item = await next();
      if ("end" in item) break;
      if ("failure" in item) throw item.failure;
      // A quoting error is the end of reading: papaparse then joins the following lines into the
      // broken cell, so neither those rows nor the row numbers after them can be trusted.
      const quoting = new Map<number, Papa.ParseError["code"]>();
      for (const e of item.errors) {
        if (e.type !== "Quotes" || e.row === undefined) continue;
        // text after a closing quote is the cause when papaparse reports both for a row
        if (quoting.get(e.row) !== "InvalidQuotes") quoting.set(e.row, e.code);
      }

      for (let i = 0; i < item.data.length && !stop; i++) {
        const cells = item.data[i]!;
        record++;
        const rowNumber = record;
        const q = quoting.get(i);
        if (q) {
          if (rowNumber > mapping.headerRow) {
            summary.rows++;
            summary.rejected++;
          }
          const what = q === "MissingQuotes"
            ? "a quoted cell starts in this row and its closing quote never comes"
            : "a quoted cell in this row has text after its closing quote";
          summary.errors.push(problem(rowNumber, null, `${what}, so nothing from here on could be read. Check the quotes in this row (a quote inside a quoted cell is written twice: "").`));
          stop = true;
          break;
        }
        if (rowNumber < mapping.headerRow) continue;
        if (rowNumber === mapping.headerRow) {
          summary.headers = cells.map((c) => c.trim());
          width = cells.length;
          columns = resolveColumns(cells, rowNumber);
          if (!columns) stop = true;
          continue;
        }
        if (!columns) {
          // no header row (headerRow 0): the columns are resolved against the first row's width
          columns = resolveColumns(null, rowNumber);
          if (!columns) {
            stop = true;
            break;
          }
        }
        if (isBlank(cells)) {
          summary.blankRows++;
          continue;
        }
        summary.rows++;
        if (width > 0 && cells.length > width) {
          if (wide.rows++ === 0) wide.first = rowNumber;
        }
        const found: CsvProblem[] = [];
        const row = {} as ImportRow<K>;
        for (const f of fields) row[f.key] = null; // unmapped fields are null too
        for (const column of columns) {
          const field = column.field;
          const raw = (cells[column.index] ?? "").trim();
          if (raw === "") {
            row[field.key] = null;
            if (field.required) found.push(problem(rowNumber, column, `empty; ${field.label} is required`, field.key));
            continue;
          }
          const parsed = readCell(field, raw);
          if (parsed.ok) row[field.key] = parsed.value;
          else found.push(problem(rowNumber, column, parsed.message, field.key));
        }
        if (found.length) {
          summary.rejected++;
          rowProblems(rowNumber, found);
          continue;
        }
        let answer = options.onRow?.(row, rowNumber);
        if (answer && "then" in answer) answer = await answer; // a synchronous onRow costs no microtask per row
        const issues = (answer as readonly RowIssue<K>[] | void) ?? [];
        let refused = false;
        const refusals: CsvProblem[] = [];
        for (const issue of issues) {
          const column = issue.field ? columns.find((c) => c.field.key === issue.field) ?? null : null;
          const p = problem(rowNumber, column, issue.message, issue.field);
          if (issue.warning) warn(p);
          else {
            refused = true;
            refusals.push(p);
          }
        }
        if (refused) {
          summary.rejected++;
          rowProblems(rowNumber, refusals);
        } else summary.accepted++;
      }
      if (!stop && "runaway" in item && item.runaway) {
        summary.errors.push(problem(record + 1, null, `this row runs on for more than ${MAX_RECORD_CHARS.toLocaleString("en")} characters: a quoted cell starts here and its closing quote never comes. Check the quotes in this row (a quote inside a quoted cell is written twice: "").`));
        stop = true;
      }
    }
  } finally {
    source.destroy();
    decoded.destroy();
  }

  if (stop) {
    summary.complete = false;
    if (summary.errors.length >= maxErrors) {
      warn({ row: record, column: null, message: `stopped reading at row ${record} after ${summary.errors.length} errors; correct these and send the file again` });
    }
  } else if (mapping.headerRow > 0 && record < mapping.headerRow) {
    summary.errors.push({ row: mapping.headerRow, column: null, message: record === 0 ? "the file is empty" : `the file ends before row ${mapping.headerRow}, where its header should be` });
    summary.complete = false;
  } else if (summary.rows === 0) {
    warn({ row: record, column: null, message: "the file has no rows below its header" });
  }
  if (wide.rows > 0) {
    warn({
      row: wide.first, column: null,
      message: `row ${wide.first}${wide.rows > 1 ? ` and ${wide.rows - 1} more` : ""}: more cells than the header row has columns (${width}); the extra cells are ignored`,
    });
  }
  return summary;
}
