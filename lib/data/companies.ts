import "server-only";
import type { z } from "zod";
import { db } from "../../db/client";
import type { CompanyRow } from "../../db/types";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import type { RegulatoryTable } from "../cure/limits";
import { currencyDecimals, moneyText } from "../purchasing/order-money";
import { dec, plain } from "../units";
import { AppError, validation } from "../http/errors";
import { normaliseWindows } from "../alerts/expiry";
import type { companyCureSettingsInput, companyUpdateInput, WeekStart } from "../validation/company";

export interface Company {
  id: string;
  name: string;
  timeZone: string;
  currency: string;
  /** the first day of the planning week (the week planner) */
  weekStart: WeekStart;
  /** buyers approve purchase orders up to this total, managers above it (the currency's decimals) */
  approvalThreshold: string;
  /** the checks deliveries are reconciled with */
  receiving: { priceTolerancePercent: string; shortDatedDays: { cure: number; casing: number; spice: number; ingredient: number } };
  /** what the company's scanners type instead of GS on case labels; null: none */
  scanSeparator: string | null;
  /** the cost formula (IAS 2 para. 25) of the reports: FIFO layers or the moving weighted average, per kitchen (lib/costing/engine.ts) */
  costFormula: "fifo" | "average";
  /** the expiry scan's warnings: days before a lot's date, per category, largest first (lib/alerts/expiry.ts) */
  expiryWindows: { cure: number[]; casing: number[]; spice: number[]; ingredient: number[] };
}

const toCompany = (c: CompanyRow): Company => ({
  id: c.id, name: c.name, timeZone: c.time_zone, currency: c.currency, weekStart: c.week_start, approvalThreshold: moneyText(c.approval_threshold, c.currency),
  receiving: {
    priceTolerancePercent: plain(dec(c.receiving_price_tolerance_pct)),
    shortDatedDays: { cure: c.short_dated_days_cure, casing: c.short_dated_days_casing, spice: c.short_dated_days_spice, ingredient: c.short_dated_days_ingredient },
  },
  scanSeparator: c.scan_separator,
  costFormula: c.cost_formula,
  expiryWindows: (() => {
    const w = normaliseWindows(c.expiry_windows);
    return { cure: w.cure ?? [], casing: w.casing ?? [], spice: w.spice ?? [], ingredient: w.ingredient ?? [] };
  })(),
});

const sortedWindows = (w: Record<string, number[] | undefined>) =>
  Object.fromEntries(Object.entries(w).map(([k, days]) => [k, [...(days ?? [])].sort((a, b) => b - a)]));

export async function getCompany(actor: CurrentUser): Promise<Company> {
  const row: CompanyRow = await db()("companies").where({ id: actor.companyId }).first();
  return toCompany(row);
}

export async function updateCompany(actor: CurrentUser, input: z.infer<typeof companyUpdateInput>): Promise<Company> {
  assertCan(actor, "company.manage");
  if (input.approvalThreshold !== undefined && dec(input.approvalThreshold).decimalPlaces() > currencyDecimals(input.currency)) {
    const e = currencyDecimals(input.currency);
    throw validation({ approvalThreshold: [e === 0 ? `${input.currency} has no decimals: enter a whole amount.` : `${input.currency} has ${e} decimals: enter at most ${e}.`] });
  }
  if (input.costFormula !== undefined) {
    // the reports cost every movement from the first by today's formula, so a change would rewrite
    // closed months: it is allowed only while none is closed (IAS 8 treats a change as a change of policy)
    const current = await db()("companies").where({ id: actor.companyId }).first<{ cost_formula: string }>("cost_formula");
    if (current.cost_formula !== input.costFormula && (await db()("accounting_periods").where({ company_id: actor.companyId }).first())) {
      throw new AppError(409, "COST_FORMULA_LOCKED", "The cost formula cannot change once a month is closed: the closed months were costed with the current one. Reopen every closed month first.", { field: "costFormula" });
    }
  }
  const [row] = await db()("companies")
    .where({ id: actor.companyId })
    .update({
      ...(input.costFormula !== undefined ? { cost_formula: input.costFormula } : {}),
      name: input.name, time_zone: input.timeZone, currency: input.currency, ...(input.weekStart ? { week_start: input.weekStart } : {}),
      ...(input.approvalThreshold !== undefined ? { approval_threshold: input.approvalThreshold } : {}),
      ...(input.receiving?.priceTolerancePercent !== undefined ? { receiving_price_tolerance_pct: input.receiving.priceTolerancePercent } : {}),
      ...Object.fromEntries(Object.entries(input.receiving?.shortDatedDays ?? {}).map(([k, v]) => [`short_dated_days_${k}`, v])),
      ...(input.scanSeparator !== undefined ? { scan_separator: input.scanSeparator } : {}),
      // the categories sent replace theirs; the others stay (jsonb || merges at the top level)
      ...(input.expiryWindows && Object.keys(input.expiryWindows).length
        ? { expiry_windows: db().raw("expiry_windows || ?::jsonb", [JSON.stringify(sortedWindows(input.expiryWindows))]) }
        : {}),
    })
    .returning<CompanyRow[]>("*");
  return toCompany(row!);
}

/** What the cure calculator takes from the company (columns of companies, see the migration). */
export interface CureSettings {
  /** the table the calculator checks against unless a calculation names another */
  regulatoryTable: RegulatoryTable;
  /** kitchen scale resolution in grams: cure quantities are rounded to it toward compliance */
  scaleResolutionG: string;
}

interface CureSettingsRow {
  regulatory_table: RegulatoryTable;
  scale_resolution_g: string;
}

const toCureSettings = (r: CureSettingsRow): CureSettings => ({ regulatoryTable: r.regulatory_table, scaleResolutionG: plain(r.scale_resolution_g) });

/** Every signed-in user of the company may read them (the calculator needs them). */
export async function getCureSettings(actor: CurrentUser): Promise<CureSettings> {
  const row: CureSettingsRow = await db()("companies").where({ id: actor.companyId }).first("regulatory_table", "scale_resolution_g");
  return toCureSettings(row);
}

export async function updateCureSettings(actor: CurrentUser, input: z.infer<typeof companyCureSettingsInput>): Promise<CureSettings> {
  assertCan(actor, "company.manage");
  const [row] = await db()("companies")
    .where({ id: actor.companyId })
    .update({ regulatory_table: input.regulatoryTable, scale_resolution_g: input.scaleResolutionG })
    .returning<CureSettingsRow[]>(["regulatory_table", "scale_resolution_g"]);
  return toCureSettings(row!);
}
