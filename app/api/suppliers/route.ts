import { createSupplier, listSuppliers } from "@/lib/data/suppliers";
import { fieldErrors, validation } from "@/lib/http/errors";
import { Reply, route } from "@/lib/http/route";
import { supplierCreateInput, supplierListQuery } from "@/lib/validation/suppliers";

export const GET = route({}, async ({ user, req }) => {
  const parsed = supplierListQuery.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  return { suppliers: await listSuppliers(user, { q: parsed.data.q, includeInactive: parsed.data.inactive === "true" }) };
});

export const POST = route({ body: supplierCreateInput, idempotent: true }, async ({ user, body }) => new Reply(201, await createSupplier(user, body)));
