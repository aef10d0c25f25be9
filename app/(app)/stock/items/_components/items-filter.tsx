// Category tabs and a search box: plain links and a GET form, so the list is a shareable URL.
import Link from "next/link";
import { Search } from "lucide-react";
import { ITEM_CATEGORIES, type ItemCategory } from "@/db/types";
import { CATEGORY_LABELS } from "./format";

export function ItemsFilter({ category, q, archived, counts }: {
  category?: ItemCategory;
  q?: string;
  archived: boolean;
  counts: Record<ItemCategory | "all", number>;
}) {
  const href = (c?: ItemCategory) => {
    const params = new URLSearchParams();
    if (c) params.set("category", c);
    if (q) params.set("q", q);
    if (archived) params.set("archived", "true");
    const s = params.toString();
    return s ? `/stock/items?${s}` : "/stock/items";
  };
  const tabs: { key?: ItemCategory; label: string; count: number }[] = [
    { label: "All", count: counts.all },
    ...ITEM_CATEGORIES.map((c) => ({ key: c, label: CATEGORY_LABELS[c].many, count: counts[c] })),
  ];
  return (
    <div className="mb-4 flex flex-wrap items-end justify-between gap-3">
      <nav aria-label="Categories" className="flex flex-wrap gap-1">
        {tabs.map((t) => {
          const active = t.key === category;
          return (
            <Link
              key={t.label}
              href={href(t.key)}
              aria-current={active ? "page" : undefined}
              className={`inline-flex min-h-touch items-center gap-1.5 rounded-md px-3 font-semibold ${
                active ? "bg-smoke text-white" : "text-pepper hover:bg-salt-deep"
              }`}
            >
              {t.label}
              <span className={`num text-sm ${active ? "text-smoke-text" : "text-brine"}`}>{t.count}</span>
            </Link>
          );
        })}
      </nav>
      <form method="get" action="/stock/items" role="search" className="flex items-center gap-2">
        {category ? <input type="hidden" name="category" value={category} /> : null}
        <label htmlFor="items-q" className="sr-only">Search SKU or name</label>
        <input id="items-q" name="q" type="search" defaultValue={q} placeholder="SKU or name" className="field-input w-48" />
        <label className="flex min-h-touch items-center gap-2 text-sm">
          <input type="checkbox" name="archived" value="true" defaultChecked={archived} className="h-5 w-5 accent-paprika" />
          Archived
        </label>
        <button type="submit" className="btn-quiet px-3" aria-label="Search">
          <Search aria-hidden className="h-5 w-5" />
        </button>
      </form>
    </div>
  );
}
