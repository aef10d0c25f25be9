// Plans six months of the demo company's stock history, day by day, with a seeded pseudo-random
// generator (the same plan every time for the same today). Pure: no I/O. The plan is a list of
// postings for lib/data/ledger; a simulation of the ledger's own rules (first-expired-first-out,
// expired lots skipped by withdrawals that name no lot, counts setting on hand) runs alongside, so
// every planned withdrawal finds its stock and every count line knows what is on hand.
import { Dec, dec, fromStockUnits, plain, toStockUnits, ZERO, type ItemUnits } from "../../lib/units";
import {
  DEMO_ITEMS, FILLING_PER_KG_MEAT, KITCHEN_CODES, KITCHEN_PLANS, PRODUCTS, SUPPLIERS, WASTE_REASONS,
  type DemoItem, type KitchenCode, type SupplierKey,
} from "./demo-stock-catalogue";

export const HISTORY_DAYS = 182;
const SEED = 0x5eed_c0de;
const KITCHEN_BATCH_SCALE: Record<KitchenCode, string> = { YARD: "1", LANE: "1", ROPE: "0.5" };

export type Who = "buyer" | "manager" | "lead";

/** An item as the planner needs it: the catalogue entry and its units as stored. */
export interface PlanItem {
  demo: DemoItem;
  sku: string;
  category: string;
  stockUnit: string;
  trackLots: boolean;
  units: ItemUnits;
  /** kg of filling per stock unit (casings) */
  fillingKgPerUnit: Dec | null;
}

export interface NewLot {
  code: string;
  date?: string;
  dateKind?: "best_before";
  unitCost: string;
}

export type Posting =
  | { kind: "receipt"; who: Who; kitchen: KitchenCode; item: string; quantity: string; unit: string; lot: NewLot; supplier: string; at: string }
  | { kind: "use" | "waste"; who: Who; kitchen: KitchenCode; item: string; quantity: string; unit: string; reason?: string; at: string }
  | { kind: "transfer"; who: Who; kitchen: KitchenCode; toKitchen: KitchenCode; item: string; quantity: string; unit: string; at: string }
  | { kind: "count"; who: Who; kitchen: KitchenCode; lines: { item: string; lotCode?: string; counted: string; unit: string }[]; note: string; at: string };

/** Corrections: each posts a mistake of the last working day, reverses it and posts it right (both today: the ledger dates reversals now). */
export type Correction =
  | { kind: "mistyped-use"; who: Who; kitchen: KitchenCode; item: string; wrong: { quantity: string; unit: string }; right: { quantity: string; unit: string }; at: string; reason: string }
  | { kind: "wrong-kitchen-receipt"; who: Who; kitchen: KitchenCode; rightKitchen: KitchenCode; item: string; quantity: string; unit: string; lot: NewLot; supplier: string; at: string; reason: string };

export interface PlannedDay {
  date: string;
  /** receipts and transfers, in order, before the kitchens' own work */
  sequential: Posting[];
  /** each kitchen's own postings (use, waste, counts): kitchens are independent of each other here */
  byKitchen: Record<KitchenCode, Posting[]>;
}

export interface Level {
  kitchen: KitchenCode;
  item: string;
  parLevel: string;
  reorderPoint: string;
}

export interface DemoPlan {
  days: PlannedDay[];
  corrections: Correction[];
  levels: Level[];
  /** what the simulation ends with: on hand per kitchen and item, "KITCHEN|SKU" -> plain decimal */
  expectedOnHand: Record<string, string>;
}

// ---------------------------------------------------------------------------------------------
// Deterministic randomness and dates

/** mulberry32: small, fast, good enough for demo data; seeded so every run plans the same. */
export function generator(seed: number) {
  let a = seed >>> 0;
  const next = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return {
    next,
    chance: (p: number) => next() < p,
    /** an integer in [min, max] */
    int: (min: number, max: number) => min + Math.floor(next() * (max - min + 1)),
    pick: <T>(xs: readonly T[]): T => xs[Math.floor(next() * xs.length)]!,
    /** a decimal in [lo, hi] with `places` decimals, built from an integer (exact) */
    decimal: (lo: string, hi: string, places: number) => {
      const f = new Dec(10).pow(places);
      const a1 = dec(lo).times(f).toNumber();
      const b1 = dec(hi).times(f).toNumber();
      return new Dec(a1 + Math.floor(next() * (b1 - a1 + 1))).div(f);
    },
  };
}

/** yyyy-mm-dd plus n days (calendar arithmetic on the date alone). */
export function addDays(date: string, n: number): string {
  const [y, m, d] = date.split("-").map(Number) as [number, number, number];
  return new Date(Date.UTC(y, m - 1, d + n)).toISOString().slice(0, 10);
}
const weekday = (date: string) => new Date(`${date}T00:00:00Z`).getUTCDay();

/** The calendar date it is in `timeZone` at `at`. */
export function localDate(at: Date, timeZone: string): string {
  return new Intl.DateTimeFormat("en-CA", { timeZone, year: "numeric", month: "2-digit", day: "2-digit" }).format(at);
}

const formats = new Map<string, Intl.DateTimeFormat>();
function offsetMs(at: number, timeZone: string): number {
  const format = formats.get(timeZone) ?? formats.set(timeZone, new Intl.DateTimeFormat("en-GB", {
    timeZone, hourCycle: "h23", year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit", second: "2-digit",
  })).get(timeZone)!;
  const parts = Object.fromEntries(format.formatToParts(new Date(at)).map((p) => [p.type, p.value]));
  return Date.UTC(+parts.year!, +parts.month! - 1, +parts.day!, +parts.hour!, +parts.minute!, +parts.second!) - at;
}

/** The instant a wall-clock time on a date is in `timeZone` (summer time included), as ISO. */
export function zonedIso(date: string, minutesAfterMidnight: number, timeZone: string): string {
  const [y, m, d] = date.split("-").map(Number) as [number, number, number];
  const wall = Date.UTC(y, m - 1, d, 0, minutesAfterMidnight);
  let at = wall - offsetMs(wall, timeZone);
  at = wall - offsetMs(at, timeZone);
  return new Date(at).toISOString();
}

// ---------------------------------------------------------------------------------------------
// The simulation: the ledger's rules on per-(kitchen, lot) balances

interface SimLot {
  sku: string;
  code: string;
  date: string | null;
  receivedOn: string;
  seq: number;
}

class Sim {
  lots = new Map<string, SimLot>(); // "SKU|CODE"
  /** "KITCHEN|SKU" -> lot key -> on hand */
  bal = new Map<string, Map<string, Dec>>();
  private seq = 0;
  constructor(private today: string) {}

  private of(k: string, sku: string) {
    const key = `${k}|${sku}`;
    return this.bal.get(key) ?? this.bal.set(key, new Map()).get(key)!;
  }
  newLot(sku: string, code: string, date: string | null, receivedOn: string): string {
    const key = `${sku}|${code}`;
    if (this.lots.has(key)) throw new Error(`demo plan: lot ${key} twice`);
    this.lots.set(key, { sku, code, date, receivedOn, seq: this.seq++ });
    return key;
  }
  add(k: string, lotKey: string, q: Dec) {
    const b = this.of(k, this.lots.get(lotKey)!.sku);
    b.set(lotKey, (b.get(lotKey) ?? ZERO).plus(q));
  }
  /** The kitchen's lots of the item with stock, in the ledger's FEFO order. */
  fefo(k: string, sku: string, skipExpired: boolean): { key: string; lot: SimLot; onHand: Dec }[] {
    const out: { key: string; lot: SimLot; onHand: Dec }[] = [];
    for (const [key, q] of this.of(k, sku)) {
      const lot = this.lots.get(key)!;
      if (!q.gt(0)) continue;
      if (skipExpired && lot.date !== null && lot.date < this.today) continue;
      out.push({ key, lot, onHand: q });
    }
    return out.sort((a, b) => {
      if ((a.lot.date === null) !== (b.lot.date === null)) return a.lot.date === null ? 1 : -1;
      if (a.lot.date !== b.lot.date) return a.lot.date! < b.lot.date! ? -1 : 1;
      if (a.lot.receivedOn !== b.lot.receivedOn) return a.lot.receivedOn < b.lot.receivedOn ? -1 : 1;
      return a.lot.seq - b.lot.seq;
    });
  }
  /** What a withdrawal naming no lot can draw: lots in date. */
  usable(k: string, sku: string): Dec {
    return this.fefo(k, sku, true).reduce((s, l) => s.plus(l.onHand), ZERO);
  }
  total(k: string, sku: string): Dec {
    return this.fefo(k, sku, false).reduce((s, l) => s.plus(l.onHand), ZERO);
  }
  /** Withdraws first-expired-first-out (in-date lots only); returns the legs. */
  take(k: string, sku: string, q: Dec): { key: string; q: Dec }[] {
    let left = q;
    const legs: { key: string; q: Dec }[] = [];
    for (const l of this.fefo(k, sku, true)) {
      if (left.lte(0)) break;
      const t = Dec.min(l.onHand, left);
      this.add(k, l.key, t.neg());
      legs.push({ key: l.key, q: t });
      left = left.minus(t);
    }
    if (left.gt(0)) throw new Error(`demo plan: ${k} short of ${sku} by ${plain(left)}`);
    return legs;
  }
  /** A count of an item not tracked by lot: shortfall off the oldest lots, surplus onto the newest (as the ledger does). */
  countTotal(k: string, sku: string, counted: Dec) {
    const lots = this.fefo(k, sku, false);
    const diff = counted.minus(lots.reduce((s, l) => s.plus(l.onHand), ZERO));
    if (diff.gte(0)) {
      this.add(k, lots.at(-1)!.key, diff);
      return;
    }
    let left = diff.abs();
    for (const l of lots) {
      if (left.lte(0)) break;
      const t = Dec.min(l.onHand, left);
      this.add(k, l.key, t.neg());
      left = left.minus(t);
    }
  }
  setLot(k: string, lotKey: string, counted: Dec) {
    this.of(k, this.lots.get(lotKey)!.sku).set(lotKey, counted);
  }
}

// ---------------------------------------------------------------------------------------------
// Quantities

const roundTo = (q: Dec, step: Dec, mode: "up" | "down" | "near") => {
  const n = q.div(step);
  const whole = mode === "up" ? n.ceil() : mode === "down" ? n.floor() : n.toDecimalPlaces(0, Dec.ROUND_HALF_EVEN);
  return whole.times(step);
};

/** Two significant figures, for levels people would type. */
const nice = (q: Dec, step: Dec) => {
  if (q.lte(step)) return step;
  const magnitude = new Dec(10).pow(Math.max(0, q.toFixed(0).length - 2));
  return Dec.max(step, roundTo(roundTo(q, magnitude, "near"), step, "up"));
};

/** How a person would type a quantity of the item: put-ups by name, kg and l from 1000 up. */
function typed(item: PlanItem, q: Dec): { quantity: string; unit: string } {
  const putUp = item.units.putUp;
  if (putUp) {
    const unit = putUp.name === "beef_set" ? "set" : putUp.name;
    return { quantity: plain(fromStockUnits(q, unit, item.units)), unit };
  }
  if (item.stockUnit === "g" && q.gte(1000)) return { quantity: plain(fromStockUnits(q, "kg", item.units)), unit: "kg" };
  if (item.stockUnit === "ml" && q.gte(1000)) return { quantity: plain(fromStockUnits(q, "l", item.units)), unit: "l" };
  return { quantity: plain(q), unit: item.stockUnit };
}

// ---------------------------------------------------------------------------------------------
// The plan

export function planDemoStock(items: readonly PlanItem[], opts: { today: string; timeZone: string }): DemoPlan {
  const { today, timeZone } = opts;
  const rnd = generator(SEED);
  const sim = new Sim(today);
  const item = new Map(items.map((i) => [i.sku, i]));
  const get = (sku: string) => {
    const i = item.get(sku);
    if (!i) throw new Error(`demo plan: no item ${sku}`);
    return i;
  };
  const step = (sku: string) => dec(get(sku).demo.step);
  const orderSize = (sku: string) => toStockUnits("1", get(sku).demo.orderUnit, get(sku).units);
  const at = (date: string, minutes: number) => zonedIso(date, minutes, timeZone);

  // ---- what each kitchen stocks and how fast it goes, from its products
  const usePerDay = new Map<string, Dec>(); // "K|SKU" -> stock units a day
  const addUse = (k: KitchenCode, sku: string, q: Dec) => usePerDay.set(`${k}|${sku}`, (usePerDay.get(`${k}|${sku}`) ?? ZERO).plus(q));
  const stocked: Record<KitchenCode, string[]> = { YARD: [], LANE: [], ROPE: [] };
  for (const k of KITCHEN_CODES) {
    for (const [key, perWeek] of Object.entries(KITCHEN_PLANS[k].products)) {
      const p = PRODUCTS[key]!;
      const kg = new Dec(p.batchKg[0] + p.batchKg[1]).div(2).times(KITCHEN_BATCH_SCALE[k]);
      const batchesPerDay = dec(perWeek).div(7);
      for (const [sku, perKg] of Object.entries(p.perKg)) addUse(k, sku, batchesPerDay.times(kg).times(perKg));
      if (p.casing) addUse(k, p.casing, batchesPerDay.times(kg).times(FILLING_PER_KG_MEAT).div(get(p.casing).fillingKgPerUnit!));
    }
    stocked[k] = items.map((i) => i.sku).filter((sku) => usePerDay.has(`${k}|${sku}`));
  }
  /** Items a kitchen gets from YARD rather than from a supplier. */
  const viaYard = (k: KitchenCode, sku: string) => k !== "YARD" && !KITCHEN_PLANS[k].suppliers.includes(get(sku).demo.supplier);
  for (const k of KITCHEN_CODES) for (const sku of stocked[k]) if (viaYard(k, sku)) addUse("YARD", sku, usePerDay.get(`${k}|${sku}`)!);
  stocked.YARD = items.map((i) => i.sku).filter((sku) => usePerDay.has(`YARD|${sku}`));

  // ---- par levels (three weeks, in whole purchase packs) and reorder points (ten days)
  const level = new Map<string, { par: Dec; reorder: Dec }>();
  const levels: Level[] = [];
  for (const k of KITCHEN_CODES) {
    for (const sku of stocked[k]) {
      const daily = usePerDay.get(`${k}|${sku}`)!;
      const lot = viaYard(k, sku) ? Dec.max(step(sku), roundTo(daily.times(14), step(sku), "up")) : orderSize(sku);
      const par = Dec.max(lot, roundTo(daily.times(21), lot, "up"));
      const reorder = Dec.min(roundTo(par.div(2), step(sku), "down"), Dec.max(nice(daily.times(10), step(sku)), nice(lot.times("0.2"), step(sku))));
      level.set(`${k}|${sku}`, { par, reorder });
      if (!KITCHEN_PLANS[k].noLevels.includes(sku)) levels.push({ kitchen: k, item: sku, parLevel: plain(par), reorderPoint: plain(reorder) });
    }
  }

  const days: PlannedDay[] = [];
  let lotCounter = 0;
  const lotCode = (supplier: SupplierKey, date: string) => `${SUPPLIERS[supplier].lotPrefix}${date.slice(2).replace(/-/g, "")}-${String(++lotCounter).padStart(3, "0")}`;
  const priceDrift = (daysAgo: number) => new Dec(1).plus(new Dec(HISTORY_DAYS - daysAgo).div(HISTORY_DAYS).times("0.04"));
  const who = (k: KitchenCode): Who => (KITCHEN_PLANS[k].staff === "lead" && rnd.chance(0.85) ? "lead" : "manager");

  const receipt = (day: PlannedDay, k: KitchenCode, sku: string, packs: number, daysAgo: number, minutes: number, dateOverride?: string): void => {
    const i = get(sku);
    const supplier = i.demo.supplier;
    const code = lotCode(supplier, day.date);
    const dated = i.demo.shelfDays !== undefined;
    const date = dateOverride ?? (dated ? addDays(day.date, i.demo.shelfDays!) : undefined);
    const cost = roundTo(dec(i.demo.orderCost).times(priceDrift(daysAgo)).times(rnd.decimal("0.98", "1.02", 3)), new Dec("0.01"), "near");
    const lot: NewLot = { code, unitCost: plain(cost), ...(date ? { date, dateKind: "best_before" as const } : {}) };
    day.sequential.push({ kind: "receipt", who: "buyer", kitchen: k, item: sku, quantity: String(packs), unit: i.demo.orderUnit, lot, supplier: SUPPLIERS[supplier].name, at: at(day.date, minutes) });
    sim.add(k, sim.newLot(sku, code, date ?? null, day.date), toStockUnits(String(packs), i.demo.orderUnit, i.units));
  };

  const transfer = (day: PlannedDay, from: KitchenCode, to: KitchenCode, sku: string, q: Dec, minutes: number) => {
    const i = get(sku);
    day.sequential.push({ kind: "transfer", who: from === "YARD" ? who(from) : "manager", kitchen: from, toKitchen: to, item: sku, ...typed(i, q), at: at(day.date, minutes) });
    for (const leg of sim.take(from, sku, q)) sim.add(to, leg.key, leg.q);
  };

  // short-dated and expired lots the demo shows (dates relative to today)
  const stories: { daysAgo: number; kitchen: KitchenCode; sku: string; packs: number; date: string }[] = [
    { daysAgo: 19, kitchen: "YARD", sku: "CURE-1", packs: 2, date: addDays(today, 24) }, // a short-dated clearance buy
    { daysAgo: 46, kitchen: "LANE", sku: "CURE-1", packs: 1, date: addDays(today, 37) },
    { daysAgo: 61, kitchen: "YARD", sku: "CULTURE-SM4", packs: 4, date: addDays(today, 29) },
    { daysAgo: 150, kitchen: "ROPE", sku: "CURE-EU06", packs: 1, date: addDays(today, -9) }, // expired, never opened
  ];

  for (let daysAgo = HISTORY_DAYS; daysAgo >= 1; daysAgo--) {
    const date = addDays(today, -daysAgo);
    const dow = weekday(date);
    const day: PlannedDay = { date, sequential: [], byKitchen: { YARD: [], LANE: [], ROPE: [] } };
    days.push(day);
    const opening = daysAgo === HISTORY_DAYS;

    // ---- deliveries, 07:00 onwards
    let minute = 7 * 60;
    for (const k of KITCHEN_CODES) {
      for (const sku of stocked[k]) {
        const i = get(sku);
        if (viaYard(k, sku)) continue;
        if (!opening && SUPPLIERS[i.demo.supplier].weekday !== dow) continue;
        const { par, reorder } = level.get(`${k}|${sku}`)!;
        const usable = sim.usable(k, sku);
        if (!opening && usable.gt(reorder)) continue;
        const packs = Dec.max(1, par.minus(usable).div(orderSize(sku)).ceil()).toNumber();
        receipt(day, k, sku, packs, daysAgo, (minute += 3));
      }
      for (const s of stories) if (s.daysAgo === daysAgo && s.kitchen === k) receipt(day, k, s.sku, s.packs, daysAgo, (minute += 3), s.date);
    }

    // ---- transfers, 08:30 onwards: YARD supplies ROPE on Wednesdays; YARD and LANE lend each other on Fridays
    minute = 8 * 60 + 30;
    if (opening || dow === 3) {
      for (const sku of stocked.ROPE) {
        if (!viaYard("ROPE", sku)) continue;
        const { par, reorder } = level.get(`ROPE|${sku}`)!;
        const usable = sim.usable("ROPE", sku);
        if (usable.gt(reorder)) continue;
        const q = Dec.min(par.minus(usable), roundTo(sim.usable("YARD", sku).div(2), step(sku), "down"));
        if (q.gt(0)) transfer(day, "YARD", "ROPE", sku, q, (minute += 5));
      }
    }
    if (dow === 5 && rnd.chance(0.4)) {
      const [from, to] = rnd.chance(0.5) ? (["YARD", "LANE"] as const) : (["LANE", "YARD"] as const);
      const shared = stocked[from].filter((sku) => stocked[to].includes(sku) && get(sku).category !== "cure");
      const sku = rnd.pick(shared);
      const q = roundTo(sim.usable(from, sku).times(rnd.decimal("0.2", "0.35", 2)), step(sku), "down");
      if (q.gt(0)) transfer(day, from, to, sku, q, (minute += 5));
    }

    // ---- each kitchen's day: batches from 09:00, the odd waste, a count on the month's last working day
    if (dow === 0) continue; // closed on Sundays
    const monthEnd = addDays(date, 1).slice(0, 7) !== date.slice(0, 7) || (weekday(addDays(date, 1)) === 0 && addDays(date, 2).slice(0, 7) !== date.slice(0, 7));
    for (const k of KITCHEN_CODES) {
      const out = day.byKitchen[k];
      let batchMinute = 9 * 60;
      for (const [key, perWeek] of Object.entries(KITCHEN_PLANS[k].products)) {
        if (!rnd.chance(dec(perWeek).div(6).toNumber())) continue;
        const p = PRODUCTS[key]!;
        const who1 = who(k);
        const scale = dec(KITCHEN_BATCH_SCALE[k]);
        let kg = new Dec(rnd.int(p.batchKg[0], p.batchKg[1])).times(scale).floor();
        const needs = (kgMeat: Dec) => {
          const n: [string, Dec][] = Object.entries(p.perKg).map(([sku, perKg]) => {
            const s = step(sku);
            return [sku, Dec.max(s, roundTo(kgMeat.times(perKg), s, "near"))];
          });
          if (p.casing) n.push([p.casing, roundTo(kgMeat.times(FILLING_PER_KG_MEAT).div(get(p.casing).fillingKgPerUnit!), step(p.casing), "up")]);
          return n;
        };
        const min = new Dec(p.batchKg[0]).times(scale).times("0.6").ceil();
        while (kg.gte(min) && needs(kg).some(([sku, q]) => sim.usable(k, sku).lt(q))) kg = kg.minus(1);
        if (kg.lt(min)) continue; // short of something: the batch waits for the next delivery
        batchMinute += rnd.int(20, 60);
        for (const [n, [sku, q]] of needs(kg).entries()) {
          out.push({ kind: "use", who: who1, kitchen: k, item: sku, ...typed(get(sku), q), at: at(date, batchMinute + n) });
          sim.take(k, sku, q);
        }
      }
      if (rnd.chance(0.06)) {
        const sku = rnd.pick(stocked[k]);
        const i = get(sku);
        const s = step(sku);
        const usable = sim.usable(k, sku);
        const q = Dec.min(roundTo(usable, s, "down"), roundTo(usable.times(rnd.decimal("0.03", "0.12", 2)), s, "up"));
        if (q.gt(0)) {
          out.push({ kind: "waste", who: who(k), kitchen: k, item: sku, ...typed(i, q), reason: rnd.pick(WASTE_REASONS[i.category]!), at: at(date, Math.max(15 * 60, batchMinute + 30) + rnd.int(0, 45)) });
          sim.take(k, sku, q);
        }
      }
      if (monthEnd) {
        const lines: { item: string; lotCode?: string; counted: string; unit: string }[] = [];
        const month = Number(date.slice(5, 7));
        for (const [n, sku] of stocked[k].entries()) {
          const i = get(sku);
          // cycle count: every lot-tracked line each month, a third of the rest in turn
          if (!i.trackLots && (n + month) % 3 !== 0) continue;
          const diff = (onHand: Dec): Dec => {
            const s = step(sku);
            let d = ZERO;
            if (i.category === "cure") d = rnd.chance(0.15) ? s.times(-rnd.int(1, 6)) : ZERO;
            else if (i.category === "casing") d = rnd.chance(0.12) ? s.times(rnd.chance(0.7) ? -1 : 1) : ZERO;
            else if (rnd.chance(0.35)) d = Dec.max(s, roundTo(onHand.times(rnd.decimal("0.002", "0.02", 3)), s, "near")).times(rnd.chance(0.8) ? -1 : 1);
            return Dec.max(ZERO, onHand.plus(d));
          };
          if (i.trackLots) {
            for (const l of sim.fefo(k, sku, false)) {
              const counted = diff(l.onHand);
              const t = typed(i, counted);
              lines.push({ item: sku, lotCode: l.lot.code, counted: t.quantity, unit: t.unit });
              sim.setLot(k, l.key, counted);
            }
          } else {
            const total = sim.total(k, sku);
            if (!total.gt(0)) continue;
            const counted = diff(total);
            const t = typed(i, counted);
            lines.push({ item: sku, counted: t.quantity, unit: t.unit });
            sim.countTotal(k, sku, counted);
          }
        }
        out.push({ kind: "count", who: KITCHEN_PLANS[k].staff === "lead" ? "lead" : "manager", kitchen: k, lines, note: `Month-end count, ${date.slice(0, 7)}`, at: at(date, 16 * 60 + 30) });
      }
    }
  }

  // ---- two mistakes of the last working day, put right today by reversal
  const corrections: Correction[] = [];
  const lastDay = weekday(addDays(today, -1)) === 0 ? addDays(today, -2) : addDays(today, -1);
  const mistake = ["PEP-BLK-GR", "SALT-FINE", "MARJORAM", "GARLIC-PWD"].find((sku) => sim.usable("YARD", sku).gte(1200));
  if (mistake) {
    const i = get(mistake);
    corrections.push({
      kind: "mistyped-use", who: "lead", kitchen: "YARD", item: mistake, wrong: typed(i, new Dec(1200)), right: typed(i, new Dec(120)),
      at: at(lastDay, 17 * 60 + 10), reason: "Typed 1.2 kg for 120 g",
    });
    sim.take("YARD", mistake, new Dec(120));
  }
  {
    const sku = "HOG-30-32";
    const i = get(sku);
    const code = lotCode("casings", lastDay);
    const cost = roundTo(dec(i.demo.orderCost).times(priceDrift(1)), new Dec("0.01"), "near");
    corrections.push({
      kind: "wrong-kitchen-receipt", who: "buyer", kitchen: "ROPE", rightKitchen: "LANE", item: sku, quantity: "2", unit: "hank",
      lot: { code, unitCost: plain(cost) }, supplier: SUPPLIERS.casings.name, at: at(lastDay, 17 * 60 + 40),
      reason: "Received at the wrong kitchen; the hanks went to Saltmarsh Lane",
    });
    sim.add("LANE", sim.newLot(sku, code, null, lastDay), new Dec(2));
  }

  // ---- levels raised this week (a large order coming): those items are now below their reorder point
  for (const l of levels) {
    if (!KITCHEN_PLANS[l.kitchen].raised.includes(l.item)) continue;
    const end = sim.total(l.kitchen, l.item);
    if (end.lt(l.reorderPoint)) continue;
    const reorder = nice(end.times("1.5").plus(step(l.item)), step(l.item));
    l.reorderPoint = plain(reorder);
    l.parLevel = plain(Dec.max(dec(l.parLevel), roundTo(reorder.times(2), orderSize(l.item), "up")));
  }

  // ---- what the plan ends with
  const expectedOnHand: Record<string, string> = {};
  for (const k of KITCHEN_CODES) for (const sku of stocked[k]) expectedOnHand[`${k}|${sku}`] = plain(sim.total(k, sku));
  return { days, corrections, levels, expectedOnHand };
}
