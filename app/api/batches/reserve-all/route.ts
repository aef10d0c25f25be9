import { reserveAll } from "@/lib/data/batches";
import { route } from "@/lib/http/route";
import { batchReserveAllInput } from "@/lib/validation/batches";

/** Reserves every planned batch of a kitchen between two days; each batch all or nothing. */
export const POST = route({ body: batchReserveAllInput, idempotent: true }, async ({ user, body }) => reserveAll(user, body));
