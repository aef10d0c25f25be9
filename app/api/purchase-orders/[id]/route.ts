import { getPurchaseOrder, updatePurchaseOrder } from "@/lib/data/purchase-orders";
import { idParam, route } from "@/lib/http/route";
import { purchaseOrderPatchInput } from "@/lib/validation/purchase-orders";

export const GET = route({}, async ({ user, params }) => getPurchaseOrder(user, idParam(params, "Purchase order")));
export const PATCH = route({ body: purchaseOrderPatchInput }, async ({ user, params, body }) => updatePurchaseOrder(user, idParam(params, "Purchase order"), body));
