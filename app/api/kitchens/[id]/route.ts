import { getKitchen, updateKitchen } from "@/lib/data/kitchens";
import { notFound } from "@/lib/http/errors";
import { route } from "@/lib/http/route";
import { uuid } from "@/lib/validation/common";
import { kitchenUpdateInput } from "@/lib/validation/company";

const idOf = (params: Record<string, unknown>) => {
  const parsed = uuid.safeParse(params.id);
  if (!parsed.success) throw notFound("Kitchen");
  return parsed.data;
};

export const GET = route({}, async ({ user, params }) => getKitchen(user, idOf(params)));
export const PATCH = route({ body: kitchenUpdateInput }, async ({ user, params, body }) => updateKitchen(user, idOf(params), body));
