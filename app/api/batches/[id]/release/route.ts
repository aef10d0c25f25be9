import { releaseBatch } from "@/lib/data/batches";
import { idParam, route } from "@/lib/http/route";

/** Gives the batch's reserved lots back to available stock. */
export const POST = route({ idempotent: true }, async ({ user, params }) => releaseBatch(user, idParam(params, "Batch")));
