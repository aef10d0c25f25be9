import { setStockLevel } from "@/lib/data/stock-levels";
import { route } from "@/lib/http/route";
import { stockLevelInput } from "@/lib/validation/movements";

/** Sets (or with null clears) an item's par level and reorder point in one kitchen. */
export const PUT = route({ body: stockLevelInput }, async ({ user, body }) => setStockLevel(user, body));
