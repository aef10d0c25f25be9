// Where a signed-in user lands when no page was asked for (the home page, sign-in without a
// `next`): managers on the Overview, whose panels are their morning read; accountants on Reports,
// the figures they keep; everyone else on Stock, where their day's work starts. Pure and client-safe.
import type { Role } from "../../db/types";

export function homePath(role: Role): "/overview" | "/reports" | "/stock" {
  return role === "manager" ? "/overview" : role === "accountant" ? "/reports" : "/stock";
}
