// What the planning pages need from the catalogue to show quantities: each item's units (put-ups,
// density) by id, and which items are not tracked by lot (their lots are never shown).
import "server-only";
import type { CurrentUser } from "@/lib/auth/current-user";
import { can } from "@/lib/auth/permissions";
import { listItems, type Item } from "@/lib/data/items";
import type { ItemUnits } from "@/lib/units";

export interface ItemFacts {
  items: Item[];
  units: Record<string, ItemUnits>;
  untracked: string[];
}

export async function itemFacts(user: CurrentUser): Promise<ItemFacts> {
  // archived items too: an older plan or recipe version may still name one
  const items = can(user, "stock.read") ? await listItems(user, { includeArchived: true }) : [];
  return {
    items,
    units: Object.fromEntries(items.map((i) => [i.id, i.itemUnits])),
    untracked: items.filter((i) => !i.trackLots).map((i) => i.id),
  };
}
