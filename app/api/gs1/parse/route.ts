import { parseLabel } from "@/lib/data/gs1-labels";
import { route } from "@/lib/http/route";
import { gs1ParseInput } from "@/lib/validation/gs1";

/** What a GS1 case label says: GTIN, lot, dates, weights, counts. Writes nothing. */
export const POST = route({ body: gs1ParseInput }, async ({ user, body }) => parseLabel(user, body));
