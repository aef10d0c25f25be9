// lib/import/dates: dates read strictly in the mapping's format. Outside reference for which dates
// exist: the proleptic Gregorian calendar as JavaScript's Date.UTC implements it (ECMA-262 §21.4.1),
// checked against every day of 2023 and 2024 (a leap year).
import { describe, expect, it } from "vitest";
import { DATE_FORMATS, parseDate, proposeDateFormat } from "@/lib/import/dates";

const write = (y: number, m: number, d: number, f: (typeof DATE_FORMATS)[number]) => {
  const dd = String(d).padStart(2, "0");
  const mm = String(m).padStart(2, "0");
  return f.replace("yyyy", String(y)).replace("MM", mm).replace("dd", dd);
};

describe("parseDate", () => {
  it("reads each format into yyyy-MM-dd", () => {
    expect(parseDate("2026-12-01", "yyyy-MM-dd")).toEqual({ ok: true, value: "2026-12-01" });
    expect(parseDate("01/12/2026", "dd/MM/yyyy")).toEqual({ ok: true, value: "2026-12-01" });
    expect(parseDate("12/01/2026", "MM/dd/yyyy")).toEqual({ ok: true, value: "2026-12-01" });
    expect(parseDate("01.12.2026", "dd.MM.yyyy")).toEqual({ ok: true, value: "2026-12-01" });
    expect(parseDate("01-12-2026", "dd-MM-yyyy")).toEqual({ ok: true, value: "2026-12-01" });
    expect(parseDate("2026/12/01", "yyyy/MM/dd")).toEqual({ ok: true, value: "2026-12-01" });
  });

  it("takes day and month with one digit, as spreadsheets often write them", () => {
    expect(parseDate("1.2.2026", "dd.MM.yyyy")).toEqual({ ok: true, value: "2026-02-01" });
    expect(parseDate(" 3/4/2026 ", "MM/dd/yyyy")).toEqual({ ok: true, value: "2026-03-04" });
  });

  it("is strict: the other order, two-digit years, trailing text and impossible dates are refused", () => {
    expect(parseDate("13/01/2026", "MM/dd/yyyy")).toEqual({ ok: false, message: "'13/01/2026' is not a real date in the form MM/dd/yyyy" });
    expect(parseDate("01/02/26", "dd/MM/yyyy")).toEqual({ ok: false, message: "'01/02/26' is not a date in the form dd/MM/yyyy" });
    expect(parseDate("2026-12-01 00:00", "yyyy-MM-dd").ok).toBe(false);
    expect(parseDate("2026-12-01", "dd.MM.yyyy").ok).toBe(false);
    expect(parseDate("2023-02-29", "yyyy-MM-dd").ok).toBe(false);
    expect(parseDate("2026-04-31", "yyyy-MM-dd").ok).toBe(false);
    expect(parseDate("0226-01-01", "yyyy-MM-dd")).toEqual({ ok: false, message: "'0226-01-01' has the year 0226; expected 1900 to 2999" });
    expect(parseDate("", "yyyy-MM-dd")).toEqual({ ok: false, message: "empty" });
  });

  it("agrees with the Gregorian calendar (Date.UTC) on every day of 2023 and 2024, in every format", () => {
    for (const y of [2023, 2024]) {
      for (let m = 1; m <= 12; m++) {
        for (let d = 1; d <= 31; d++) {
          const real = new Date(Date.UTC(y, m - 1, d)).getUTCDate() === d; // Date.UTC rolls 31 April over to 1 May
          const iso = `${y}-${String(m).padStart(2, "0")}-${String(d).padStart(2, "0")}`;
          for (const f of DATE_FORMATS) {
            const r = parseDate(write(y, m, d, f), f);
            expect(r, `${write(y, m, d, f)} in ${f}`).toEqual(real ? { ok: true, value: iso } : expect.objectContaining({ ok: false }));
          }
        }
      }
    }
  });
});

describe("proposeDateFormat", () => {
  it("finds the format that reads the sample", () => {
    expect(proposeDateFormat(["01.12.2026", "15.12.2026"])).toEqual({ format: "dd.MM.yyyy", ambiguous: false });
    expect(proposeDateFormat(["12/31/2026", "01/15/2027"])).toEqual({ format: "MM/dd/yyyy", ambiguous: false });
    expect(proposeDateFormat(["31/12/2026"])).toEqual({ format: "dd/MM/yyyy", ambiguous: false });
  });
  it("says when day and month cannot be told apart", () => {
    expect(proposeDateFormat(["03/04/2026", "05/06/2026"]).ambiguous).toBe(true);
  });
});
