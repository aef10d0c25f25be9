import { getKitchen, updateKitchen } from "@/lib/data/kitchens";
import { idParam, route } from "@/lib/http/route";
import { kitchenUpdateInput } from "@/lib/validation/company";

export const GET = route({}, async ({ user, params }) => getKitchen(user, idParam(params, "Kitchen")));
export const PATCH = route({ body: kitchenUpdateInput }, async ({ user, params, body }) => updateKitchen(user, idParam(params, "Kitchen"), body));
