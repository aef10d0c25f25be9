import type { Knex } from "knex";

// The stand-in a company's case-label scanners type for GS (ASCII 29) when they cannot send it into a
// browser, e.g. "|". POST /api/gs1/parse uses it when a request names none; null: none. The rule a
// stand-in must meet (1-8 characters, one of them never found in GS1 data) is lib/gs1's
// separatorProblem, checked by the API; the column only keeps the length.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`alter table companies
    add column scan_separator text,
    add constraint companies_scan_separator_length check (char_length(scan_separator) between 1 and 8)`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`alter table companies
    drop constraint companies_scan_separator_length,
    drop column scan_separator`);
}
