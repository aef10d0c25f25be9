import { createPurchaseOrder, listPurchaseOrders } from "@/lib/data/purchase-orders";
import { fieldErrors, validation } from "@/lib/http/errors";
import { Reply, route } from "@/lib/http/route";
import { purchaseOrderCreateInput, purchaseOrderListQuery } from "@/lib/validation/purchase-orders";

export const GET = route({}, async ({ user, req }) => {
  const parsed = purchaseOrderListQuery.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  return listPurchaseOrders(user, parsed.data);
});

/** A draft order; totals are worked out here from the packs and prices. */
export const POST = route({ body: purchaseOrderCreateInput, idempotent: true }, async ({ user, body }) => new Reply(201, await createPurchaseOrder(user, body)));
