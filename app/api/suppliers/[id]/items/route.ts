import { createSupplierItem, listSupplierItems } from "@/lib/data/suppliers";
import { fieldErrors, validation } from "@/lib/http/errors";
import { idParam, Reply, route } from "@/lib/http/route";
import { supplierItemCreateInput, supplierItemListQuery } from "@/lib/validation/suppliers";

export const GET = route({}, async ({ user, params, req }) => {
  const supplierId = idParam(params, "Supplier");
  const parsed = supplierItemListQuery.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  return { supplierItems: await listSupplierItems(user, supplierId, { includeInactive: parsed.data.inactive === "true" }) };
});

export const POST = route({ body: supplierItemCreateInput, idempotent: true }, async ({ user, params, body }) =>
  new Reply(201, await createSupplierItem(user, idParam(params, "Supplier"), body)));
