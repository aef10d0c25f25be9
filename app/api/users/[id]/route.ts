import { getUser, updateUser } from "@/lib/data/users";
import { notFound } from "@/lib/http/errors";
import { route } from "@/lib/http/route";
import { uuid } from "@/lib/validation/common";
import { userUpdateInput } from "@/lib/validation/company";

const idOf = (params: Record<string, unknown>) => {
  const parsed = uuid.safeParse(params.id);
  if (!parsed.success) throw notFound("User");
  return parsed.data;
};

export const GET = route({}, async ({ user, params }) => getUser(user, idOf(params)));
export const PATCH = route({ body: userUpdateInput }, async ({ user, params, body }) => updateUser(user, idOf(params), body));
