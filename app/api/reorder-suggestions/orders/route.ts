import { createReorderOrders } from "@/lib/data/reorder-suggestions";
import { Reply, route } from "@/lib/http/route";
import { reorderOrdersInput } from "@/lib/validation/reorder";

/** One draft purchase order per supplier of the chosen lines. */
export const POST = route({ body: reorderOrdersInput, idempotent: true }, async ({ user, body }) => new Reply(201, await createReorderOrders(user, body)));
