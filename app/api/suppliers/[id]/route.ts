import { getSupplier, updateSupplier } from "@/lib/data/suppliers";
import { idParam, route } from "@/lib/http/route";
import { supplierPatchInput } from "@/lib/validation/suppliers";

export const GET = route({}, async ({ user, params }) => getSupplier(user, idParam(params, "Supplier")));
export const PATCH = route({ body: supplierPatchInput }, async ({ user, params, body }) => updateSupplier(user, idParam(params, "Supplier"), body));
