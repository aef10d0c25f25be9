import { getStock } from "@/lib/data/stock";
import { fieldErrors, validation } from "@/lib/http/errors";
import { route } from "@/lib/http/route";
import { stockQuery } from "@/lib/validation/stock";

/** With ?kitchen=CODE that kitchen's rows; without, every kitchen's, per kitchen. */
export const GET = route({}, async ({ user, req }) => {
  const parsed = stockQuery.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  const stock = await getStock(user, parsed.data.kitchen);
  return parsed.data.kitchen ? { kitchen: stock[0]!.kitchen, rows: stock[0]!.rows } : { kitchens: stock };
});
