import { sendPurchaseOrder } from "@/lib/data/purchase-orders";
import { idParam, route } from "@/lib/http/route";

/** E-mails the approved order to the supplier with its PDF and CSV (written to the outbox with the status change). */
export const POST = route({ idempotent: true }, async ({ user, params }) => sendPurchaseOrder(user, idParam(params, "Purchase order")));
