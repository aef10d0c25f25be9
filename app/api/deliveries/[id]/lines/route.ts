import { addDeliveryLine } from "@/lib/data/deliveries";
import { idParam, Reply, route } from "@/lib/http/route";
import { deliveryLineInput } from "@/lib/validation/deliveries";

/** One more line on a draft: keyed in, or read from a case label (source "scan"). */
export const POST = route({ body: deliveryLineInput, idempotent: true }, async ({ user, params, body }) => new Reply(201, await addDeliveryLine(user, idParam(params, "Delivery"), body)));
