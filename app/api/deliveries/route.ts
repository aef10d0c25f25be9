import { listDeliveries, receiveDeliveryCsv } from "@/lib/data/deliveries";
import { fieldErrors, validation } from "@/lib/http/errors";
import { Reply, route } from "@/lib/http/route";
import { deliveryListQuery } from "@/lib/validation/deliveries";

/** Deliveries of the company, newest first (drafts and posted). */
export const GET = route({}, async ({ user, req }) => {
  const parsed = deliveryListQuery.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw validation(fieldErrors(parsed.error));
  return listDeliveries(user, parsed.data);
});

/**
 * A delivery note CSV as multipart/form-data (the file in "file"; supplier, kitchen, order?,
 * noteNumber?, noteDate?, mapping? as text fields) -> the draft delivery with its reconciliation.
 * No `body` here: the wrapper must not read the stream (lib/data/uploads.ts reads it). The file's
 * SHA-256 is what makes sending the same file twice answer the same delivery.
 */
export const POST = route({}, async ({ user, req }) => {
  const outcome = await receiveDeliveryCsv(user, req);
  return new Reply(outcome.status, outcome.body);
});
