// Numbers in CSV cells as people and spreadsheets write them ("1.234,50", "1 234,5", "1'234.50",
// "€ 12,50"), read into exact decimal strings ("1234.50") under the column mapping's decimal and
// thousands separators. Never through a binary float. Pure and client-safe.

export const DECIMAL_SEPARATORS = [".", ","] as const;
export type DecimalSeparator = (typeof DECIMAL_SEPARATORS)[number];
/** "" = none. " " also accepts the no-break spaces spreadsheets and Intl use; "'" also ’ (U+2019). */
export const THOUSANDS_SEPARATORS = ["", ",", ".", " ", "'"] as const;
export type ThousandsSeparator = (typeof THOUSANDS_SEPARATORS)[number];

export interface NumberFormat {
  decimal: DecimalSeparator;
  thousands: ThousandsSeparator;
}

const GROUP_CHARS: Record<ThousandsSeparator, string> = {
  "": "",
  ",": ",",
  ".": ".",
  " ": " \u00a0\u202f",
  "'": "'\u2019",
};

// U+00A0 no-break space and U+202F narrow no-break space count as spaces around a value too
const TRIM = /^[\s\u00a0\u202f]+|[\s\u00a0\u202f]+$/g;
const CURRENCY = /^[€$£¥][\s\u00a0\u202f]*|[\s\u00a0\u202f]*[€$£¥]$/g;
const MAX_INTEGER_DIGITS = 18;
const MAX_FRACTION_DIGITS = 18;

export type Parsed<T> = { ok: true; value: T } | { ok: false; message: string };

const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");

const PATTERNS = new Map<string, RegExp>();

/** [1] the integer part (with its group separators), [2] the decimals, or [3] the decimals of ",5". */
function patternFor(format: NumberFormat): RegExp {
  const key = format.decimal + format.thousands;
  let re = PATTERNS.get(key);
  if (!re) {
    const dec = escape(format.decimal);
    const group = GROUP_CHARS[format.thousands];
    const intPart = group === "" ? "\\d+" : `\\d+|\\d{1,3}(?:[${escape(group)}]\\d{3})+`;
    re = new RegExp(`^(?:(${intPart})(?:${dec}(\\d+))?|${dec}(\\d+))$`);
    PATTERNS.set(key, re);
  }
  return re;
}

export function describeNumberFormat(f: NumberFormat): string {
  const thousands = f.thousands === "" ? "no thousands separator" : f.thousands === " " ? "thousands ' ' (space)" : `thousands '${f.thousands}'`;
  return `decimal '${f.decimal}' and ${thousands}`;
}

/**
 * Reads a number written with these separators into a plain decimal string: optional minus, digits,
 * optional "." and digits ("-1234.50"; digits are kept as written, so trailing zeros stay).
 * Accepted around it: spaces, a currency sign (€ $ £ ¥), a leading + or minus (also U+2212).
 * Thousands separators must group by three ("1.234.567", not "12.34"); ",5" reads as "0.5".
 */
export function parseDecimal(text: string, format: NumberFormat, opts: { signed?: boolean } = {}): Parsed<string> {
  const shown = text.length > 40 ? `${text.slice(0, 40)}…` : text;
  const notNumber = (): Parsed<string> => ({ ok: false, message: `'${shown}' is not a number with ${describeNumberFormat(format)}` });
  if (format.decimal === format.thousands) return { ok: false, message: `the decimal and thousands separators are both '${format.decimal}'` };
  let s = text.replace(TRIM, "").replace(CURRENCY, "").replace(TRIM, "");
  if (s === "") return { ok: false, message: "empty" };
  let negative = false;
  if (/^[-+\u2212]/.test(s)) {
    negative = s[0] !== "+";
    s = s.slice(1);
  }
  const group = GROUP_CHARS[format.thousands];
  const m = patternFor(format).exec(s);
  if (!m) return notNumber();
  // a group separator may appear only one kind at a time ("1 234'567" is no number)
  if (m[1] && group.length > 1 && new Set(m[1].replace(/\d/g, "")).size > 1) return notNumber();
  const integer = (m[1] ?? "0").replace(/\D/g, "");
  const fraction = m[2] ?? m[3] ?? "";
  if (integer.replace(/^0+(?=\d)/, "").length > MAX_INTEGER_DIGITS) return { ok: false, message: `'${shown}' has more than ${MAX_INTEGER_DIGITS} digits before the decimal separator` };
  if (fraction.length > MAX_FRACTION_DIGITS) return { ok: false, message: `'${shown}' has more than ${MAX_FRACTION_DIGITS} decimals` };
  const isZero = /^0*$/.test(integer + fraction);
  if (negative && !isZero && !opts.signed) return { ok: false, message: `'${shown}' is negative; this column takes no negative numbers` };
  return { ok: true, value: `${negative && !isZero ? "-" : ""}${integer}${fraction ? `.${fraction}` : ""}` };
}

/** A whole number (no decimals, or only zeros after the separator), as a digit string. */
export function parseInteger(text: string, format: NumberFormat, opts: { signed?: boolean } = {}): Parsed<string> {
  const d = parseDecimal(text, format, opts);
  if (!d.ok) return d;
  const [whole, fraction = ""] = d.value.split(".");
  if (/[1-9]/.test(fraction)) return { ok: false, message: `'${text.trim()}' is not a whole number` };
  return { ok: true, value: whole!.replace(/^(-?)0+(?=\d)/, "$1") };
}

// The order a proposal prefers when several formats read the sample equally well.
const PREFERENCE: Record<string, NumberFormat[]> = {
  comma: [
    { decimal: ".", thousands: "" }, { decimal: ".", thousands: "," }, { decimal: ",", thousands: "" }, { decimal: ",", thousands: "." },
    { decimal: ".", thousands: " " }, { decimal: ",", thousands: " " }, { decimal: ".", thousands: "'" }, { decimal: ",", thousands: "'" },
  ],
  semicolon: [
    { decimal: ",", thousands: "" }, { decimal: ",", thousands: "." }, { decimal: ",", thousands: " " }, { decimal: ".", thousands: "" },
    { decimal: ".", thousands: "," }, { decimal: ".", thousands: " " }, { decimal: ".", thousands: "'" }, { decimal: ",", thousands: "'" },
  ],
};

/**
 * The separators that read the most of these sample values, preferring the usual pairing for the
 * file's delimiter (a semicolon file usually has decimal commas). `ambiguous` when another format
 * reads them all too but would give different numbers (e.g. "1.234").
 */
export function proposeNumberFormat(values: readonly string[], delimiter = ","): { format: NumberFormat; ambiguous: boolean } {
  const sample = values.map((v) => v.trim()).filter((v) => v !== "");
  const order = delimiter === ";" ? PREFERENCE.semicolon! : PREFERENCE.comma!;
  const read = order.map((f) => sample.map((v) => parseDecimal(v, f, { signed: true })));
  const score = read.map((r) => r.filter((p) => p.ok).length);
  const best = Math.max(...score);
  const i = score.indexOf(best);
  const values0 = read[i]!.map((p) => (p.ok ? p.value : null)).join("|");
  const ambiguous = score.some((s, j) => j !== i && s === best && read[j]!.map((p) => (p.ok ? p.value : null)).join("|") !== values0);
  return { format: order[i]!, ambiguous: sample.length > 0 && ambiguous };
}
