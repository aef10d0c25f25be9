import { getBatch } from "@/lib/data/batches";
import { idParam, route } from "@/lib/http/route";

export const GET = route({}, async ({ user, params }) => getBatch(user, idParam(params, "Batch")));
