import { createKitchen, listKitchens } from "@/lib/data/kitchens";
import { Reply, route } from "@/lib/http/route";
import { kitchenCreateInput } from "@/lib/validation/company";

export const GET = route({}, async ({ user, req }) => ({
  kitchens: await listKitchens(user, { includeArchived: req.nextUrl.searchParams.get("archived") === "true" }),
}));

export const POST = route({ body: kitchenCreateInput, idempotent: true }, async ({ user, body }) => new Reply(201, await createKitchen(user, body)));
