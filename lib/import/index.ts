// The CSV import engine: see csv-import.ts and DEVELOPERS.md, "Uploads and CSV imports".
export { importCsv, sniffCsv, detectDelimiter, MAX_RECORD_CHARS } from "./csv-import";
export type { CsvDelimiter, CsvProblem, CsvSniff, ImportOptions, ImportSummary, RowIssue } from "./csv-import";
export { defineImportFields } from "./fields";
export type { ImportField, ImportFieldType, ImportRow } from "./fields";
export { normalizeHeader, proposeMapping } from "./headers";
export type { MappingProposal } from "./headers";
export { DATE_FORMATS, parseDate, proposeDateFormat } from "./dates";
export type { DateFormat } from "./dates";
export { DECIMAL_SEPARATORS, THOUSANDS_SEPARATORS, describeNumberFormat, parseDecimal, parseInteger, proposeNumberFormat } from "./numbers";
export type { DecimalSeparator, NumberFormat, ThousandsSeparator } from "./numbers";
export { detectEncoding, decodeStream } from "./encoding";
export type { CsvEncoding } from "./encoding";
