import { lotChoices } from "@/lib/data/transfer-requests";
import { idParam, route } from "@/lib/http/route";

/** The sending kitchen's lots that could fill the request, and which ones first-expired-first-out would take. */
export const GET = route({}, async ({ user, params }) => lotChoices(user, idParam(params, "Transfer request")));
