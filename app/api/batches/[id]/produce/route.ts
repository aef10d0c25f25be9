import { produceBatch } from "@/lib/data/batches";
import { idParam, route } from "@/lib/http/route";
import { batchProduceInput } from "@/lib/validation/batches";

/** Records the batch as made: use movements from the lots, a batch code, the cure check on actual weights. */
export const POST = route({ body: batchProduceInput, idempotent: true }, async ({ user, params, body }) => produceBatch(user, idParam(params, "Batch"), body));
