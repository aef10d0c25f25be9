// Demo stock for the first demo company (Quillmoor Provisions): its catalogue (casings by calibre,
// cures with their label strengths, spices and other ingredients, with purchase packs), par levels
// and reorder points per kitchen, and six months of history ending today: weekly deliveries from
// three invented suppliers, batches several times a week, the odd waste, transfers between
// kitchens, month-end counts, and two mistakes of the last working day put right today by reversal.
//
// Everything goes through lib/data (createItem, setStockLevel, postMovement, postCount,
// reverseMovement) as the demo users themselves (the buyer receives, the lead and the manager use,
// waste and count), with back-dated occurredAt, so every ledger invariant holds. lib/data reads
// DATABASE_URL (db/client.ts): the knex handed in must be a handle on that same database, which is
// checked. Run under the react-server condition (`node --conditions=react-server --import tsx`),
// which makes the "server-only" guard of lib/data an empty module.
import type { Knex } from "knex";
import { db } from "../client";
import type { CurrentUser } from "../../lib/auth/current-user";
import { createItem, getItem } from "../../lib/data/items";
import { postCount, postMovement, reverseMovement } from "../../lib/data/ledger";
import { setStockLevel } from "../../lib/data/stock-levels";
import { loadCurrentUser } from "../../lib/data/users";
import { dec, plain } from "../../lib/units";
import { countSheetInput, movementInput, stockLevelInput } from "../../lib/validation/movements";
import { DEMO_ITEMS, KITCHEN_CODES } from "./demo-stock-catalogue";
import { HISTORY_DAYS, localDate, planDemoStock, type PlanItem, type Posting, type Who } from "./demo-stock-plan";

export interface DemoStockSummary {
  items: number;
  lots: number;
  movements: number;
  levels: number;
  days: number;
  /** kitchen|sku whose on hand differs from what the plan expected (empty when all went as planned) */
  mismatches: string[];
  ms: number;
}

/** The demo users who do the work: the first active user of each role, by e-mail. */
const firstActive = (knex: Knex, companyId: string, role: string) =>
  knex("app_users").where({ company_id: companyId, role }).whereNull("disabled_at").orderBy("email").first<{ id: string } | undefined>("id");

/**
 * Why the demo stock cannot be posted into this company as it stands (empty when it can): its plan
 * needs the demo kitchens, an active buyer, manager and kitchen lead (the lead working at the Yard),
 * and any demo SKU already there must be the same kind of item. A demo company changed by hand
 * since it was loaded is left alone rather than half-filled.
 */
export async function demoStockBlockers(knex: Knex, companyId: string): Promise<string[]> {
  const out: string[] = [];
  const kitchens: { id: string; code: string; archived_at: Date | null }[] = await knex("kitchens").where({ company_id: companyId }).whereIn("code", KITCHEN_CODES).select("id", "code", "archived_at");
  for (const code of KITCHEN_CODES) {
    const k = kitchens.find((x) => x.code === code);
    if (!k) out.push(`kitchen ${code} is missing`);
    else if (k.archived_at) out.push(`kitchen ${code} is archived`);
  }
  for (const role of ["buyer", "manager", "kitchen_lead"]) {
    if (!(await firstActive(knex, companyId, role))) out.push(`no active ${role.replace("_", " ")}`);
  }
  const lead = await firstActive(knex, companyId, "kitchen_lead");
  const yard = kitchens.find((k) => k.code === "YARD");
  if (lead && yard && !(await knex("user_kitchens").where({ user_id: lead.id, kitchen_id: yard.id }).first("kitchen_id"))) {
    out.push("the kitchen lead does not work at YARD");
  }
  const existing: { sku: string; category: string; stock_unit: string; track_lots: boolean; archived_at: Date | null }[] = await knex("items")
    .where({ company_id: companyId }).whereIn("sku", DEMO_ITEMS.map((d) => d.draft.sku)).select("sku", "category", "stock_unit", "track_lots", "archived_at");
  for (const row of existing) {
    const d = DEMO_ITEMS.find((x) => x.draft.sku === row.sku)!.draft;
    const same = row.category === d.category && row.stock_unit === d.unit && (d.trackLots === undefined || row.track_lots === d.trackLots) && !row.archived_at;
    if (!same) out.push(`item ${row.sku} is not the demo's`);
  }
  return out;
}

export async function loadDemoStock(knex: Knex, companyId: string): Promise<DemoStockSummary> {
  const started = performance.now();
  if (!(await db()("companies").where({ id: companyId }).first("id"))) {
    throw new Error("loadDemoStock posts through lib/data, which uses DATABASE_URL: point it at the database being seeded.");
  }
  const company: { time_zone: string } = await knex("companies").where({ id: companyId }).first("time_zone");

  // the demo users who do the work
  const byRole = async (role: string): Promise<CurrentUser> => {
    const row = await firstActive(knex, companyId, role);
    const user = row && (await loadCurrentUser(row.id));
    if (!user) throw new Error(`The demo company has no active ${role}.`);
    return user;
  };
  const actors: Record<Who, CurrentUser> = { buyer: await byRole("buyer"), manager: await byRole("manager"), lead: await byRole("kitchen_lead") };

  // the catalogue, as the buyer enters it (an item already entered by an earlier, interrupted load is kept)
  const entered = new Set<string>(await knex("items").where({ company_id: companyId }).whereIn("sku", DEMO_ITEMS.map((d) => d.draft.sku)).pluck("sku"));
  const items: PlanItem[] = await Promise.all(DEMO_ITEMS.map(async (d) => {
    const item = entered.has(d.draft.sku) ? await getItem(actors.buyer, d.draft.sku) : await createItem(actors.buyer, d.draft);
    const capacity = item.casing?.capacityKgPerPutUp ?? d.kgPerPiece ?? null;
    return {
      demo: d, sku: item.sku, category: item.category, stockUnit: item.stockUnit, trackLots: item.trackLots, units: item.itemUnits,
      fillingKgPerUnit: capacity === null ? null : dec(capacity),
    };
  }));

  const plan = planDemoStock(items, { today: localDate(new Date(), company.time_zone), timeZone: company.time_zone });

  // levels: the lead keeps the Yard's, the manager the others'
  await Promise.all(plan.levels.map((l) =>
    setStockLevel(l.kitchen === "YARD" ? actors.lead : actors.manager, stockLevelInput.parse({ kitchen: l.kitchen, item: l.item, parLevel: l.parLevel, reorderPoint: l.reorderPoint }))));

  // the history, in plan order except where nothing depends on the order (see Scheduler)
  const lotIds = new Map<string, string>();
  const lotId = (sku: string, code: string) => {
    const id = lotIds.get(`${sku}|${code}`);
    if (!id) throw new Error(`demo stock: lot ${code} of ${sku} was never received`);
    return id;
  };
  const post = async (p: Posting) => {
    const actor = actors[p.who];
    if (p.kind === "count") {
      const lines = p.lines.map((l) => ({ item: l.item, counted: l.counted, unit: l.unit, ...(l.lotCode ? { lot: lotId(l.item, l.lotCode) } : {}) }));
      await postCount(actor, countSheetInput.parse({ kitchen: p.kitchen, lines, note: p.note, countedAt: p.at }));
      return;
    }
    const { who: _who, at, ...rest } = p;
    const moved = await postMovement(actor, movementInput.parse({ ...rest, occurredAt: at }));
    if (p.kind === "receipt") lotIds.set(`${p.item}|${p.lot.code}`, moved[0]!.lot.id);
  };
  const scheduler = new Scheduler(6);
  for (const day of plan.days) {
    for (const p of [...day.sequential, ...KITCHEN_CODES.flatMap((k) => day.byKitchen[k])]) scheduler.add(p, () => post(p));
  }
  await scheduler.done();

  // today: a mistyped use and a receipt at the wrong kitchen, each reversed and posted again
  for (const c of plan.corrections) {
    const actor = actors[c.who];
    if (c.kind === "mistyped-use") {
      const wrong = await postMovement(actor, movementInput.parse({ kind: "use", kitchen: c.kitchen, item: c.item, ...c.wrong, occurredAt: c.at }));
      for (const m of wrong) await reverseMovement(actor, m.id, c.reason);
      await postMovement(actor, movementInput.parse({ kind: "use", kitchen: c.kitchen, item: c.item, ...c.right }));
    } else {
      const [wrong] = await postMovement(actor, movementInput.parse({
        kind: "receipt", kitchen: c.kitchen, item: c.item, quantity: c.quantity, unit: c.unit, lot: c.lot, supplier: c.supplier, occurredAt: c.at,
      }));
      await reverseMovement(actor, wrong!.id, c.reason);
      await postMovement(actor, movementInput.parse({ kind: "receipt", kitchen: c.rightKitchen, item: c.item, quantity: c.quantity, unit: c.unit, lot: wrong!.lot.id }));
    }
  }

  // what was posted against what was planned
  const onHand: { code: string; sku: string; on_hand: string }[] = await knex("stock_balances as b")
    .join("kitchens as k", "k.id", "b.kitchen_id")
    .join("items as i", "i.id", "b.item_id")
    .where("b.company_id", companyId)
    .groupBy("k.code", "i.sku")
    .select("k.code", "i.sku", knex.raw("sum(b.on_hand)::text as on_hand"));
  const actual = new Map(onHand.map((r) => [`${r.code}|${r.sku}`, plain(dec(r.on_hand))]));
  const keys = new Set([...actual.keys(), ...Object.keys(plan.expectedOnHand)]);
  const mismatches = [...keys].filter((key) => !dec(actual.get(key) ?? "0").eq(dec(plan.expectedOnHand[key] ?? "0")));

  const count = async (table: string) => Number((await knex(table).where({ company_id: companyId }).count<{ n: string }[]>("* as n"))[0]!.n);
  return {
    items: items.length,
    lots: await count("lots"),
    movements: await count("stock_movements"),
    levels: plan.levels.length,
    days: HISTORY_DAYS,
    mismatches,
    ms: Math.round(performance.now() - started),
  };
}

/**
 * Runs postings concurrently wherever their order cannot matter, so the history loads in a few
 * seconds: postings of one item in one kitchen keep their plan order (FEFO draws depend on it),
 * a count waits for everything before it in its kitchen and holds back everything after, a
 * transfer is ordered in both kitchens, and receipts of one item keep their order everywhere (the
 * ledger breaks FEFO ties between lots by when they were created).
 */
class Scheduler {
  private chains = new Map<string, Promise<void>>();
  private counts = new Map<string, Promise<void>>();
  private sinceCount = new Map<string, Promise<void>[]>();
  private all: Promise<void>[] = [];
  private running = 0;
  private waiting: (() => void)[] = [];
  constructor(private slots: number) {}

  private async slot<T>(fn: () => Promise<T>): Promise<T> {
    if (this.running >= this.slots) await new Promise<void>((resolve) => this.waiting.push(resolve));
    this.running++;
    try {
      return await fn();
    } finally {
      this.running--;
      this.waiting.shift()?.();
    }
  }

  add(p: Posting, fn: () => Promise<void>) {
    const kitchens = p.kind === "transfer" ? [p.kitchen, p.toKitchen] : [p.kitchen];
    const deps: (Promise<void> | undefined)[] = kitchens.map((k) => this.counts.get(k));
    const keys = p.kind === "count" ? [] : [...kitchens.map((k) => `${k}|${p.item}`), ...(p.kind === "receipt" ? [`receipt|${p.item}`] : [])];
    if (p.kind === "count") deps.push(...(this.sinceCount.get(p.kitchen) ?? []));
    deps.push(...keys.map((k) => this.chains.get(k)));
    const done = Promise.all(deps).then(() => this.slot(fn));
    if (p.kind === "count") {
      this.counts.set(p.kitchen, done);
      this.sinceCount.set(p.kitchen, []);
    } else {
      for (const k of keys) this.chains.set(k, done);
      for (const k of kitchens) (this.sinceCount.get(k) ?? this.sinceCount.set(k, []).get(k)!).push(done);
    }
    this.all.push(done);
  }

  /** Waits for every posting; throws the first failure. */
  async done() {
    const results = await Promise.allSettled(this.all);
    const failed = results.find((r): r is PromiseRejectedResult => r.status === "rejected");
    if (failed) throw failed.reason;
  }
}
