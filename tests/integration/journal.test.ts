// GET /api/reports/journal and GET/PUT /api/reports/accounts on a small ledger worked by hand.
// Double entry (common practice): every entry's debits equal its credits; a stock account's
// balance is the stock's value (so it must equal the valuation report); use and waste are
// expenses (so they must equal the usage report's cost). The costs follow IAS 2 para. 25 (FIFO
// layers, or the moving weighted average; per kitchen), as lib/costing/engine.ts computes them.
//
// Europe/London, EUR, kitchens A and B. A cure (g) and a spice (g). Costs per g. FIFO unless said.
// Cure:
//   1 Oct  A receipt L1 1000 @ 0.02                 Dr stock-cure 20.00 / Cr goods received 20.00
//   8 Oct  A receipt L2  500 @ 0.03                 Dr stock-cure 15.00 / Cr goods received 15.00
//  12 Oct  A use 1200: 1000 x 0.02 + 200 x 0.03     Dr use 26.00 / Cr stock-cure 26.00, in two entries: the
//          draw takes two lots (L1 1000, L2 200), so two movements; FIFO gives the older layers to
//          whichever the engine costs first, so the split (4.00 + 22.00 or 20.00 + 6.00) is not fixed
//  20 Oct  A waste 50: 50 x 0.03                    Dr waste 1.50 / Cr stock-cure 1.50
//   1 Nov  B use 50, posted after the 16 Nov receipt (backdated): B has no cost layer yet, so the
//          shortfall is taken at its lot's cost, 50 x 0.04  Dr use 2.00 / Cr stock-cure 2.00
//   3 Nov  A -> B 100: out of A 100 x 0.03 = 3.00; into B 3.00, and B's shortfall is paid back
//          from it: 50 x (0.04 - 0.03) = 0.50, so the in leg is 3.50 and the legs net +0.50
//                                                   Dr stock-cure 0.50 / Cr gain 0.50 (the out leg: no entry)
//  10 Nov  A count L2: 150 on hand, 160 counted, +10 at A's latest receipt cost 0.03
//                                                   Dr stock-cure 0.30 / Cr gain 0.30
//  15 Nov  B use 40: B's layer 50 x 0.03 -> 40 x 0.03  Dr use 1.20 / Cr stock-cure 1.20
//  16 Nov  B receipt L3 100 @ 0.04                  Dr stock-cure 4.00 / Cr goods received 4.00
//  today   reversal of the 15 Nov use               Dr stock-cure 1.20 / Cr use 1.20
// Spice (A):
//   2 Oct  receipt 2000 @ 0.005                     Dr stock-spice 10.00 / Cr goods received 10.00
//  25 Oct  use 600 x 0.005                          Dr use 3.00 / Cr stock-spice 3.00
//   5 Nov  adjustment -100 x 0.005                  Dr loss 0.50 / Cr stock-spice 0.50
//  20 Nov  receipt 400 @ 0.006                      Dr stock-spice 2.40 / Cr goods received 2.40
//  today   reversal of the adjustment (+100, back at 0.50)   Dr stock-spice 0.50 / Cr loss 0.50
//  today   reversal of the 20 Nov receipt (FIFO: its own layer, 400 x 0.006)
//                                                   Dr goods received 2.40 / Cr stock-spice 2.40
// Debits in all: 20 + 15 + 26 + 1.5 + 2 + 0.5 + 0.3 + 1.2 + 4 + 1.2 + 10 + 3 + 0.5 + 2.4 + 0.5 + 2.4 = 90.50.
// Per account: stock-cure Dr 20 + 15 + 0.5 + 0.3 + 4 + 1.2 = 41.00, Cr 26 + 1.5 + 2 + 1.2 = 30.70 (net 10.30:
//   A 160 g = 4.80, B 150 g = 10 x 0.03 + 40 x 0.03 + 100 x 0.04 = 5.50); stock-spice Dr 10 + 2.4 + 0.5 = 12.90,
//   Cr 3 + 0.5 + 2.4 = 5.90 (net 7.00 = 1400 g x 0.005); goods received Dr 2.40, Cr 20 + 15 + 4 + 10 + 2.4 = 51.40;
//   gain Cr 0.80; use Dr 26 + 2 + 1.2 + 3 = 32.20, Cr 1.20; waste Dr 1.50; loss Dr 0.50, Cr 0.50.
// Use + waste per month: Oct 26 + 1.5 + 3 = 30.50; Nov 2 + 1.2 = 3.20; this month -1.20 (the reversal).
//
// Moving average, the spice only: 2000 @ 0.005 = 10.00; use 600 = 3.00 (1400, 7.00); adjustment -100 =
// 0.50 (1300, 6.50); receipt 400 @ 0.006 (1700, 8.90); the adjustment reversed +0.50 (1800, 9.40); the
// receipt reversed at the average: 9.40 x 400 / 1800 = 2.088889 -> 2.09, while the supplier billed
// 400 x 0.006 = 2.40: Dr goods received 2.40 / Cr stock-spice 2.09 / Cr gain 0.31.
import Papa from "papaparse";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as accountsGet, PUT as accountsPut } from "../../app/api/reports/accounts/route";
import { GET as journalRoute } from "../../app/api/reports/journal/route";
import { GET as usageRoute } from "../../app/api/reports/usage/route";
import { GET as valuationRoute } from "../../app/api/reports/valuation/route";
import { db } from "../../db/client";
import { postMovement, reverseMovement } from "../../lib/data/ledger";
import { createCompany, tag, type TestCompany } from "../support/factory";
import { buildRequest, call } from "../support/http";
import { currentUser, sessionCookieFor } from "../support/sessions";
import { createItem } from "../support/stock";

let co: TestCompany;
let other: TestCompany;
let cure: string;
let spice: string;
const cookie: Record<string, string> = {};
const at = (day: string) => `${day}T10:00:00Z`;
/** This month in London: the reversals are dated when posted. */
const thisMonth = new Intl.DateTimeFormat("en-CA", { timeZone: "Europe/London", year: "numeric", month: "2-digit" }).format(new Date()).slice(0, 7);
const RANGE = `from=2026-10&to=${thisMonth}`;
const ids: Record<string, string> = {};
const postings: Record<string, string> = {};

const MAPPING = [
  { kind: "inventory", key: "cure", accountCode: "1300", name: "Stock - cures" },
  { kind: "inventory", key: "spice", accountCode: "1320", name: "Stock - spices" },
  { kind: "movement", key: "receipt", accountCode: "2150", name: "Goods received not invoiced" },
  { kind: "movement", key: "use", accountCode: "5010", name: "Materials used" },
  { kind: "movement", key: "waste", accountCode: "5080" },
  { kind: "movement", key: "loss", accountCode: "5090", name: "Stock losses" },
  { kind: "movement", key: "gain", accountCode: "4890", name: "Stock gains" },
];

beforeAll(async () => {
  co = await createCompany({ kitchens: 2 });
  other = await createCompany({ kitchens: 1 });
  const m = await currentUser(co.users.manager.id);
  const [A, B] = [co.kitchens[0]!.code, co.kitchens[1]!.code];
  cure = (await createItem(co.company.id, { category: "cure" })).sku;
  spice = (await createItem(co.company.id, { category: "spice" })).sku;
  const lot = (code: string, date: string, unitCost: string) => ({ code: `${code}-${tag()}`, date, dateKind: "best_before", unitCost });
  const post = async (name: string, input: Record<string, unknown>) => {
    const rows = await postMovement(m, input as never);
    ids[name] = rows.find((r) => Number(r.delta) > 0)?.id ?? rows[0]!.id;
    postings[name] = rows[0]!.postingId;
    return rows;
  };
  await post("cureR1", { kind: "receipt", kitchen: A, item: cure, quantity: "1000", unit: "g", occurredAt: at("2026-10-01"), lot: lot("L1", "2027-03-01", "0.02") });
  const [r2] = await post("cureR2", { kind: "receipt", kitchen: A, item: cure, quantity: "500", unit: "g", occurredAt: at("2026-10-08"), lot: lot("L2", "2027-06-01", "0.03") });
  await post("cureUse", { kind: "use", kitchen: A, item: cure, quantity: "1200", unit: "g", occurredAt: at("2026-10-12") });
  await post("cureWaste", { kind: "waste", kitchen: A, item: cure, quantity: "50", unit: "g", reason: "bag split", occurredAt: at("2026-10-20") });
  // B's receipt is posted first (dated 16 Nov) so that the backdated 1 Nov use finds stock
  await post("cureR3", { kind: "receipt", kitchen: B, item: cure, quantity: "100", unit: "g", occurredAt: at("2026-11-16"), lot: lot("L3", "2027-09-01", "0.04") });
  await post("cureUseB1", { kind: "use", kitchen: B, item: cure, quantity: "50", unit: "g", occurredAt: at("2026-11-01") });
  await post("transferIn", { kind: "transfer", kitchen: A, toKitchen: B, item: cure, quantity: "100", unit: "g", occurredAt: at("2026-11-03") });
  await post("cureCount", { kind: "count", kitchen: A, item: cure, lot: r2!.lot.id, quantity: "160", unit: "g", occurredAt: at("2026-11-10") });
  await post("cureUseB2", { kind: "use", kitchen: B, item: cure, quantity: "40", unit: "g", occurredAt: at("2026-11-15") });
  await post("spiceR1", { kind: "receipt", kitchen: A, item: spice, quantity: "2000", unit: "g", occurredAt: at("2026-10-02"), lot: lot("S1", "2027-10-01", "0.005") });
  await post("spiceUse", { kind: "use", kitchen: A, item: spice, quantity: "600", unit: "g", occurredAt: at("2026-10-25") });
  await post("spiceAdj", { kind: "adjustment", kitchen: A, item: spice, quantity: "-100", unit: "g", reason: "spilt", occurredAt: at("2026-11-05") });
  await post("spiceR2", { kind: "receipt", kitchen: A, item: spice, quantity: "400", unit: "g", occurredAt: at("2026-11-20"), lot: lot("S2", "2027-11-01", "0.006") });
  for (const [name, of] of [["revCureUse", "cureUseB2"], ["revSpiceAdj", "spiceAdj"], ["revSpiceR2", "spiceR2"]] as const) {
    const [rev] = await reverseMovement(m, ids[of]!);
    ids[name] = rev!.id;
    postings[name] = rev!.postingId;
  }
  for (const role of ["accountant", "manager", "admin", "buyer", "kitchen_lead"] as const) cookie[role] = await sessionCookieFor(co.users[role].id);
  cookie.other = await sessionCookieFor(other.users.accountant.id);
});

const journal = (who: string, query: string) => call(journalRoute, { path: `/api/reports/journal?${query}`, cookie: cookie[who] });
const getMapping = (who: string) => call(accountsGet, { path: "/api/reports/accounts", cookie: cookie[who] });
const putMapping = (who: string, entries: unknown) => call(accountsPut, { method: "PUT", path: "/api/reports/accounts", cookie: cookie[who], body: { entries } });
const setFormula = (f: "fifo" | "average") => db()("companies").where({ id: co.company.id }).update({ cost_formula: f });
type Line = { side: "debit" | "credit"; account: string | null; accountName: string | null; mapping: { kind: string; key: string }; amount: string };
type Entry = { date: string; movementId: string; postingId: string; quantity: string; kind: string; reversesId: string | null; amount: string; value: string; description: string; kitchen: { code: string }; item: { sku: string }; lines: Line[] };
const cents = (s: string) => Math.round(Number(s) * 100); // amounts have two decimals: whole cents are exact integers
const sumCents = (xs: string[]) => xs.reduce((s, x) => s + cents(x), 0);
/** [debit key, credit key, amount] with keys as kind:key, for a two-line entry */
const shape = (e: Entry) => {
  const d = e.lines.filter((l) => l.side === "debit").map((l) => `${l.mapping.kind}:${l.mapping.key}`);
  const c = e.lines.filter((l) => l.side === "credit").map((l) => `${l.mapping.kind}:${l.mapping.key}`);
  return [d.join("+"), c.join("+"), e.amount];
};
/** The entries of each posting, in order: [posting id, entries, the sum of their amounts in cents]. */
const byPosting = (entries: Entry[]) => {
  const out = new Map<string, Entry[]>();
  for (const e of entries) out.set(e.postingId, [...(out.get(e.postingId) ?? []), e]);
  return [...out].map(([id, es]) => [id, es, sumCents(es.map((e) => e.amount))] as const);
};

describe.sequential("the movement journal", () => {
  it("with no mapping: every entry worked by hand, accounts empty and the unmapped keys named", async () => {
    await setFormula("fifo");
    const r = await journal("accountant", RANGE);
    expect(r.status, JSON.stringify(r.body)).toBe(200);
    const entries = r.body.entries as Entry[];
    const byId = new Map(entries.map((e) => [e.movementId, e]));
    const want: [string, string, string, string][] = [
      ["cureR1", "inventory:cure", "movement:receipt", "20.00"],
      ["spiceR1", "inventory:spice", "movement:receipt", "10.00"],
      ["cureR2", "inventory:cure", "movement:receipt", "15.00"],
      ["cureUse", "movement:use", "inventory:cure", "26.00"],
      ["cureWaste", "movement:waste", "inventory:cure", "1.50"],
      ["spiceUse", "movement:use", "inventory:spice", "3.00"],
      ["cureUseB1", "movement:use", "inventory:cure", "2.00"],
      ["transferIn", "inventory:cure", "movement:gain", "0.50"],
      ["spiceAdj", "movement:loss", "inventory:spice", "0.50"],
      ["cureCount", "inventory:cure", "movement:gain", "0.30"],
      ["cureUseB2", "movement:use", "inventory:cure", "1.20"],
      ["cureR3", "inventory:cure", "movement:receipt", "4.00"],
      ["spiceR2", "inventory:spice", "movement:receipt", "2.40"],
      ["revCureUse", "inventory:cure", "movement:use", "1.20"],
      ["revSpiceAdj", "inventory:spice", "movement:loss", "0.50"],
      ["revSpiceR2", "movement:receipt", "inventory:spice", "2.40"],
    ];
    // in date order, one entry per movement with a value (the transfer's out leg has none; the use of
    // 1200 g drew two lots, so two entries)
    const groups = byPosting(entries);
    expect(groups.map(([id]) => id)).toEqual(want.map(([name]) => postings[name]));
    for (const [[, es, total], [name, debit, credit, amount]] of groups.map((g, i) => [g, want[i]!] as const)) {
      expect(es.length, name).toBe(name === "cureUse" ? 2 : 1);
      expect(total, name).toBe(cents(amount));
      for (const e of es) expect(shape(e).slice(0, 2), name).toEqual([debit, credit]);
    }
    expect(shape(byId.get(ids.transferIn!)!)).toEqual(["inventory:cure", "movement:gain", "0.50"]);
    expect(r.body.transfersLeftOut).toBe(1);
    // debits = credits, per entry and in total (90.50 by hand)
    for (const e of entries) {
      expect(sumCents(e.lines.filter((l) => l.side === "debit").map((l) => l.amount)), e.description).toBe(sumCents(e.lines.filter((l) => l.side === "credit").map((l) => l.amount)));
      expect(e.lines.every((l) => l.account === null)).toBe(true);
    }
    expect(r.body.totals).toEqual({ debit: "90.50", credit: "90.50" });
    // reversals: their own entries, dated this month, pointing at what they reverse
    const rev = byId.get(ids.revSpiceR2!)!;
    expect(rev).toMatchObject({ reversesId: ids.spiceR2, kind: "receipt", value: "-2.40" });
    expect(rev.date.slice(0, 7)).toBe(thisMonth);
    const uses = entries.filter((e) => e.postingId === postings.cureUse);
    for (const e of uses) expect(e).toMatchObject({ date: "2026-10-12", kind: "use", unit: "g", item: { sku: cure, category: "cure" }, kitchen: { code: co.kitchens[0]!.code } });
    expect(sumCents(uses.map((e) => e.value))).toBe(-2600);
    expect(uses.map((e) => Number(e.quantity)).sort((a, b) => a - b)).toEqual([-1000, -200]);
    expect(byId.get(ids.cureWaste!)).toMatchObject({ date: "2026-10-20", kind: "waste", value: "-1.50", amount: "1.50" });
    expect(byId.get(ids.transferIn!)).toMatchObject({ kitchen: { code: co.kitchens[1]!.code }, quantity: "100" });
    // unmapped: the keys this journal needed, with their line counts
    expect(new Map((r.body.unmapped as { kind: string; key: string; lines: number }[]).map((u) => [`${u.kind}:${u.key}`, u.lines]))).toEqual(new Map([
      ["inventory:cure", 11], ["inventory:spice", 6], ["movement:receipt", 6], ["movement:use", 6], ["movement:waste", 1], ["movement:gain", 2], ["movement:loss", 2],
    ]));
    const m = await getMapping("manager");
    expect(m.status).toBe(200);
    expect(m.body.entries).toEqual([]);
    expect(m.body.unmapped).toHaveLength(9);
  });

  it("with the accountant's mapping: account codes on every line and the sums per account", async () => {
    const put = await putMapping("accountant", MAPPING);
    expect(put.status, JSON.stringify(put.body)).toBe(200);
    expect(put.body.entries[0]).toEqual({ kind: "inventory", key: "cure", accountCode: "1300", name: "Stock - cures" });
    expect(put.body.entries.find((e: { key: string }) => e.key === "waste").name).toBeNull();
    expect(put.body.unmapped).toEqual([{ kind: "inventory", key: "casing" }, { kind: "inventory", key: "ingredient" }]);
    const r = await journal("accountant", RANGE);
    expect(r.body.unmapped).toEqual([]);
    const waste = (r.body.entries as Entry[]).find((e) => e.movementId === ids.cureWaste)!;
    expect(waste.lines).toEqual([
      { side: "debit", account: "5080", accountName: null, mapping: { kind: "movement", key: "waste" }, amount: "1.50" },
      { side: "credit", account: "1300", accountName: "Stock - cures", mapping: { kind: "inventory", key: "cure" }, amount: "1.50" },
    ]);
    const use = (r.body.entries as Entry[]).find((e) => e.movementId === ids.spiceUse)!;
    expect(use.lines.map((l) => [l.side, l.account, l.accountName, l.amount])).toEqual([["debit", "5010", "Materials used", "3.00"], ["credit", "1320", "Stock - spices", "3.00"]]);
    expect(r.body.byAccount.map((a: { account: string; debit: string; credit: string; net: string }) => [a.account, a.debit, a.credit, a.net])).toEqual([
      ["1300", "41.00", "30.70", "10.30"],
      ["1320", "12.90", "5.90", "7.00"],
      ["2150", "2.40", "51.40", "-49.00"],
      ["4890", "0.00", "0.80", "-0.80"],
      ["5010", "32.20", "1.20", "31.00"],
      ["5080", "1.50", "0.00", "1.50"],
      ["5090", "0.50", "0.50", "0.00"],
    ]);
    expect(sumCents(r.body.byAccount.map((a: { net: string }) => a.net))).toBe(0);
    // one account code for two keys: both keys on one row
    await putMapping("admin", MAPPING.map((e) => (e.key === "gain" ? { ...e, accountCode: "5090" } : e)));
    const shared = await journal("accountant", RANGE);
    const row = shared.body.byAccount.find((a: { account: string }) => a.account === "5090");
    expect(row).toMatchObject({ debit: "0.50", credit: "1.30", net: "-0.80" });
    expect(row.mappings.map((x: { key: string }) => x.key).sort()).toEqual(["gain", "loss"]);
    await putMapping("accountant", MAPPING);
  });

  it("stock accounts = the valuation report; use + waste per month = the usage report's cost", async () => {
    const j = (await journal("accountant", RANGE)).body;
    const today = new Intl.DateTimeFormat("en-CA", { timeZone: "Europe/London" }).format(new Date());
    const v = (await call(valuationRoute, { path: `/api/reports/valuation?asOf=${today}`, cookie: cookie.accountant })).body;
    const net = (code: string) => j.byAccount.find((a: { account: string }) => a.account === code).net;
    expect(net("1300")).toBe(v.totals.byCategory.cure);
    expect(net("1320")).toBe(v.totals.byCategory.spice);
    const u = (await call(usageRoute, { path: `/api/reports/usage?${RANGE}&groupBy=category`, cookie: cookie.accountant })).body;
    const usageByMonth = new Map<string, number>();
    for (const row of u.rows as { month: string; cost: string }[]) usageByMonth.set(row.month, (usageByMonth.get(row.month) ?? 0) + cents(row.cost));
    const journalByMonth = new Map<string, number>();
    for (const e of j.entries as Entry[]) {
      for (const l of e.lines) {
        if (l.mapping.kind !== "movement" || (l.mapping.key !== "use" && l.mapping.key !== "waste")) continue;
        const month = e.date.slice(0, 7);
        journalByMonth.set(month, (journalByMonth.get(month) ?? 0) + (l.side === "debit" ? 1 : -1) * cents(l.amount));
      }
    }
    expect(journalByMonth).toEqual(usageByMonth);
    expect(journalByMonth.get("2026-10")).toBe(3050);
    expect(journalByMonth.get("2026-11")).toBe(320);
    expect(journalByMonth.get(thisMonth)).toBe(-120);
  });

  it("one month, one kitchen", async () => {
    const oct = (await journal("manager", "from=2026-10&to=2026-10")).body;
    expect(byPosting(oct.entries).map(([, , total]) => total)).toEqual([2000, 1000, 1500, 2600, 150, 300]);
    expect(oct.totals).toEqual({ debit: "75.50", credit: "75.50" });
    const b = (await journal("accountant", `from=2026-11&to=2026-11&kitchen=${co.kitchens[1]!.code}`)).body;
    expect(b.kitchen.code).toBe(co.kitchens[1]!.code);
    expect(b.entries.map((e: Entry) => [e.movementId, e.amount])).toEqual([[ids.cureUseB1, "2.00"], [ids.transferIn, "0.50"], [ids.cureUseB2, "1.20"], [ids.cureR3, "4.00"]]);
    expect(b.transfersLeftOut).toBe(0);
    const a = (await journal("accountant", `from=2026-11&to=2026-11&kitchen=${co.kitchens[0]!.code}`)).body;
    expect(a.transfersLeftOut).toBe(1);
  });

  it("moving average: a receipt reversed at the average books the difference to the supplier's bill", async () => {
    await setFormula("average");
    try {
      const r = await journal("accountant", RANGE);
      const entries = r.body.entries as Entry[];
      const rev = entries.find((e) => e.movementId === ids.revSpiceR2)!;
      const line = (key: string) => rev.lines.find((l) => l.mapping.key === key)!;
      expect([line("receipt").side, line("receipt").account, line("receipt").amount]).toEqual(["debit", "2150", "2.40"]);
      expect([line("spice").side, line("spice").account, line("spice").amount]).toEqual(["credit", "1320", "2.09"]);
      expect([line("gain").side, line("gain").account, line("gain").amount]).toEqual(["credit", "4890", "0.31"]);
      expect(rev.value).toBe("-2.09");
      for (const e of entries) {
        expect(sumCents(e.lines.filter((l) => l.side === "debit").map((l) => l.amount)), e.description).toBe(sumCents(e.lines.filter((l) => l.side === "credit").map((l) => l.amount)));
      }
      expect(r.body.totals.debit).toBe(r.body.totals.credit);
      expect(r.body.costFormula).toBe("average");
      const today = new Intl.DateTimeFormat("en-CA", { timeZone: "Europe/London" }).format(new Date());
      const v = (await call(valuationRoute, { path: `/api/reports/valuation?asOf=${today}`, cookie: cookie.accountant })).body;
      expect(r.body.byAccount.find((a: { account: string }) => a.account === "1320").net).toBe(v.totals.byCategory.spice); // 7.31
      expect(v.totals.byCategory.spice).toBe("7.31");
    } finally {
      await setFormula("fifo");
    }
  });

  it("CSV: one line per journal line, parsed back with papaparse equal to the JSON; a BOM when asked", async () => {
    const json = (await journal("accountant", RANGE)).body;
    const res = await journalRoute(buildRequest({ path: `/api/reports/journal?${RANGE}&format=csv&bom=true`, cookie: cookie.accountant }), { params: Promise.resolve({}) });
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("text/csv; charset=utf-8");
    expect(res.headers.get("content-disposition")).toBe(`attachment; filename="journal-2026-10-to-${thisMonth}.csv"`);
    const text = new TextDecoder("utf-8", { ignoreBOM: true }).decode(await res.arrayBuffer());
    expect(text.charCodeAt(0)).toBe(0xfeff);
    const parsed = Papa.parse<Record<string, string>>(text.slice(1), { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data.map((r) => [r.date, r.movement_id, r.account, r.debit, r.credit, r.currency, r.description])).toEqual(
      (json.entries as Entry[]).flatMap((e) => e.lines.map((l) => [e.date, e.movementId, l.account, l.side === "debit" ? l.amount : "", l.side === "credit" ? l.amount : "", "EUR", e.description])),
    );
    expect(sumCents(parsed.data.map((r) => r.debit ?? "").filter(Boolean))).toBe(cents(json.totals.debit));
    expect(sumCents(parsed.data.map((r) => r.credit ?? "").filter(Boolean))).toBe(cents(json.totals.credit));
    // an account name that a spreadsheet would run is neutralised in the CSV and kept as typed in the JSON
    await putMapping("accountant", MAPPING.map((e) => (e.key === "spice" ? { ...e, name: "=HYPERLINK(\"http://x.example\")" } : e)));
    try {
      const j = (await journal("accountant", "from=2026-10&to=2026-10")).body;
      expect((j.entries as Entry[]).find((e) => e.item.sku === spice)!.lines.find((l) => l.account === "1320")).toMatchObject({ accountName: "=HYPERLINK(\"http://x.example\")" });
      const raw = await (await journalRoute(buildRequest({ path: "/api/reports/journal?from=2026-10&to=2026-10&format=csv", cookie: cookie.accountant }), { params: Promise.resolve({}) })).text();
      const rows = Papa.parse<Record<string, string>>(raw, { header: true, skipEmptyLines: true }).data;
      expect(rows.find((r) => r.account === "1320")!.account_name).toBe("'=HYPERLINK(\"http://x.example\")");
      expect(rows.find((r) => r.account === "1320")!.debit).toBe("10.00");
    } finally {
      await putMapping("accountant", MAPPING);
    }
  });

  it("roles: 403 for buyers and kitchen leads; only admins and accountants set the mapping", async () => {
    for (const who of ["buyer", "kitchen_lead"]) {
      expect((await journal(who, RANGE)).status, who).toBe(403);
      expect((await call(journalRoute, { path: `/api/reports/journal?${RANGE}&format=csv`, cookie: cookie[who] })).status, who).toBe(403);
      expect((await getMapping(who)).status, who).toBe(403);
      expect((await putMapping(who, MAPPING)).status, who).toBe(403);
    }
    expect((await journal("manager", RANGE)).status).toBe(200);
    expect((await getMapping("manager")).status).toBe(200);
    expect((await putMapping("manager", [])).status).toBe(403);
    expect((await getMapping("accountant")).body.entries).toHaveLength(MAPPING.length);
    expect((await putMapping("admin", MAPPING)).status).toBe(200);
    expect((await putMapping("accountant", MAPPING)).status).toBe(200);
  });

  it("422 names the bad entry and field, and writes nothing", async () => {
    const cases: [unknown[], string][] = [
      [[MAPPING[0], { kind: "inventory", key: "pepper", accountCode: "1390" }], "entries.1.key"],
      [[MAPPING[0], MAPPING[1], { kind: "movement", key: "transfer", accountCode: "1390" }], "entries.2.key"],
      [[{ ...MAPPING[0], accountCode: "13 00" }], "entries.0.accountCode"],
      [[{ ...MAPPING[0], accountCode: "=1+1" }], "entries.0.accountCode"],
      [[{ ...MAPPING[0], accountCode: "123456789012345678901" }], "entries.0.accountCode"],
      [[MAPPING[0], MAPPING[1], MAPPING[2], { ...MAPPING[0], accountCode: "1301" }], "entries.3.key"],
      [[{ ...MAPPING[0], kind: "liability" }], "entries.0.kind"],
      [[{ ...MAPPING[0], name: "x".repeat(101) }], "entries.0.name"],
    ];
    for (const [entries, field] of cases) {
      const r = await putMapping("accountant", entries);
      expect(r.status, field).toBe(422);
      expect(Object.keys(r.body.error.details.fields), JSON.stringify(r.body)).toContain(field);
    }
    expect((await getMapping("accountant")).body.entries).toHaveLength(MAPPING.length);
    const bad = await journal("accountant", "from=2026-11&to=2026-10");
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.body.error.details.fields)).toContain("to");
    expect((await journal("accountant", "from=2026-1&to=2026-10")).status).toBe(422);
    const xlsx = await journal("accountant", `${RANGE}&format=xlsx`);
    expect(xlsx.status).toBe(422);
    expect(Object.keys(xlsx.body.error.details.fields)).toContain("format");
  });

  it("tenancy: another company sees none of it and its mapping is its own", async () => {
    expect((await journal("other", `${RANGE}&kitchen=${co.kitchens[0]!.code}`)).status).toBe(404);
    const theirs = await journal("other", RANGE);
    expect(theirs.status).toBe(200);
    expect(theirs.body.entries).toEqual([]);
    expect(theirs.body.totals).toEqual({ debit: "0.00", credit: "0.00" });
    expect((await getMapping("other")).body.entries).toEqual([]);
    expect((await putMapping("other", [{ kind: "inventory", key: "cure", accountCode: "9999" }])).status).toBe(200);
    expect((await getMapping("accountant")).body.entries[0].accountCode).toBe("1300");
    expect((await getMapping("other")).body.entries).toEqual([{ kind: "inventory", key: "cure", accountCode: "9999", name: null }]);
  });
});
