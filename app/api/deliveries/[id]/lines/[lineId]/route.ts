import { updateDeliveryLine } from "@/lib/data/deliveries";
import { idParam, route } from "@/lib/http/route";
import { deliveryLinePatchInput } from "@/lib/validation/deliveries";

/** Accept, reject or correct one line; the answer is the whole delivery with the findings worked out again. */
export const PATCH = route({ body: deliveryLinePatchInput }, async ({ user, params, body }) =>
  updateDeliveryLine(user, idParam(params, "Delivery"), typeof params.lineId === "string" ? params.lineId : "", body));
