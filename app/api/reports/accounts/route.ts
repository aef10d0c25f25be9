import { getAccountMapping, putAccountMapping } from "@/lib/data/accounts";
import { route } from "@/lib/http/route";
import { accountMappingInput } from "@/lib/validation/accounts";

/** The account mapping of the movement journal. */
export const GET = route({}, async ({ user }) => getAccountMapping(user));

/** Replaces the whole mapping (admins and accountants). */
export const PUT = route({ body: accountMappingInput }, async ({ user, body }) => putAccountMapping(user, body.entries));
