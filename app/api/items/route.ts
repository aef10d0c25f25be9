import { createItem, listItems } from "@/lib/data/items";
import { validation, fieldErrors } from "@/lib/http/errors";
import { Reply, route } from "@/lib/http/route";
import { itemCreateInput, itemListQuery } from "@/lib/validation/items";

export const GET = route({}, async ({ user, req }) => {
  const parsed = itemListQuery.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  const { category, q, archived } = parsed.data;
  return { items: await listItems(user, { category, q, includeArchived: archived === "true" }) };
});

export const POST = route({ body: itemCreateInput, idempotent: true }, async ({ user, body }) => new Reply(201, await createItem(user, body)));
