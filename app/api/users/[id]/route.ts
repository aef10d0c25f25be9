import { getUser, updateUser } from "@/lib/data/users";
import { idParam, route } from "@/lib/http/route";
import { userUpdateInput } from "@/lib/validation/company";

export const GET = route({}, async ({ user, params }) => getUser(user, idParam(params, "User")));
export const PATCH = route({ body: userUpdateInput }, async ({ user, params, body }) => updateUser(user, idParam(params, "User"), body));
