// The catalogue table, grouped by category. Server-safe (no hooks): the edit button is a slot.
// Below 1280 px (a 1024 x 768 screen with the rail) the nitrite / nitrate and lots columns fold
// into the category and unit cells, so the row and its Edit button fit without scrolling sideways.
import type { ReactNode } from "react";
import { Archive } from "lucide-react";
import { CureMarker } from "@/components/cure/cure-marker";
import { Badge } from "@/components/ui/badge";
import { DataTable, RowHeader, Td, Th, THead } from "@/components/ui/data-table";
import { ITEM_CATEGORIES } from "@/db/types";
import type { PutUpKind } from "@/lib/casing/put-ups";
import type { Item } from "@/lib/data/items";
import { calibreText, CATEGORY_LABELS, categoryDetail, percentOf, putUpText, saltNote } from "./format";

const PUT_UP_SHORT: Record<PutUpKind, string> = { hank: "hank", beef_set: "set", tubed_strand: "strand", stick: "stick", box: "box" };

/** "lots and dates", "by lot", "no lots": the tracking, in the unit cell on narrow screens. */
function lotsText(item: Item): string {
  return item.trackLots ? (item.trackDates ? "by lot and date" : "by lot") : "no lots";
}

export function ItemsTable({ items, editButton }: { items: Item[]; editButton?: (item: Item) => ReactNode }) {
  const columns = editButton ? 7 : 6;
  return (
    <DataTable caption="Items by category">
      <THead>
        <Th>Item · SKU</Th>
        <Th>Category</Th>
        <Th>Unit<span className="xl:hidden"> · lots</span></Th>
        <Th>Calibre · put-up</Th>
        <Th numeric className="hidden xl:table-cell">Nitrite / nitrate</Th>
        <Th className="hidden xl:table-cell">Lots</Th>
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
                  <Td>
                    {item.cure ? <CureMarker /> : CATEGORY_LABELS[item.category].one}
                    {detail ? <span className="block text-sm text-brine">{detail}</span> : null}
                    {item.cure ? (
                      <span className="num block whitespace-nowrap text-sm text-pepper-soft xl:hidden">
                        nitrite {percentOf(item.cure.nitriteFraction)} %{saltNote(item.cure.nitriteSalt)} · nitrate {percentOf(item.cure.nitrateFraction)} %{saltNote(item.cure.nitrateSalt)}
                      </span>
                    ) : null}
                  </Td>
                  <Td>
                    {item.stockUnit}
                    {item.casing?.putUp ? <span className="block whitespace-nowrap text-sm text-brine">1 = {PUT_UP_SHORT[item.casing.putUp]}</span> : null}
                    <span className="block whitespace-nowrap text-sm text-brine xl:hidden">{lotsText(item)}</span>
                  </Td>
                  <Td>
                    {item.casing ? (
                      <>
                        <span className="num whitespace-nowrap font-semibold">{calibreText(item.casing)}</span>
                        <span className="block text-sm text-brine num">{putUpText(item.casing)}</span>
                      </>
                    ) : <span className="text-brine">—</span>}
                  </Td>
                  <Td numeric className="hidden whitespace-nowrap xl:table-cell">
                    {item.cure ? (
                      <span className="font-semibold">
                        {percentOf(item.cure.nitriteFraction)} %{saltNote(item.cure.nitriteSalt)} / {percentOf(item.cure.nitrateFraction)} %{saltNote(item.cure.nitrateSalt)}
                      </span>
                    ) : <span className="text-brine">—</span>}
                  </Td>
                  <Td className="hidden whitespace-nowrap xl:table-cell">
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
