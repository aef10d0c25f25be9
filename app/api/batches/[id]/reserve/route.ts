import { reserveBatch } from "@/lib/data/batches";
import { idParam, route } from "@/lib/http/route";

/** Reserves the batch's lots first-expired-first-out, all or nothing (409 SHORTAGE names the lines short). */
export const POST = route({ idempotent: true }, async ({ user, params }) => reserveBatch(user, idParam(params, "Batch")));
