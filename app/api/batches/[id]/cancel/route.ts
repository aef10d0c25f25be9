import { cancelBatch } from "@/lib/data/batches";
import { idParam, route } from "@/lib/http/route";

/** Cancels a planned batch and releases what it held. */
export const POST = route({ idempotent: true }, async ({ user, params }) => cancelBatch(user, idParam(params, "Batch")));
