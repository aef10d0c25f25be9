import { changeBatch, getBatch } from "@/lib/data/batches";
import { idParam, route } from "@/lib/http/route";
import { batchChangeInput } from "@/lib/validation/batches";

export const GET = route({}, async ({ user, params }) => getBatch(user, idParam(params, "Batch")));

/** Changes a planned batch: its reservations are released and its lines worked out again. */
export const PATCH = route({ body: batchChangeInput, idempotent: true }, async ({ user, params, body }) => changeBatch(user, idParam(params, "Batch"), body));
