import { getCompany, updateCompany } from "@/lib/data/companies";
import { route } from "@/lib/http/route";
import { companyUpdateInput } from "@/lib/validation/company";

export const GET = route({}, async ({ user }) => getCompany(user));
export const PATCH = route({ body: companyUpdateInput }, async ({ user, body }) => updateCompany(user, body));
