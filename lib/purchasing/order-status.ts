// A purchase order's life, as pure rules (no I/O): which step may follow which, and what receiving
// does to the status. lib/data/purchase-orders.ts applies them inside its transactions.
//
//   draft -> approved -> sent -> partly received -> received
//                          \__________\___________-> closed short (the rest will not come)
//   draft | approved | sent with nothing received -> cancelled
import { Dec, ZERO, dec } from "../units/decimal";

export const ORDER_STATUSES = ["draft", "approved", "sent", "partly_received", "received", "closed_short", "cancelled"] as const;
export type OrderStatus = (typeof ORDER_STATUSES)[number];

export const ORDER_STATUS_LABELS: Record<OrderStatus, string> = {
  draft: "Draft",
  approved: "Approved",
  sent: "Sent to supplier",
  partly_received: "Partly received",
  received: "Received",
  closed_short: "Closed short",
  cancelled: "Cancelled",
};

/** Statuses in which goods may still arrive against the order. */
export const OPEN_FOR_RECEIPT: readonly OrderStatus[] = ["sent", "partly_received"];

export type OrderStep = "edit" | "approve" | "send" | "close_short" | "cancel";

const ALLOWED: Record<OrderStep, readonly OrderStatus[]> = {
  edit: ["draft"],
  approve: ["draft"],
  send: ["approved"],
  close_short: ["sent", "partly_received"],
  cancel: ["draft", "approved", "sent"],
};

export class OrderStepError extends Error {
  constructor(
    readonly step: OrderStep,
    readonly status: OrderStatus,
    message: string,
  ) {
    super(message);
  }
}

/** Throws OrderStepError with a sentence a buyer can act on when the step is not allowed now. */
export function assertStep(step: OrderStep, status: OrderStatus, receivedAnything = false): void {
  // a partly received order cannot be cancelled either; say what to do instead
  if (step === "cancel" && status === "partly_received") receivedAnything = true;
  else if (!ALLOWED[step].includes(status)) {
    const what = { edit: "changed", approve: "approved", send: "sent", close_short: "closed short", cancel: "cancelled" }[step];
    throw new OrderStepError(step, status, `An order that is ${ORDER_STATUS_LABELS[status].toLowerCase()} cannot be ${what}.`);
  }
  if (step === "cancel" && receivedAnything) {
    throw new OrderStepError(step, status, "Goods have already been received against this order: close it short instead of cancelling it.");
  }
}

export interface LineProgress {
  ordered: string;
  received: string;
}

/** The status after a receipt: received when every line has all it ordered, else partly received. */
export function statusAfterReceipt(lines: readonly LineProgress[]): "partly_received" | "received" {
  return lines.every((l) => dec(l.received).gte(dec(l.ordered))) ? "received" : "partly_received";
}

/** What is still to come on a line (never negative: an over-delivery leaves nothing to come). */
export function outstanding(line: LineProgress): Dec {
  const rest = dec(line.ordered).minus(dec(line.received));
  return rest.gt(0) ? rest : ZERO;
}
