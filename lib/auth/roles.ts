// Role names and one-line descriptions as people read them. Client-safe.
import type { Role } from "../../db/types";

export const ROLE_LABELS: Record<Role, string> = {
  admin: "Admin",
  manager: "Manager",
  buyer: "Buyer",
  kitchen_lead: "Kitchen lead",
  accountant: "Accountant",
};

/** What each role may do, in a line (a summary of the matrix in lib/auth/permissions.ts). */
export const ROLE_HINTS: Record<Role, string> = {
  admin: "Everything, including people, kitchens and company settings.",
  manager: "Stock, planning, buying and reports in every kitchen.",
  buyer: "Items, suppliers, orders and deliveries; approves orders up to the company's limit.",
  kitchen_lead: "Counts, use, waste and production in their own kitchens.",
  accountant: "Reports, buying records and closing periods; reads stock.",
};
