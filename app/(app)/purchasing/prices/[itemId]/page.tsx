// What one of our items costs from each supplier that sells it: the current pack price of every
// supplier item with the price per kg / metre / hank (as the item's units allow), cheapest first;
// and how each price moved, from the price lists applied. ?on=yyyy-mm-dd shows another day.
import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { ArrowDownRight, ArrowLeft, ArrowUpRight, Download, Minus, Sparkles, Trophy } from "lucide-react";
import { CureCaution } from "@/components/cure/cure-caution";
import { CureMarker } from "@/components/cure/cure-marker";
import { lengthUnitIndex, percentText, preferredUnitIndex, priceText } from "@/components/purchasing/price-format";
import { PageHeader } from "@/components/shell/page-header";
import { Badge } from "@/components/ui/badge";
import { DataTable, RowHeader, TBody, Td, Th, THead } from "@/components/ui/data-table";
import { EmptyState } from "@/components/ui/empty-state";
import { canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { getItemPrices, type ItemPrices, type PriceHistoryEntry } from "@/lib/data/item-prices";
import { AppError } from "@/lib/http/errors";
import type { UnitPrice } from "@/lib/purchasing/unit-prices";
import { isoDate } from "@/lib/validation/price-lists";

export const metadata: Metadata = { title: "Prices" };
export const dynamic = "force-dynamic";

function Move({ h }: { h: PriceHistoryEntry }) {
  switch (h.direction) {
    case "up":
      return <Badge tone="amber" icon={<ArrowUpRight />}>Up {percentText(h.changePercent!)}</Badge>;
    case "down":
      return <Badge tone="herb" icon={<ArrowDownRight />}>Down {percentText(h.changePercent!)}</Badge>;
    case "same":
      return <Badge icon={<Minus />}>Same</Badge>;
    default:
      return <Badge icon={<Sparkles />}>First price</Badge>;
  }
}

export default async function ItemPricesPage({ params, searchParams }: { params: Promise<{ itemId: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requireUser();
  if (!canSomewhere(user, "purchasing.read")) notFound();
  const { itemId } = await params;
  const sp = await searchParams;
  const on = typeof sp.on === "string" && isoDate.safeParse(sp.on).success ? sp.on : undefined;
  let prices: ItemPrices;
  try {
    prices = await getItemPrices(user, itemId, { on });
  } catch (e) {
    if (e instanceof AppError && e.status === 404) notFound();
    throw e;
  }
  const { item, currency, units } = prices;
  const main = preferredUnitIndex(units, item.stockUnit, user.unitSystem);
  // casings in put-ups: per hank, and per metre (or yard) of casing beside it
  const length = item.stockUnit === "pc" && units.length > 1 ? lengthUnitIndex(units, user.unitSystem) : null;
  const shown = [main, ...(length !== null && length !== main ? [length] : [])];
  const per = (list: UnitPrice[]) => shown.map((i) => list[i]);

  return (
    <>
      <Link href="/purchasing" className="mb-3 inline-flex min-h-touch items-center gap-1 text-sm font-semibold text-brine hover:text-pepper">
        <ArrowLeft aria-hidden className="h-4 w-4" /> Buying
      </Link>
      <PageHeader
        title={`Prices: ${item.name}`}
        description={`${item.sku}. What each supplier charges for it, in their pack and per ${shown.map((i) => units[i]!.label).join(" and per ")}, on ${prices.on}. Prices are in ${currency}.`}
        actions={
          <a href={`/api/items/${item.id}/prices?format=csv${on ? `&on=${on}` : ""}`} className="btn-quiet" download>
            <Download aria-hidden className="h-4 w-4" /> Price history (CSV)
          </a>
        }
      />
      {item.category === "cure" ? <CureCaution className="mb-4" /> : null}

      <section aria-labelledby="offers-heading" className="mb-8 space-y-3">
        <div className="flex flex-wrap items-center gap-2">
          <h2 id="offers-heading" className="text-xl font-semibold">Who sells it, cheapest first</h2>
          {item.category === "cure" ? <CureMarker /> : null}
        </div>
        {prices.offers.length ? (
          <DataTable caption={`Prices of ${item.sku} by supplier`}>
            <THead>
              <Th>Supplier</Th>
              <Th>Their SKU and pack</Th>
              <Th numeric>Pack price</Th>
              {shown.map((i) => <Th key={i} numeric>Per {units[i]!.label}</Th>)}
              <Th>Since</Th>
            </THead>
            <TBody>
              {prices.offers.map((o) => (
                <tr key={o.supplierItem.id} className={o.supplier.active && o.supplierItem.active ? undefined : "text-brine"}>
                  <RowHeader>
                    <Link href={`/purchasing/suppliers/${o.supplier.id}`} className="underline decoration-brine-line underline-offset-4 hover:decoration-paprika">{o.supplier.name}</Link>
                    {o.cheapest ? <span className="ml-2 align-middle"><Badge tone="herb" icon={<Trophy />}>Cheapest</Badge></span> : null}
                    {!o.supplier.active || !o.supplierItem.active ? <span className="block text-sm font-normal">not bought now</span> : null}
                  </RowHeader>
                  <Td>
                    <span className="whitespace-nowrap font-semibold">{o.supplierItem.sku}</span>
                    <span className="block text-sm text-brine">{o.supplierItem.packLabel}</span>
                  </Td>
                  <Td numeric className="whitespace-nowrap font-semibold">{o.current ? priceText(o.current.packPrice, currency) : <span className="font-normal text-brine">no price</span>}</Td>
                  {o.current ? per(o.current.perUnit).map((u) => <Td key={u!.unit} numeric className="whitespace-nowrap">{priceText(u!.price, currency)}</Td>) : shown.map((i) => <Td key={i} numeric><span className="text-brine">—</span></Td>)}
                  <Td className="num whitespace-nowrap">{o.current?.effectiveFrom ?? <span className="text-brine">—</span>}</Td>
                </tr>
              ))}
            </TBody>
          </DataTable>
        ) : (
          <EmptyState title="No supplier sells it yet">
            <p>Add it to a supplier&apos;s items on the supplier&apos;s page; its prices come from the price lists you apply there.</p>
          </EmptyState>
        )}
      </section>

      <section aria-labelledby="history-heading" className="space-y-3">
        <h2 id="history-heading" className="text-xl font-semibold">How the prices moved</h2>
        {prices.history.length ? (
          <DataTable caption={`Price history of ${item.sku}`}>
            <THead>
              <Th>From</Th>
              <Th>Supplier and SKU</Th>
              <Th numeric>Pack price</Th>
              <Th>Change</Th>
              <Th numeric>Per {units[main]!.label}</Th>
              <Th>Source</Th>
            </THead>
            <TBody>
              {prices.history.map((h) => (
                <tr key={h.id}>
                  <Td className="num whitespace-nowrap">{h.effectiveFrom}</Td>
                  <RowHeader className="font-normal">
                    <span className="font-semibold">{h.supplierName}</span> · <span className="whitespace-nowrap">{h.sku}</span>
                    <span className="block text-sm text-brine">{h.packLabel}</span>
                  </RowHeader>
                  <Td numeric className="whitespace-nowrap font-semibold">{priceText(h.packPrice, currency)}</Td>
                  <Td><Move h={h} /></Td>
                  <Td numeric className="whitespace-nowrap">{priceText(h.perUnit[main]!.price, currency)}</Td>
                  <Td>
                    {h.source === "price_list" ? <span className="break-all">{h.filename ?? "price list"}</span> : "entered"}
                    {h.listedDescription ? <span className="block whitespace-pre-line text-sm text-brine">{h.listedDescription}</span> : null}
                  </Td>
                </tr>
              ))}
            </TBody>
          </DataTable>
        ) : (
          <EmptyState title="No prices yet">
            <p>Apply a supplier&apos;s price list on the supplier&apos;s page: each price is kept with the date it takes effect.</p>
          </EmptyState>
        )}
      </section>
    </>
  );
}
