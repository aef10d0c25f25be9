// What the trace pages need besides the trace itself: each item's units and category (to show
// quantities in the user's units, cure in grams, with the cure marker), kitchen names by code,
// and when the page was printed.
import "server-only";
import type { CurrentUser } from "@/lib/auth/current-user";
import { listKitchens } from "@/lib/data/kitchens";
import type { Item } from "@/lib/data/items";
import { itemFacts } from "../../_server/items";

export const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export interface TraceContext {
  units: Record<string, Item["itemUnits"]>;
  itemById: (id: string) => Item | undefined;
  itemBySku: (sku: string) => Item | undefined;
  /** "Kitchen name (CODE)", or the code alone for a kitchen not found */
  kitchen: (code: string) => string;
  printedAt: string;
}

export async function traceContext(user: CurrentUser): Promise<TraceContext> {
  const [facts, kitchens] = await Promise.all([itemFacts(user), listKitchens(user, { includeArchived: true })]);
  const byId = new Map(facts.items.map((i) => [i.id, i]));
  const bySku = new Map(facts.items.map((i) => [i.sku, i]));
  const names = new Map(kitchens.map((k) => [k.code, k.name]));
  return {
    units: facts.units,
    itemById: (id) => byId.get(id),
    itemBySku: (sku) => bySku.get(sku),
    kitchen: (code) => (names.has(code) ? `${names.get(code)} (${code})` : code),
    printedAt: new Intl.DateTimeFormat("en-GB", { timeZone: user.timeZone, dateStyle: "long", timeStyle: "short" }).format(new Date()),
  };
}
