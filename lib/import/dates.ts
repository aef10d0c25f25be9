// Dates in CSV cells, read strictly in the one format the column mapping names (a file never
// decides for itself whether 03/04 is March or April). Day and month may have one or two digits,
// the year has four; impossible dates (30 February) are refused. Pure and client-safe.
import { format as formatDate, isValid, parse } from "date-fns";
import type { Parsed } from "./numbers";

export const DATE_FORMATS = ["yyyy-MM-dd", "dd/MM/yyyy", "MM/dd/yyyy", "dd.MM.yyyy", "dd-MM-yyyy", "yyyy/MM/dd"] as const;
export type DateFormat = (typeof DATE_FORMATS)[number];

const MIN_YEAR = 1900;
const MAX_YEAR = 2999;
// a fixed reference date: parse() fills nothing from it (every format names year, month and day)
const REFERENCE = new Date(2000, 0, 1);

function shapeOf(format: DateFormat): RegExp {
  const re = format.replace(/[./-]/g, (c) => `\\${c}`).replace("yyyy", "(\\d{4})").replace("dd", "\\d{1,2}").replace("MM", "\\d{1,2}");
  return new RegExp(`^${re}$`);
}
const SHAPES = Object.fromEntries(DATE_FORMATS.map((f) => [f, shapeOf(f)])) as Record<DateFormat, RegExp>;

// A date column repeats few distinct values (a price list's "valid from"), and date-fns' parse is
// the slowest step of an import: remember recent answers.
const MEMO_LIMIT = 5000;
const memo = new Map<string, Parsed<string>>();

/** Reads a date in `format` into "yyyy-MM-dd". */
export function parseDate(text: string, format: DateFormat): Parsed<string> {
  const key = `${format}|${text}`;
  const known = memo.get(key);
  if (known) return known;
  const answer = readDate(text, format);
  if (memo.size >= MEMO_LIMIT) memo.clear();
  memo.set(key, answer);
  return answer;
}

function readDate(text: string, format: DateFormat): Parsed<string> {
  const s = text.trim();
  const shown = s.length > 40 ? `${s.slice(0, 40)}…` : s;
  if (s === "") return { ok: false, message: "empty" };
  const shape = SHAPES[format].exec(s);
  if (!shape) return { ok: false, message: `'${shown}' is not a date in the form ${format}` };
  const year = Number(shape[1]);
  if (year < MIN_YEAR || year > MAX_YEAR) return { ok: false, message: `'${shown}' has the year ${shape[1]}; expected ${MIN_YEAR} to ${MAX_YEAR}` };
  const d = parse(s, format, REFERENCE);
  if (!isValid(d)) return { ok: false, message: `'${shown}' is not a real date in the form ${format}` };
  return { ok: true, value: formatDate(d, "yyyy-MM-dd") };
}

/**
 * The date format that reads the most of these sample values; `ambiguous` when another reads them
 * all too but to other dates (every day in the sample is 12 or less: 03/04/2026).
 */
export function proposeDateFormat(values: readonly string[]): { format: DateFormat; ambiguous: boolean } {
  const sample = values.map((v) => v.trim()).filter((v) => v !== "");
  const read = DATE_FORMATS.map((f) => sample.map((v) => parseDate(v, f)));
  const score = read.map((r) => r.filter((p) => p.ok).length);
  const best = Math.max(...score);
  const i = score.indexOf(best);
  const key = (j: number) => read[j]!.map((p) => (p.ok ? p.value : null)).join("|");
  const ambiguous = score.some((s, j) => j !== i && s === best && key(j) !== key(i));
  return { format: DATE_FORMATS[i]!, ambiguous: sample.length > 0 && ambiguous };
}
