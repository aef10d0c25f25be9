// The movement journal for bookkeeping (issue 7): one double entry per costed movement dated in
// the months from..to (the company's time zone, inclusive), with the account codes from the
// accountant's mapping (lib/data/accounts.ts). Values come from the costing engine
// (lib/costing/engine.ts, the company's cost formula, every movement up to the end of the range).
// Signed value v of a movement = the change of its kitchen's inventory; positive = debit inventory.
//   use, waste          Dr expense (movement:use / movement:waste)  Cr inventory (inventory:<category>)
//   count, adjustment   a loss: Dr movement:loss  Cr inventory;  a gain: Dr inventory  Cr movement:gain
//   receipt             Dr inventory  Cr goods received (movement:receipt) at quantity x the receipt's
//                       unit cost (what the supplier bills); when the formula values it otherwise (a
//                       backdated issue's shortfall settled, a reversal under the moving average) the
//                       difference goes to movement:gain or movement:loss, a third line
//   transfer            the value stays in the same inventory account (an item has one category):
//                       left out; only a (posting, lot) whose legs do not net to zero (a shortfall
//                       settled on arrival) books the difference on its arriving leg to gain or loss
// A reversal is its own entry, dated when posted, with the sides swapped: its value has the other
// sign, and a reversed count or adjustment keeps the original's loss or gain account.
// Money is exact until shown: each line is rounded half-even to the currency's decimals, so every
// entry balances as shown and the totals (sums of the lines) do too. A month's use + waste equals
// the usage report's cost for it whenever the values are whole cents; otherwise they can differ by
// rounding (the usage report rounds per row, the journal per entry).
// reports.read (accountants, managers, admins; every kitchen); the CSV needs reports.export.
import "server-only";
import { db } from "../../db/client";
import type { ItemCategory, MovementKind, StockMovementRow, StockUnit } from "../../db/types";
import { dateInZone } from "../alerts/expiry";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import type { CostFormula } from "../costing/engine";
import { costCompany } from "../costing/load";
import { toCsv } from "../csv";
import { currencyExponent } from "../units/money";
import { Dec, dec, plain, ZERO } from "../units/decimal";
import type { MappingKind } from "../validation/accounts";
import type { JournalQuery } from "../validation/journal";
import { loadAccountMapping } from "./accounts";
import { addMonths, BOM, dayStart, loadContext } from "./reports";

interface MappingKey { kind: MappingKind; key: string }

export interface JournalLine {
  side: "debit" | "credit";
  account: string | null;
  accountName: string | null;
  mapping: MappingKey;
  amount: string;
}

export interface JournalEntry {
  date: string;
  movementId: string;
  postingId: string;
  reversesId: string | null;
  kind: MovementKind;
  kitchen: { id: string; code: string; name: string };
  item: { id: string; sku: string; name: string; category: ItemCategory };
  quantity: string;
  unit: StockUnit;
  value: string;
  amount: string;
  description: string;
  lines: JournalLine[];
}

export interface JournalAccount {
  account: string | null;
  name: string | null;
  mappings: MappingKey[];
  debit: string;
  credit: string;
  net: string;
}

export interface Journal {
  from: string;
  to: string;
  kitchen: { id: string; code: string; name: string } | null;
  currency: string;
  costFormula: CostFormula;
  entries: JournalEntry[];
  byAccount: JournalAccount[];
  unmapped: (MappingKey & { lines: number })[];
  transfersLeftOut: number;
  totals: { debit: string; credit: string };
}

type MovementRow = Pick<StockMovementRow, "id" | "posting_id" | "kind" | "kitchen_id" | "item_id" | "lot_id" | "delta" | "unit_cost" | "reverses_id" | "occurred_at" | "recorded_at">;

const KIND_WORDS: Record<MovementKind, string> = {
  receipt: "receipt", transfer: "transfer cost difference", use: "use", waste: "waste", adjustment: "adjustment", count: "count difference",
};

export async function journal(user: CurrentUser, q: JournalQuery): Promise<Journal> {
  const { company, kitchens, kitchen, items } = await loadContext(user, q.kitchen);
  if (q.format === "csv") assertCan(user, "reports.export");
  const tz = company.time_zone;
  const start = dayStart(`${q.from}-01`, tz);
  const end = dayStart(`${addMonths(q.to, 1)}-01`, tz);
  const [costs, mapping] = await Promise.all([
    costCompany(db(), user.companyId, { before: end, formula: company.cost_formula }),
    loadAccountMapping(db(), user.companyId),
  ]);
  // the range's movements as the costing run read them (no second read), in ledger order
  const value = new Map<string, Dec>();
  const rows: MovementRow[] = [];
  for (const [itemId, result] of costs) {
    for (const m of result.movements) {
      if (m.occurredAt < start) continue;
      value.set(m.id, m.value);
      const src = m.source;
      rows.push({
        id: m.id, posting_id: src.postingId, kind: m.kind, kitchen_id: m.kitchenId, item_id: itemId, lot_id: src.lotId, delta: src.delta,
        unit_cost: src.lotCost, reverses_id: src.reversesId, occurred_at: src.occurredAt, recorded_at: src.recordedAt,
      });
    }
  }
  const order = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);
  rows.sort((a, b) =>
    a.occurred_at.getTime() - b.occurred_at.getTime() || a.recorded_at.getTime() - b.recorded_at.getTime() || order(a.posting_id, b.posting_id) || order(a.id, b.id));

  const places = currencyExponent(company.currency);
  const round = (v: Dec) => v.toDecimalPlaces(places, Dec.ROUND_HALF_EVEN);
  const accounts = new Map(mapping.entries.map((e) => [`${e.kind}:${e.key}`, e]));

  // transfers: the net of each (posting, lot)'s legs, booked on its arriving leg when not zero
  const transferNet = new Map<string, Dec>();
  for (const r of rows) {
    if (r.kind !== "transfer") continue;
    const k = `${r.posting_id}:${r.lot_id}`;
    transferNet.set(k, (transferNet.get(k) ?? ZERO).add(value.get(r.id) ?? ZERO));
  }
  const transferBooked = new Set<string>();

  const entries: JournalEntry[] = [];
  let transfersLeftOut = 0;
  for (const r of rows) {
    const item = items.get(r.item_id);
    if (!item) continue;
    const delta = dec(r.delta);
    let v: Dec; // the exact signed change of inventory this entry books
    if (r.kind === "transfer") {
      const k = `${r.posting_id}:${r.lot_id}`;
      const net = transferNet.get(k)!;
      if (round(net).isZero() || delta.lte(0) || transferBooked.has(k)) {
        if (!kitchen || r.kitchen_id === kitchen.id) transfersLeftOut++;
        continue;
      }
      transferBooked.add(k);
      v = net;
    } else {
      v = value.get(r.id) ?? ZERO;
    }
    if (kitchen && r.kitchen_id !== kitchen.id) continue;
    const inventoryAmount = round(v);
    // signed amounts, positive = debit; they add up to zero
    const parts: { mapping: MappingKey; signed: Dec }[] = [{ mapping: { kind: "inventory", key: item.category }, signed: inventoryAmount }];
    const gainOrLoss = (d: Dec): MappingKey => ({ kind: "movement", key: d.gt(0) ? "gain" : "loss" });
    if (r.kind === "receipt") {
      const billed = round(delta.mul(dec(r.unit_cost)));
      parts.push({ mapping: { kind: "movement", key: "receipt" }, signed: billed.neg() });
      const difference = inventoryAmount.sub(billed);
      if (!difference.isZero()) parts.push({ mapping: gainOrLoss(difference), signed: difference.neg() });
    } else if (r.kind === "use" || r.kind === "waste") {
      parts.push({ mapping: { kind: "movement", key: r.kind }, signed: inventoryAmount.neg() });
    } else if (r.kind === "count" || r.kind === "adjustment") {
      // the original's direction: a reversal gives back through the same account
      const originalDelta = r.reverses_id ? delta.neg() : delta;
      parts.push({ mapping: { kind: "movement", key: originalDelta.lt(0) ? "loss" : "gain" }, signed: inventoryAmount.neg() });
    } else {
      parts.push({ mapping: gainOrLoss(inventoryAmount), signed: inventoryAmount.neg() });
    }
    const lines: JournalLine[] = parts
      .filter((p) => !p.signed.isZero())
      .sort((a, b) => b.signed.cmp(a.signed) || 0)
      .map((p) => {
        const account = accounts.get(`${p.mapping.kind}:${p.mapping.key}`);
        return {
          side: p.signed.gt(0) ? "debit" : "credit", account: account?.accountCode ?? null, accountName: account?.name ?? null,
          mapping: p.mapping, amount: p.signed.abs().toFixed(places),
        };
      });
    if (lines.length === 0) continue;
    const k = kitchens.get(r.kitchen_id)!;
    const amount = lines.filter((l) => l.side === "debit").reduce((s, l) => s.add(dec(l.amount)), ZERO);
    const signed = r.kind === "count" || r.kind === "adjustment" ? (delta.gt(0) ? `+${plain(delta)}` : plain(delta)) : plain(delta.abs());
    const words = `${KIND_WORDS[r.kind]} ${signed} ${item.stock_unit} ${item.sku} ${item.name} (${k.code})`;
    entries.push({
      date: dateInZone(r.occurred_at, tz), movementId: r.id, postingId: r.posting_id, reversesId: r.reverses_id, kind: r.kind,
      kitchen: k, item: { id: item.id, sku: item.sku, name: item.name, category: item.category },
      quantity: plain(delta), unit: item.stock_unit, value: inventoryAmount.toFixed(places), amount: amount.toFixed(places),
      description: r.reverses_id ? `Reversal of ${words}` : words.charAt(0).toUpperCase() + words.slice(1),
      lines,
    });
  }

  // per account code (several keys may share one), then each unmapped key on its own
  interface Acc { account: string | null; name: string | null; mappings: MappingKey[]; debit: Dec; credit: Dec }
  const byAccount = new Map<string, Acc>();
  const unmapped = new Map<string, MappingKey & { lines: number }>();
  let debit = ZERO;
  let credit = ZERO;
  for (const e of entries) {
    for (const l of e.lines) {
      const id = l.account !== null ? `a:${l.account}` : `u:${l.mapping.kind}:${l.mapping.key}`;
      let a = byAccount.get(id);
      if (!a) byAccount.set(id, (a = { account: l.account, name: null, mappings: [], debit: ZERO, credit: ZERO }));
      a.name ??= l.accountName;
      if (!a.mappings.some((m) => m.kind === l.mapping.kind && m.key === l.mapping.key)) a.mappings.push(l.mapping);
      const amount = dec(l.amount);
      if (l.side === "debit") { a.debit = a.debit.add(amount); debit = debit.add(amount); }
      else { a.credit = a.credit.add(amount); credit = credit.add(amount); }
      if (l.account === null) {
        const u = unmapped.get(id) ?? { ...l.mapping, lines: 0 };
        u.lines++;
        unmapped.set(id, u);
      }
    }
  }
  const accountRows = [...byAccount.values()]
    .sort((a, b) => (a.account === null) !== (b.account === null) ? (a.account === null ? 1 : -1)
      : a.account !== null && b.account !== null ? (a.account < b.account ? -1 : a.account > b.account ? 1 : 0)
        : `${a.mappings[0]!.kind}:${a.mappings[0]!.key}` < `${b.mappings[0]!.kind}:${b.mappings[0]!.key}` ? -1 : 1)
    .map((a) => ({ account: a.account, name: a.name, mappings: a.mappings, debit: a.debit.toFixed(places), credit: a.credit.toFixed(places), net: a.debit.sub(a.credit).toFixed(places) }));

  return {
    from: q.from, to: q.to, kitchen, currency: company.currency, costFormula: company.cost_formula,
    entries, byAccount: accountRows, unmapped: [...unmapped.values()], transfersLeftOut,
    totals: { debit: debit.toFixed(places), credit: credit.toFixed(places) },
  };
}

/** One CSV line per journal line (RFC 4180; amounts as plain decimals, the empty side empty). */
export function journalCsv(j: Journal, bom = false): string {
  return (bom ? BOM : "") + toCsv(
    ["date", "movement_id", "posting_id", "kind", "kitchen_code", "sku", "account", "account_name", "mapping", "debit", "credit", "currency", "description"],
    j.entries.flatMap((e) => e.lines.map((l) => [
      e.date, e.movementId, e.postingId, e.kind, e.kitchen.code, e.item.sku, l.account, l.accountName, `${l.mapping.kind}:${l.mapping.key}`,
      l.side === "debit" ? l.amount : "", l.side === "credit" ? l.amount : "", j.currency, e.description,
    ])),
  );
}
