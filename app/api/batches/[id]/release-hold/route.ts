import { releaseHold } from "@/lib/data/batches";
import { idParam, route } from "@/lib/http/route";
import { holdReleaseInput } from "@/lib/validation/batches";

/** A manager releases a batch held over a cure limit, with the corrective action as the reason (audited). */
export const POST = route({ body: holdReleaseInput, idempotent: true }, async ({ user, params, body }) => releaseHold(user, idParam(params, "Batch"), body.reason));
