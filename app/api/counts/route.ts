import { postCount } from "@/lib/data/ledger";
import { Reply, route } from "@/lib/http/route";
import { countSheetInput } from "@/lib/validation/movements";

/** A count sheet: every line's count posted together, all or nothing. */
export const POST = route({ body: countSheetInput, idempotent: true, maxBodyBytes: 2 * 1024 * 1024 }, async ({ user, body }) =>
  new Reply(201, await postCount(user, body)));
