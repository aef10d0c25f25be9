// The catalogue table, grouped by category. Server-safe (no hooks): the edit button is a slot.
import type { ReactNode } from "react";
import { Archive } from "lucide-react";
import { CureMarker } from "@/components/cure/cure-marker";
import { Badge } from "@/components/ui/badge";
import { DataTable, RowHeader, Td, Th, THead } from "@/components/ui/data-table";
import { ITEM_CATEGORIES } from "@/db/types";
import type { PutUpKind } from "@/lib/casing/put-ups";
import type { Item } from "@/lib/data/items";
import { calibreText, CATEGORY_LABELS, categoryDetail, percentOf, putUpText } from "./format";

const PUT_UP_SHORT: Record<PutUpKind, string> = { hank: "hank", beef_set: "set", tubed_strand: "strand", stick: "stick", box: "box" };

export function ItemsTable({ items, editButton }: { items: Item[]; editButton?: (item: Item) => ReactNode }) {
  const columns = editButton ? 7 : 6;
  return (
    <DataTable caption="Items by category">
      <THead>
        <Th>Item · SKU</Th>
        <Th>Category</Th>
        <Th>Unit</Th>
        <Th>Calibre · put-up</Th>
        <Th numeric>Nitrite / nitrate</Th>
        <Th>Lots</Th>
        {editButton ? <Th action /> : null}
      </THead>
      {ITEM_CATEGORIES.map((category) => {
        const rows = items.filter((i) => i.category === category);
        if (!rows.length) return null;
        return (
          <tbody key={category} className="divide-y divide-salt-edge border-t border-salt-edge">
            <tr className="bg-salt">
              <th scope="colgroup" colSpan={columns} className="px-4 py-1.5 text-left text-sm font-semibold text-brine">
                {CATEGORY_LABELS[category].many} <span className="font-normal">· {rows.length}</span>
              </th>
            </tr>
            {rows.map((item) => {
              const detail = categoryDetail(item);
              return (
                <tr key={item.id} className={item.archived ? "text-brine" : undefined}>
                  <RowHeader className="min-w-[11rem]">
                    {item.name}
                    <span className="block whitespace-nowrap text-sm font-normal text-brine">{item.sku}</span>
                    {item.archived ? <span className="mt-1 block"><Badge icon={<Archive />}>Archived</Badge></span> : null}
                  </RowHeader>
                  <Td className="whitespace-nowrap">
                    {item.cure ? <CureMarker /> : CATEGORY_LABELS[item.category].one}
                    {detail ? <span className="block text-sm text-brine">{detail}</span> : null}
                  </Td>
                  <Td className="whitespace-nowrap">
                    {item.stockUnit}
                    {item.casing?.putUp ? <span className="block text-sm text-brine">1 = {PUT_UP_SHORT[item.casing.putUp]}</span> : null}
                  </Td>
                  <Td className="whitespace-nowrap">
                    {item.casing ? (
                      <>
                        <span className="num font-semibold">{calibreText(item.casing)}</span>
                        <span className="block text-sm text-brine num">{putUpText(item.casing)}</span>
                      </>
                    ) : <span className="text-brine">—</span>}
                  </Td>
                  <Td numeric className="whitespace-nowrap">
                    {item.cure ? (
                      <span className="font-semibold">{percentOf(item.cure.nitriteFraction)} % / {percentOf(item.cure.nitrateFraction)} %</span>
                    ) : <span className="text-brine">—</span>}
                  </Td>
                  <Td className="whitespace-nowrap">
                    {item.trackLots ? (item.trackDates ? "Lots, dates" : "Lots") : <span className="text-brine">Off</span>}
                  </Td>
                  {editButton ? <Td action>{editButton(item)}</Td> : null}
                </tr>
              );
            })}
          </tbody>
        );
      })}
    </DataTable>
  );
}
