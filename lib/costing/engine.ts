// The costing engine: what each movement of one item costs, and what stock is worth, under the
// company's cost formula (IAS 2 para. 25: FIFO or weighted average; trade-facts §8). Pure: the
// caller gives the item's movements in every kitchen; nothing here reads the database.
//
// The physical issue follows FEFO (the lot the ledger drew); the COST of an issue follows the
// formula, kept per kitchen:
// - fifo: cost layers in the order stock came in (receipt order); an issue takes the oldest first.
// - average: moving weighted average; every increase re-averages, an issue takes quantity x the
//   average at that moment; the last of the stock takes what value is left, so nothing lingers.
// What enters at which cost:
// - a receipt: its lot's unit cost (the landed cost the ledger stored);
// - a transfer in: exactly what the transfer out cost in the sending kitchen (its layers, for FIFO);
// - a count gain or positive adjustment: the item's latest receipt cost in that kitchen (else in
//   any kitchen, else the lot's cost): basis "gain", reported apart from usage;
// - a reversal of an issue: back at what the issue cost, into the place it left (its layers at the
//   front, for FIFO), so an issue and its reversal leave later costs as they were;
// - a reversed transfer: the destination gives back by formula (its arriving layers first) and the
//   sender takes back exactly that, so the value across kitchens is unchanged;
// - a reversal of an increase: taken from that increase's own layer first (FIFO), else by formula.
// Order: occurred_at, then recorded_at; within one posting, what leaves before what arrives (a
// transfer's two legs). A backdated issue that finds too little stock in the formula's layers (the
// ledger only guarantees the balance at posting time) takes the shortfall at its lot's cost.
// Values are exact decimals; only an average issue is rounded, half-even to VALUE_SCALE places.
import type { MovementKind } from "../../db/types";
import { Dec, dec, ZERO } from "../units/decimal";

export const COST_FORMULAS = ["fifo", "average"] as const;
export type CostFormula = (typeof COST_FORMULAS)[number];

/** Decimal places kept on a value that needs rounding (an average issue): well below a cent. */
export const VALUE_SCALE = 6;

export interface CostInput {
  id: string;
  postingId: string;
  kind: MovementKind;
  kitchenId: string;
  otherKitchenId: string | null;
  lotId: string;
  /** signed change of on hand, stock units */
  delta: string;
  /** the lot's unit cost per stock unit (what the ledger stored on the movement) */
  lotCost: string;
  reversesId: string | null;
  occurredAt: Date;
  recordedAt: Date;
}

export type CostBasis = "receipt" | "formula" | "transfer" | "gain" | "reversal";

export interface CostedMovement {
  id: string;
  kind: MovementKind;
  kitchenId: string;
  occurredAt: Date;
  delta: Dec;
  /** signed change of the kitchen's inventory value (an issue is negative) */
  value: Dec;
  basis: CostBasis;
  /** the movement as given (posting, lot, lot cost, reversal, times): callers need not read it again */
  source: CostInput;
}

export interface Layer {
  quantity: Dec;
  unitCost: Dec;
  /** the movement that brought it in */
  sourceId: string;
}

export interface Position {
  quantity: Dec;
  value: Dec;
}

interface KitchenState {
  layers: Layer[]; // fifo
  quantity: Dec; // average (and fifo, as the sum of layers)
  value: Dec;
  lastReceiptCost: Dec | null;
}

/** Slices of layers an issue took (for FIFO), so a transfer in or a reversal brings back the same costs.
 *  `value`, when set (an average issue), is the exact value taken: quantity x unitCost would not be,
 *  since unitCost = value / quantity need not terminate. */
type Slices = { quantity: Dec; unitCost: Dec; value?: Dec }[];

export function sortForCosting<T extends Pick<CostInput, "id" | "postingId" | "delta" | "occurredAt" | "recordedAt">>(movements: readonly T[]): T[] {
  // the keys once per movement, not per comparison (a ledger has hundreds of thousands)
  const keyed = movements.map((m) => ({
    m, at: m.occurredAt.getTime(), rec: m.recordedAt.getTime(), sign: m.delta.startsWith("-") ? -1 : /^0*(\.0*)?$/.test(m.delta) ? 0 : 1,
  }));
  keyed.sort(
    (a, b) =>
      a.at - b.at ||
      a.rec - b.rec ||
      (a.m.postingId < b.m.postingId ? -1 : a.m.postingId > b.m.postingId ? 1 : 0) ||
      a.sign - b.sign ||
      (a.m.id < b.m.id ? -1 : a.m.id > b.m.id ? 1 : 0),
  );
  return keyed.map((k) => k.m);
}

const sumSlices = (s: Slices) => s.reduce((v, x) => v.add(x.value ?? x.quantity.mul(x.unitCost)), ZERO);

export interface CostingResult {
  movements: CostedMovement[];
  /** quantity and value per kitchen after the last movement */
  positions: Map<string, Position>;
  /** FIFO: the layers per kitchen after the last movement (empty for average) */
  layers: Map<string, Layer[]>;
}

/** Costs one item's movements (every kitchen) in ledger order. */
export function costMovements(input: readonly CostInput[], formula: CostFormula): CostingResult {
  const states = new Map<string, KitchenState>();
  const state = (k: string) => {
    let s = states.get(k);
    if (!s) states.set(k, (s = { layers: [], quantity: ZERO, value: ZERO, lastReceiptCost: null }));
    return s;
  };
  let lastReceiptAnywhere: Dec | null = null;
  const costed = new Map<string, CostedMovement>();
  /** what each issue took, by movement id (FIFO slices; for average one slice at the unit cost) */
  const taken = new Map<string, Slices>();
  /** transfer outs waiting for their in leg: posting + lot */
  const inTransit = new Map<string, Slices>();
  const out: CostedMovement[] = [];

  /** Adds stock; FIFO layers go last, or first (in their order) for stock given back by a reversal, where it came from. */
  const addIn = (s: KitchenState, m: CostInput, slices: Slices, atFront = false) => {
    const qty = dec(m.delta);
    const value = sumSlices(slices);
    if (formula === "fifo") {
      const layers = slices.filter((x) => !x.quantity.isZero()).map((x) => ({ quantity: x.quantity, unitCost: x.unitCost, sourceId: m.id }));
      if (atFront) {
        // after a leading shortfall layer, if any: that debt is still owed first
        const at = s.layers[0]?.sourceId === "shortfall" ? 1 : 0;
        s.layers.splice(at, 0, ...layers);
      } else s.layers.push(...layers);
    }
    s.quantity = s.quantity.add(qty);
    s.value = s.value.add(value);
    return value;
  };

  /** Takes `qty` out of a kitchen by formula (FIFO: from `preferSource`'s layers first). */
  const takeOut = (s: KitchenState, qty: Dec, lotCost: Dec, preferSource?: string): Slices => {
    if (formula === "average") {
      let value: Dec;
      if (s.quantity.lte(0)) value = qty.mul(lotCost);
      else if (qty.gte(s.quantity)) value = s.value.add(qty.sub(s.quantity).mul(lotCost)); // all that is left, and a shortfall at the lot's cost
      else value = s.value.mul(qty).div(s.quantity).toDecimalPlaces(VALUE_SCALE, Dec.ROUND_HALF_EVEN);
      s.quantity = s.quantity.sub(qty);
      s.value = s.quantity.isZero() ? ZERO : s.value.sub(value);
      return [{ quantity: qty, unitCost: value.div(qty), value }];
    }
    const slices: Slices = [];
    let left = qty;
    const order = preferSource ? [...s.layers.filter((l) => l.sourceId === preferSource), ...s.layers.filter((l) => l.sourceId !== preferSource)] : [...s.layers];
    for (const layer of order) {
      if (left.isZero()) break;
      if (layer.quantity.lte(0)) continue;
      const q = Dec.min(layer.quantity, left);
      slices.push({ quantity: q, unitCost: layer.unitCost });
      layer.quantity = layer.quantity.sub(q);
      left = left.sub(q);
    }
    s.layers = s.layers.filter((l) => !l.quantity.isZero());
    if (left.gt(0)) {
      // a backdated issue before the stock it drew came in: the shortfall at its lot's cost, owed by the kitchen
      slices.push({ quantity: left, unitCost: lotCost });
      s.layers.unshift({ quantity: left.neg(), unitCost: lotCost, sourceId: "shortfall" });
    }
    const value = sumSlices(slices);
    s.quantity = s.quantity.sub(qty);
    s.value = s.value.sub(value);
    return slices;
  };

  for (const m of sortForCosting(input)) {
    const s = state(m.kitchenId);
    const delta = dec(m.delta);
    const lotCost = dec(m.lotCost);
    let value: Dec;
    let basis: CostBasis;
    if (delta.isZero()) {
      value = ZERO;
      basis = "formula";
    } else if (delta.gt(0)) {
      const reversed = m.reversesId ? taken.get(m.reversesId) : undefined;
      const transit = m.kind === "transfer" ? inTransit.get(`${m.postingId}:${m.lotId}`) : undefined;
      if (transit) {
        // a transfer's arriving leg: what the leaving leg cost (for a reversed transfer, what the
        // destination gave back), so the value across kitchens is unchanged
        value = addIn(s, m, transit, m.reversesId !== null);
        inTransit.delete(`${m.postingId}:${m.lotId}`);
        basis = m.reversesId ? "reversal" : "transfer";
      } else if (reversed) {
        // an issue given back: at what it cost, scaled to the quantity given back, into the place it left
        const tookQty = reversed.reduce((q, x) => q.add(x.quantity), ZERO);
        const f = delta.div(tookQty);
        value = addIn(s, m, reversed.map((x) => ({ quantity: x.quantity.mul(f), unitCost: x.unitCost, value: x.value?.mul(f) })), true);
        basis = "reversal";
      } else if (m.kind === "receipt") {
        value = addIn(s, m, [{ quantity: delta, unitCost: lotCost }]);
        s.lastReceiptCost = lotCost;
        lastReceiptAnywhere = lotCost;
        basis = "receipt";
      } else {
        const cost = s.lastReceiptCost ?? lastReceiptAnywhere ?? lotCost;
        value = addIn(s, m, [{ quantity: delta, unitCost: cost }]);
        basis = "gain";
      }
      // pay back a shortfall a backdated issue left (FIFO): it was costed at its lot's cost, so the
      // stock that pays it changes value by the difference, booked on this movement
      if (formula === "fifo" && s.layers[0]?.sourceId === "shortfall") value = value.add(settleShortfall(s));
      // (average) the same when the stock pays a shortfall back to exactly nothing on hand: the
      // difference is booked on this movement, so no value lingers without stock
      if (formula === "average" && s.quantity.isZero() && !s.value.isZero()) {
        value = value.sub(s.value);
        s.value = ZERO;
      }
    } else {
      const qty = delta.neg();
      const reversing = m.reversesId ? costed.get(m.reversesId) : undefined;
      const slices = takeOut(s, qty, lotCost, reversing && reversing.delta.gt(0) ? reversing.id : undefined);
      taken.set(m.id, slices);
      value = sumSlices(slices).neg();
      basis = reversing ? "reversal" : "formula";
      if (m.kind === "transfer") inTransit.set(`${m.postingId}:${m.lotId}`, slices);
    }
    const c: CostedMovement = { id: m.id, kind: m.kind, kitchenId: m.kitchenId, occurredAt: m.occurredAt, delta, value, basis, source: m };
    costed.set(m.id, c);
    out.push(c);
  }

  const positions = new Map<string, Position>();
  const layers = new Map<string, Layer[]>();
  for (const [k, s] of states) {
    positions.set(k, { quantity: s.quantity, value: s.value });
    layers.set(k, s.layers.map((l) => ({ ...l })));
  }
  return { movements: out, positions, layers };
}

/** Nets a leading negative (shortfall) layer against the positive layers after it, oldest first; returns the value change. */
function settleShortfall(s: KitchenState): Dec {
  let change = ZERO;
  const debt = s.layers[0]!;
  let owed = debt.quantity.neg();
  for (const layer of s.layers.slice(1)) {
    if (owed.isZero()) break;
    const q = Dec.min(layer.quantity, owed);
    layer.quantity = layer.quantity.sub(q);
    owed = owed.sub(q);
    change = change.add(q.mul(debt.unitCost)).sub(q.mul(layer.unitCost));
  }
  s.value = s.value.add(change);
  debt.quantity = owed.neg();
  s.layers = s.layers.filter((l) => !l.quantity.isZero());
  return change;
}
