import { cancelPurchaseOrder } from "@/lib/data/purchase-orders";
import { idParam, route } from "@/lib/http/route";
import { purchaseOrderReasonInput } from "@/lib/validation/purchase-orders";

export const POST = route({ body: purchaseOrderReasonInput, idempotent: true }, async ({ user, params, body }) =>
  cancelPurchaseOrder(user, idParam(params, "Purchase order"), body.reason));
