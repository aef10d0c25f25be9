import { closePurchaseOrderShort } from "@/lib/data/purchase-orders";
import { idParam, route } from "@/lib/http/route";
import { purchaseOrderReasonInput } from "@/lib/validation/purchase-orders";

/** Closes the order short: the rest will not come. */
export const POST = route({ body: purchaseOrderReasonInput, idempotent: true }, async ({ user, params, body }) =>
  closePurchaseOrderShort(user, idParam(params, "Purchase order"), body.reason));
