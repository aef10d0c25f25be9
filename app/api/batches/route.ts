import { createBatch, listBatches } from "@/lib/data/batches";
import { fieldErrors, validation } from "@/lib/http/errors";
import { Reply, route } from "@/lib/http/route";
import { batchCreateInput, batchListQuery } from "@/lib/validation/batches";

export const GET = route({}, async ({ user, req }) => {
  const parsed = batchListQuery.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  return { batches: await listBatches(user, parsed.data) };
});

/** Plans a batch: its bill of materials, casing and cure verdict; a plan over a statutory maximum is 422. */
export const POST = route({ body: batchCreateInput, idempotent: true }, async ({ user, body }) => new Reply(201, await createBatch(user, body)));
