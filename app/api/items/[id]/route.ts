import { getItem, updateItem } from "@/lib/data/items";
import { notFound } from "@/lib/http/errors";
import { route } from "@/lib/http/route";
import { itemPatchInput } from "@/lib/validation/items";

/** The [id] segment: an item's id or its SKU (route.ts's idParam takes only UUIDs). */
function itemRef(params: Record<string, string | string[] | undefined>): string {
  const ref = params.id;
  if (typeof ref !== "string" || ref.length === 0 || ref.length > 100) throw notFound("Item");
  return ref;
}

export const GET = route({}, async ({ user, params }) => getItem(user, itemRef(params)));
export const PATCH = route({ body: itemPatchInput }, async ({ user, params, body }) => updateItem(user, itemRef(params), body));
