import { approvePurchaseOrder } from "@/lib/data/purchase-orders";
import { idParam, route } from "@/lib/http/route";

export const POST = route({ idempotent: true }, async ({ user, params }) => approvePurchaseOrder(user, idParam(params, "Purchase order")));
