import { getSupplierItem, updateSupplierItem } from "@/lib/data/suppliers";
import { notFound } from "@/lib/http/errors";
import { idParam, route } from "@/lib/http/route";
import { supplierItemPatchInput } from "@/lib/validation/suppliers";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** The [supplierItemId] segment as a uuid; anything else names no record (404). */
function supplierItemId(params: Record<string, string | string[] | undefined>): string {
  const id = params.supplierItemId;
  if (typeof id !== "string" || !UUID.test(id)) throw notFound("Supplier item");
  return id;
}

export const GET = route({}, async ({ user, params }) => getSupplierItem(user, idParam(params, "Supplier item"), supplierItemId(params)));

export const PATCH = route({ body: supplierItemPatchInput }, async ({ user, params, body }) =>
  updateSupplierItem(user, idParam(params, "Supplier"), supplierItemId(params), body));
