import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { ITEM_CATEGORIES, type ItemCategory } from "@/db/types";
import { can, canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { listItems } from "@/lib/data/items";
import { itemListQuery } from "@/lib/validation/items";
import { ItemsFilter } from "./_components/items-filter";
import { ItemsView } from "./_components/items-view";

export const metadata: Metadata = { title: "Items" };
export const dynamic = "force-dynamic";

export default async function ItemsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requireUser();
  if (!canSomewhere(user, "stock.read")) notFound();
  const raw = await searchParams;
  const first = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v);
  // a bad filter in the URL shows everything rather than an error page
  const parsed = itemListQuery.safeParse({ category: first(raw.category) || undefined, q: first(raw.q) || undefined, archived: first(raw.archived) || undefined });
  const { category, q, archived } = parsed.success ? parsed.data : {};
  const includeArchived = archived === "true";
  // every category, for the tab counts; the table shows the chosen one
  const all = await listItems(user, { q, includeArchived });
  const counts = { all: all.length } as Record<ItemCategory | "all", number>;
  for (const c of ITEM_CATEGORIES) counts[c] = all.filter((i) => i.category === c).length;
  const items = category ? all.filter((i) => i.category === category) : all;
  return (
    <ItemsView
      items={items}
      canManage={can(user, "items.manage")}
      filtered={Boolean(category || q)}
      filters={<ItemsFilter category={category} q={q} archived={includeArchived} counts={counts} />}
    />
  );
}
