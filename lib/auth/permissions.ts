// The one place that decides who may do what, and where. Pure: no I/O, no framework imports.
// Pages, server actions, route handlers and jobs all ask here (can / assertCan); layouts only
// use it to decide what to show. The matrix is documented in DEVELOPERS.md.
import type { Role } from "../../db/types";

export type Action =
  // company administration
  | "company.manage"
  | "users.manage"
  | "kitchens.manage"
  | "jobs.manage"
  | "mail.readCaptured"
  | "api.readReference"
  | "period.reopen"
  | "period.close"
  // catalogue and stock
  | "items.manage"
  | "stock.read"
  | "stock.receive"
  | "stock.post" // counts, use, waste, adjustments, transfers out
  | "levels.manage" // par and reorder levels
  | "transfers.request"
  | "transfers.fulfil"
  // planning and production
  | "planning.read"
  | "recipes.manage" // the company's recipes (versioned)
  | "planning.manage" // plans and reservations
  | "production.post"
  | "limits.override"
  // purchasing
  | "purchasing.read"
  | "purchasing.manage" // suppliers, price lists, orders, deliveries
  | "orders.approve"
  // reports
  | "reports.read"
  | "reports.export"
  | "accounts.manage" // the account mapping of the movement journal
  // alerts from the scans in jobs/ (expiry, reorder, shortage)
  | "alerts.read"
  // the Overview page and GET /api/dashboard (kitchen leads: their own kitchens only)
  | "dashboard.read";

/** Where a role may do an action: nowhere, in every kitchen of its company, or only in its own kitchens. */
type Reach = "none" | "company" | "own";

const ALL: Reach = "company";
const OWN: Reach = "own";

// Rows: actions. Columns: roles. Kitchen-scoped actions are checked against ctx.kitchenId.
export const MATRIX: Record<Action, Record<Role, Reach>> = {
  "company.manage":    { admin: ALL, manager: "none", buyer: "none", kitchen_lead: "none", accountant: "none" },
  "users.manage":      { admin: ALL, manager: "none", buyer: "none", kitchen_lead: "none", accountant: "none" },
  "kitchens.manage":   { admin: ALL, manager: "none", buyer: "none", kitchen_lead: "none", accountant: "none" },
  "jobs.manage":       { admin: ALL, manager: "none", buyer: "none", kitchen_lead: "none", accountant: "none" },
  "mail.readCaptured": { admin: ALL, manager: "none", buyer: "none", kitchen_lead: "none", accountant: "none" },
  "api.readReference": { admin: ALL, manager: "none", buyer: "none", kitchen_lead: "none", accountant: "none" },
  "period.reopen":     { admin: ALL, manager: "none", buyer: "none", kitchen_lead: "none", accountant: "none" },
  "period.close":      { admin: ALL, manager: ALL, buyer: "none", kitchen_lead: "none", accountant: ALL },
  "items.manage":      { admin: ALL, manager: ALL, buyer: ALL, kitchen_lead: "none", accountant: "none" },
  "stock.read":        { admin: ALL, manager: ALL, buyer: ALL, kitchen_lead: ALL, accountant: ALL },
  "stock.receive":     { admin: ALL, manager: ALL, buyer: ALL, kitchen_lead: "none", accountant: "none" },
  "stock.post":        { admin: ALL, manager: ALL, buyer: "none", kitchen_lead: OWN, accountant: "none" },
  "levels.manage":     { admin: ALL, manager: ALL, buyer: ALL, kitchen_lead: OWN, accountant: "none" },
  // ctx.kitchenId is the kitchen that will receive the goods
  "transfers.request": { admin: ALL, manager: ALL, buyer: "none", kitchen_lead: OWN, accountant: "none" },
  // ctx.kitchenId is the kitchen the goods leave
  "transfers.fulfil":  { admin: ALL, manager: ALL, buyer: "none", kitchen_lead: OWN, accountant: "none" },
  "planning.read":     { admin: ALL, manager: ALL, buyer: "none", kitchen_lead: ALL, accountant: ALL },
  "recipes.manage":    { admin: ALL, manager: ALL, buyer: "none", kitchen_lead: ALL, accountant: "none" },
  "planning.manage":   { admin: ALL, manager: ALL, buyer: "none", kitchen_lead: OWN, accountant: "none" },
  "production.post":   { admin: ALL, manager: ALL, buyer: "none", kitchen_lead: OWN, accountant: "none" },
  "limits.override":   { admin: ALL, manager: ALL, buyer: "none", kitchen_lead: "none", accountant: "none" },
  "purchasing.read":   { admin: ALL, manager: ALL, buyer: ALL, kitchen_lead: "none", accountant: ALL },
  "purchasing.manage": { admin: ALL, manager: ALL, buyer: ALL, kitchen_lead: "none", accountant: "none" },
  // buyers approve only up to the company's threshold: see can()
  "orders.approve":    { admin: ALL, manager: ALL, buyer: ALL, kitchen_lead: "none", accountant: "none" },
  "reports.read":      { admin: ALL, manager: ALL, buyer: "none", kitchen_lead: "none", accountant: ALL },
  "reports.export":    { admin: ALL, manager: ALL, buyer: "none", kitchen_lead: "none", accountant: ALL },
  "accounts.manage":   { admin: ALL, manager: "none", buyer: "none", kitchen_lead: "none", accountant: ALL },
  // checked per alert against its kitchen
  "alerts.read":       { admin: ALL, manager: ALL, buyer: ALL, kitchen_lead: OWN, accountant: "none" },
  // checked per kitchen: each panel counts only the kitchens the user may read
  "dashboard.read":    { admin: ALL, manager: ALL, buyer: ALL, kitchen_lead: OWN, accountant: ALL },
};

export interface Actor {
  id: string;
  companyId: string;
  role: Role;
  /** Kitchens assigned to the user (what "own" means for a kitchen lead). */
  assignedKitchenIds: readonly string[];
}

export interface PermissionContext {
  /** The kitchen acted in; it must already be known to belong to the actor's company. */
  kitchenId?: string;
  /** For orders.approve: the order total and the company's approval threshold, in minor units. */
  amountMinor?: bigint;
  approvalThresholdMinor?: bigint;
}

export function can(actor: Actor, action: Action, ctx: PermissionContext = {}): boolean {
  const reach = MATRIX[action][actor.role];
  if (reach === "none") return false;
  if (reach === "own" && (ctx.kitchenId === undefined || !actor.assignedKitchenIds.includes(ctx.kitchenId))) {
    return false;
  }
  if (action === "orders.approve" && actor.role === "buyer") {
    if (ctx.amountMinor === undefined || ctx.approvalThresholdMinor === undefined) return false;
    return ctx.amountMinor <= ctx.approvalThresholdMinor;
  }
  return true;
}

/** True when the role may do the action somewhere (used to decide what to show, never to allow). */
export function canSomewhere(actor: Actor, action: Action): boolean {
  const reach = MATRIX[action][actor.role];
  if (reach === "none") return false;
  if (reach === "own") return actor.assignedKitchenIds.length > 0;
  return true;
}

/** The kitchens where a kitchen-scoped action is allowed, out of the company's kitchens. */
export function kitchensWhere(actor: Actor, action: Action, companyKitchenIds: readonly string[]): string[] {
  return companyKitchenIds.filter((kitchenId) => can(actor, action, { kitchenId }));
}
