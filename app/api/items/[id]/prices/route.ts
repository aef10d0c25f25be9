import { csvResponse } from "@/lib/csv";
import { getItemPrices, itemPricesCsv } from "@/lib/data/item-prices";
import { fieldErrors, notFound, validation } from "@/lib/http/errors";
import { route } from "@/lib/http/route";
import { itemPricesQuery } from "@/lib/validation/price-lists";

/**
 * An item's prices across its suppliers: the current pack price of each supplier item with the
 * price per stock unit and per kg / metre / hank, cheapest first, and the price history (JSON, or
 * ?format=csv). The [id] segment is the item's id or SKU.
 */
export const GET = route({}, async ({ user, params, req }) => {
  const ref = params.id;
  if (typeof ref !== "string" || ref.length === 0 || ref.length > 100) throw notFound("Item");
  const parsed = itemPricesQuery.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  const prices = await getItemPrices(user, ref, { on: parsed.data.on });
  return parsed.data.format === "csv" ? csvResponse(itemPricesCsv(prices), `prices-${prices.item.sku}.csv`) : prices;
});
