import { createKeyedDelivery } from "@/lib/data/deliveries";
import { Reply, route } from "@/lib/http/route";
import { deliveryKeyedInput } from "@/lib/validation/deliveries";

/** A delivery keyed in: supplier, kitchen, order?, note number, lines (may be none yet). */
export const POST = route({ body: deliveryKeyedInput, idempotent: true }, async ({ user, body }) => new Reply(201, await createKeyedDelivery(user, body)));
