import { getDelivery, updateDelivery } from "@/lib/data/deliveries";
import { idParam, route } from "@/lib/http/route";
import { deliveryPatchInput } from "@/lib/validation/deliveries";

export const GET = route({}, async ({ user, params }) => getDelivery(user, idParam(params, "Delivery")));

/** Note number, note date and freight of a draft. */
export const PATCH = route({ body: deliveryPatchInput }, async ({ user, params, body }) => updateDelivery(user, idParam(params, "Delivery"), body));
