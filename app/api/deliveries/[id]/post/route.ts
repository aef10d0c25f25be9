import { postDelivery } from "@/lib/data/deliveries";
import { idParam, route } from "@/lib/http/route";

/** Posts the decided lines: receipts, order lines, order status, in one transaction. A second post answers the first. */
export const POST = route({ idempotent: true }, async ({ user, params }) => postDelivery(user, idParam(params, "Delivery")));
